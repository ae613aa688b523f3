// Backups of a running instance: an online copy of the SQLite database (the driver's backup
// API, consistent while people keep working) plus the raw bytes of every stored file, with a
// manifest and a SHA256SUMS list, in a folder or a single .tar archive. restore.ts reads them.
import fs from 'node:fs';
import path from 'node:path';
import { createHash } from 'node:crypto';
import { pipeline } from 'node:stream/promises';
import { Transform } from 'node:stream';
import Database from 'better-sqlite3';
import * as tar from 'tar';
import type { AppContext } from '../context';

export const BACKUP_FORMAT = 'cellwright-backup';
export const BACKUP_VERSION = 1;
export const DATABASE_FILE = 'database.sqlite';
export const MANIFEST_FILE = 'manifest.json';
export const SUMS_FILE = 'SHA256SUMS';

export interface BackupManifest {
  format: typeof BACKUP_FORMAT;
  version: typeof BACKUP_VERSION;
  createdAt: string;
  /** the last migration applied to the copied database */
  schema: string | null;
  database: { file: string; bytes: number; sha256: string };
  /** raw file bytes, by SHA-256, under raw/<first two hex digits>/<sha256> */
  raw: { sha256: string; bytes: number; file: string }[];
  counts: Record<'projects' | 'builds' | 'curves' | 'files' | 'users', number>;
  /** where the raw bytes came from (no secrets) */
  source: string;
}

export interface BackupResult {
  /** the folder or .tar written */
  path: string;
  name: string;
  bytes: number;
  manifest: BackupManifest;
}

export const rawPath = (sha256: string) => `raw/${sha256.slice(0, 2)}/${sha256}`;

/** cellwright-backup-<yyyymmdd>-<hhmmss>[-n][.tar] */
export const BACKUP_NAME = /^cellwright-backup-\d{8}-\d{6}(?:-\d{1,4})?(?:\.tar)?$/;

async function sha256OfFile(file: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of fs.createReadStream(file)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

function folderBytes(dir: string): number {
  let total = 0;
  for (const entry of fs.readdirSync(dir, { withFileTypes: true, recursive: true })) {
    if (entry.isFile()) total += fs.statSync(path.join(entry.parentPath, entry.name)).size;
  }
  return total;
}

/** "2026-12-02T05:43:46.123Z" → "20261202-054346" */
function stamp(iso: string): string {
  return iso.replace(/[-:]/g, '').replace('T', '-').slice(0, 15);
}

/**
 * Write a backup of `ctx` into `outDir`: a folder `cellwright-backup-<UTC time>`, or with
 * `archive` that folder as one .tar file (the folder is then removed). Every raw file is
 * checked against its SHA-256 as it is copied; a missing or altered one fails the backup.
 */
export async function createBackup(ctx: AppContext, outDir: string, options: { archive?: boolean } = {}): Promise<BackupResult> {
  const createdAt = new Date().toISOString();
  fs.mkdirSync(outDir, { recursive: true });
  // two backups in one second get -1, -2 … after the time
  let name = `cellwright-backup-${stamp(createdAt)}`;
  for (let n = 1; fs.existsSync(path.join(outDir, name)) || fs.existsSync(path.join(outDir, `${name}.tar`)) || fs.existsSync(path.join(outDir, `${name}.partial`)); n++) {
    name = `cellwright-backup-${stamp(createdAt)}-${n}`;
  }
  const dir = path.join(outDir, name);
  const partial = `${dir}.partial`;
  fs.rmSync(partial, { recursive: true, force: true });
  fs.mkdirSync(partial, { recursive: true });
  try {
    const databaseFile = path.join(partial, DATABASE_FILE);
    await ctx.db.$client.backup(databaseFile);

    // the raw files the copied database refers to: exactly the snapshot's, not later uploads
    const copy = new Database(databaseFile, { readonly: true });
    let shas: string[];
    let counts: BackupManifest['counts'];
    let schema: string | null;
    try {
      shas = (copy.prepare('select distinct sha256 from files order by sha256').all() as { sha256: string }[]).map((r) => r.sha256);
      const count = (table: string) => (copy.prepare(`select count(*) as n from ${table}`).get() as { n: number }).n;
      counts = { projects: count('projects'), builds: count('builds'), curves: count('curves'), files: count('files'), users: count('users') };
      const last = copy.prepare('select count(*) as n, max(created_at) as at from __drizzle_migrations').get() as { n: number; at: number | null };
      schema = last.n ? `${last.n} migrations, the last from ${new Date(Number(last.at)).toISOString()}` : null;
    } finally {
      copy.close();
    }

    const raw: BackupManifest['raw'] = [];
    for (const sha256 of shas) {
      const stream = await ctx.storage.get(sha256);
      if (!stream) throw new Error(`backup: the stored bytes of ${sha256} are missing from ${ctx.storage.describe()}`);
      const target = path.join(partial, rawPath(sha256));
      fs.mkdirSync(path.dirname(target), { recursive: true });
      const hash = createHash('sha256');
      let bytes = 0;
      const tap = new Transform({
        transform(chunk: Buffer, _encoding, done) {
          hash.update(chunk);
          bytes += chunk.length;
          done(null, chunk);
        },
      });
      await pipeline(stream, tap, fs.createWriteStream(target));
      const got = hash.digest('hex');
      if (got !== sha256) throw new Error(`backup: the stored bytes of ${sha256} have changed (their SHA-256 is now ${got})`);
      raw.push({ sha256, bytes, file: rawPath(sha256) });
    }

    const manifest: BackupManifest = {
      format: BACKUP_FORMAT,
      version: BACKUP_VERSION,
      createdAt,
      schema,
      database: { file: DATABASE_FILE, bytes: fs.statSync(databaseFile).size, sha256: await sha256OfFile(databaseFile) },
      raw,
      counts,
      source: ctx.storage.describe(),
    };
    fs.writeFileSync(path.join(partial, MANIFEST_FILE), `${JSON.stringify(manifest, null, 2)}\n`);
    // the same sums in the format `sha256sum -c` reads
    const sums = [`${manifest.database.sha256}  ${DATABASE_FILE}`, ...raw.map((r) => `${r.sha256}  ${r.file}`)];
    fs.writeFileSync(path.join(partial, SUMS_FILE), `${sums.join('\n')}\n`);

    if (options.archive) {
      const tarFile = `${dir}.tar`;
      await tar.create({ file: `${tarFile}.partial`, cwd: partial, portable: true }, [MANIFEST_FILE, SUMS_FILE, DATABASE_FILE, ...(raw.length ? ['raw'] : [])]);
      fs.renameSync(`${tarFile}.partial`, tarFile);
      fs.rmSync(partial, { recursive: true, force: true });
      return { path: tarFile, name: path.basename(tarFile), bytes: fs.statSync(tarFile).size, manifest };
    }
    fs.renameSync(partial, dir);
    return { path: dir, name, bytes: folderBytes(dir), manifest };
  } catch (error) {
    fs.rmSync(partial, { recursive: true, force: true });
    fs.rmSync(`${dir}.tar.partial`, { force: true });
    throw error;
  }
}

/** Backups in a folder, newest first: .tar archives and backup folders with a manifest. */
export function listBackups(outDir: string): { name: string; bytes: number; createdAt: string; archive: boolean }[] {
  if (!fs.existsSync(outDir)) return [];
  const out: { name: string; bytes: number; createdAt: string; archive: boolean }[] = [];
  for (const entry of fs.readdirSync(outDir, { withFileTypes: true })) {
    if (!BACKUP_NAME.test(entry.name)) continue;
    const full = path.join(outDir, entry.name);
    const archive = entry.isFile();
    if (!archive && !fs.existsSync(path.join(full, MANIFEST_FILE))) continue;
    const stat = fs.statSync(full);
    out.push({ name: entry.name, bytes: archive ? stat.size : folderBytes(full), createdAt: stat.mtime.toISOString(), archive });
  }
  return out.sort((a, b) => b.name.localeCompare(a.name));
}
