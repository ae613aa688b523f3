// Raw files in a local folder: <dir>/<first two hex digits>/<sha256>.
import fs from 'node:fs';
import path from 'node:path';
import { assertSha256, SHA256_HEX, type RawStore } from './types';

export function localStore(dir: string): RawStore {
  const where = (sha256: string) => {
    assertSha256(sha256);
    return path.join(dir, sha256.slice(0, 2), sha256);
  };
  return {
    kind: 'local',
    describe: () => `local folder ${dir}`,
    async put(sha256, localPath) {
      const target = where(sha256);
      if (fs.existsSync(target)) return { existed: true };
      await fs.promises.mkdir(path.dirname(target), { recursive: true });
      try {
        await fs.promises.rename(localPath, target);
      } catch (error) {
        // another file system (a mounted uploads folder): copy to a temporary name, then rename
        if ((error as NodeJS.ErrnoException).code !== 'EXDEV') throw error;
        const partial = `${target}.partial-${process.pid}`;
        await fs.promises.copyFile(localPath, partial);
        await fs.promises.rename(partial, target);
      }
      return { existed: false };
    },
    async get(sha256) {
      const file = where(sha256);
      try {
        await fs.promises.access(file, fs.constants.R_OK);
      } catch {
        return null;
      }
      return fs.createReadStream(file);
    },
    async has(sha256) {
      return fs.existsSync(where(sha256));
    },
    async remove(sha256) {
      await fs.promises.rm(where(sha256), { force: true });
    },
    async *list() {
      let shards: string[];
      try {
        shards = await fs.promises.readdir(dir);
      } catch {
        return;
      }
      for (const shard of shards.sort()) {
        if (!/^[0-9a-f]{2}$/.test(shard)) continue;
        for (const name of (await fs.promises.readdir(path.join(dir, shard))).sort()) if (SHA256_HEX.test(name) && name.startsWith(shard)) yield name;
      }
    },
  };
}
