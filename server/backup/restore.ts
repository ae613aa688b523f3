// Restore a backup written by backup.ts into an instance: every SHA-256 sum is checked first
// (database and raw files), then the database is put in place, migrated forward if it is older
// than the code, and the raw files go into the instance's store (local folder or S3).
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { createHash } from 'node:crypto';
import * as tar from 'tar';
import type { Env } from '../env';
import { openDatabase } from '../db';
import { createRawStore } from '../storage';
import { BACKUP_FORMAT, BACKUP_VERSION, DATABASE_FILE, MANIFEST_FILE, rawPath, type BackupManifest } from './backup';

export interface RestoreReport {
  manifest: BackupManifest;
  databasePath: string;
  rawFiles: number;
  store: string;
}

async function sha256OfFile(file: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of fs.createReadStream(file)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

function readManifest(dir: string): BackupManifest {
  const file = path.join(dir, MANIFEST_FILE);
  if (!fs.existsSync(file)) throw new Error(`restore: ${dir} has no ${MANIFEST_FILE}; is it a Cellwright backup?`);
  const manifest = JSON.parse(fs.readFileSync(file, 'utf8')) as BackupManifest;
  if (manifest.format !== BACKUP_FORMAT) throw new Error(`restore: ${MANIFEST_FILE} is not a Cellwright backup manifest`);
  if (manifest.version !== BACKUP_VERSION) throw new Error(`restore: backup format version ${manifest.version} is not one this version reads (${BACKUP_VERSION})`);
  return manifest;
}

/** Every sum of the manifest against the bytes on disk; the first mismatch is named. */
async function verify(dir: string, manifest: BackupManifest): Promise<void> {
  const check = async (file: string, expected: string) => {
    const full = path.join(dir, file);
    if (!fs.existsSync(full)) throw new Error(`restore: ${file} is listed in the manifest but missing from the backup`);
    const got = await sha256OfFile(full);
    if (got !== expected) throw new Error(`restore: ${file} does not match its SHA-256 in the manifest (expected ${expected}, found ${got}); the backup is damaged`);
  };
  await check(manifest.database.file, manifest.database.sha256);
  for (const entry of manifest.raw) {
    if (entry.file !== rawPath(entry.sha256)) throw new Error(`restore: unexpected raw file path ${entry.file} in the manifest`);
    await check(entry.file, entry.sha256);
  }
}

/**
 * Restore `source` (a backup folder or .tar) into the instance `env` describes. The target
 * database must not exist yet unless `force` is set (then it is kept beside as
 * <name>.before-restore-<time>).
 */
export async function restoreBackup(source: string, env: Env, options: { force?: boolean } = {}): Promise<RestoreReport> {
  if (!fs.existsSync(source)) throw new Error(`restore: ${source} does not exist`);
  let dir = source;
  let unpacked: string | null = null;
  if (fs.statSync(source).isFile()) {
    unpacked = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-restore-'));
    // only plain files and folders inside the archive's own tree
    await tar.extract({ file: source, cwd: unpacked, strict: true, filter: (p, entry) => !p.includes('..') && ('type' in entry ? entry.type === 'File' || entry.type === 'Directory' : true) });
    dir = unpacked;
  }
  try {
    const manifest = readManifest(dir);
    await verify(dir, manifest);
    const target = env.databasePath;
    if (target === ':memory:') throw new Error('restore: DATABASE_PATH must be a file');
    if (fs.existsSync(target)) {
      if (!options.force) throw new Error(`restore: ${target} already exists; restore into a fresh DATABASE_PATH, or pass --force to keep the current one beside it`);
      const aside = `${target}.before-restore-${new Date().toISOString().replace(/[:.]/g, '-')}`;
      fs.renameSync(target, aside);
      for (const suffix of ['-wal', '-shm']) if (fs.existsSync(target + suffix)) fs.renameSync(target + suffix, aside + suffix);
    }
    fs.mkdirSync(path.dirname(target), { recursive: true });
    fs.copyFileSync(path.join(dir, DATABASE_FILE), target);
    // applies any migration newer than the backup, and checks the file opens
    openDatabase(target).$client.close();

    const store = createRawStore(env);
    const staging = path.join(env.uploadsDir, 'tmp');
    fs.mkdirSync(staging, { recursive: true });
    for (const entry of manifest.raw) {
      // the store may move the file in: hand it a copy
      const copy = path.join(staging, `restore-${entry.sha256}`);
      fs.copyFileSync(path.join(dir, entry.file), copy);
      try {
        await store.put(entry.sha256, copy);
      } finally {
        fs.rmSync(copy, { force: true });
      }
    }
    return { manifest, databasePath: target, rawFiles: manifest.raw.length, store: store.describe() };
  } finally {
    if (unpacked) fs.rmSync(unpacked, { recursive: true, force: true });
  }
}
