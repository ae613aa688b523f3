// Backups restore to an identical instance: a backup of the seeded demo (plus a workbook upload)
// is restored into a fresh database and uploads folder, and every curve's raw bytes, points and
// metrics are compared with the original. A damaged backup is refused, naming the file.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { createHash } from 'node:crypto';
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import * as tar from 'tar';
import { createHarness, demoIds, type Harness } from './harness';
import { createBackup } from '../../server/backup/backup';
import { restoreBackup } from '../../server/backup/restore';
import { createContext } from '../../server/bootstrap';
import { createApp } from '../../server/app';
import { readEnv } from '../../server/env';
import type { AppContext } from '../../server/context';
import { workbook, POLARIZATION_ROWS } from './xlsx-fixtures';

let h: Harness;
let scratch: string;

beforeAll(async () => {
  h = await createHarness();
  scratch = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-backup-'));
  const up = await h.as.researcher.upload(`/api/builds/${demoIds(h.ctx).build('C-014')}/curves`, { name: 'extra.xlsx', content: workbook([{ name: 'Data', rows: POLARIZATION_ROWS }]) });
  if (up.status !== 201) throw new Error(JSON.stringify(up.body));
}, 60_000);
afterAll(() => {
  h.close();
  fs.rmSync(scratch, { recursive: true, force: true });
});

async function bytesOf(ctx: AppContext, sha256: string): Promise<Buffer> {
  const stream = await ctx.storage.get(sha256);
  if (!stream) throw new Error(`no stored bytes for ${sha256}`);
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks);
}

/** Every curve with its file's bytes, points and metrics, in id order. */
async function snapshot(ctx: AppContext) {
  const rows = ctx.db.$client.prepare('select c.id, c.kind, c.points, c.metrics, c.metric_notes, c.summary, f.sha256, f.original_name from curves c join files f on f.id = c.file_id order by c.id').all() as { id: number; kind: string; points: Buffer; metrics: string; metric_notes: string; summary: string; sha256: string; original_name: string }[];
  const out = [];
  for (const row of rows) {
    const raw = await bytesOf(ctx, row.sha256);
    out.push({ id: row.id, kind: row.kind, file: row.original_name, rawSha256: createHash('sha256').update(raw).digest('hex'), rawBytes: raw.length, points: createHash('sha256').update(row.points).digest('hex'), metrics: JSON.parse(row.metrics), notes: JSON.parse(row.metric_notes), summary: JSON.parse(row.summary) });
  }
  return out;
}

function freshEnv(name: string) {
  const dir = path.join(scratch, name);
  return { DATABASE_PATH: path.join(dir, 'db.sqlite'), UPLOADS_DIR: path.join(dir, 'uploads'), LOG_LEVEL: 'silent', SEED_DEMO: 'never', PUBLIC_URL: 'http://cellwright.test' };
}

describe('backup and restore', () => {
  it('a .tar backup restores into a fresh instance with every curve’s raw bytes, points and metrics identical', async () => {
    const backup = await createBackup(h.ctx, path.join(scratch, 'out'), { archive: true });
    expect(backup.path.endsWith('.tar')).toBe(true);
    const manifest = backup.manifest;
    const curves = (h.ctx.db.$client.prepare('select count(*) as n from curves').get() as { n: number }).n;
    expect(manifest.counts.curves).toBe(curves);
    expect(manifest.raw.length).toBe((h.ctx.db.$client.prepare('select count(distinct sha256) as n from files').get() as { n: number }).n);
    // the archive holds the manifest, the sums and every listed file
    const listed: string[] = [];
    await tar.list({ file: backup.path, onReadEntry: (entry) => listed.push(entry.path) });
    expect(listed).toEqual(expect.arrayContaining(['manifest.json', 'SHA256SUMS', 'database.sqlite', ...manifest.raw.map((r) => r.file)]));

    const env = freshEnv('restored');
    const report = await restoreBackup(backup.path, readEnv({ ...process.env, ...env }));
    expect(report.rawFiles).toBe(manifest.raw.length);
    const restored = createContext(env);
    try {
      expect(await snapshot(restored)).toEqual(await snapshot(h.ctx));
      // and the restored instance answers the API the same way
      const app = createApp(restored, { serveClient: false });
      const agent = request.agent(app);
      await agent.post('/api/auth/login').send({ email: 'viewer@demo.cellwright.test', password: 'demo-password' });
      const someCurve = h.ctx.db.$client.prepare("select c.id, c.file_id, f.sha256 from curves c join files f on f.id = c.file_id where c.kind = 'polarization' order by c.id desc limit 1").get() as { id: number; file_id: number; sha256: string };
      const before = await h.as.viewer.get(`/api/curves/${someCurve.id}`);
      const after = await agent.get(`/api/curves/${someCurve.id}`);
      expect(after.body).toEqual(before.body);
      const raw = await agent.get(`/api/files/${someCurve.file_id}/raw`).buffer(true).parse((res, done) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => done(null, Buffer.concat(chunks)));
      });
      expect(raw.status).toBe(200);
      expect(raw.headers['x-content-sha256']).toBe(someCurve.sha256);
      expect(createHash('sha256').update(raw.body as Buffer).digest('hex')).toBe(someCurve.sha256);
    } finally {
      restored.db.$client.close();
    }
  }, 120_000);

  it('refuses a damaged backup, naming the file whose SHA-256 does not match, and writes nothing', async () => {
    const backup = await createBackup(h.ctx, path.join(scratch, 'damaged'), { archive: false });
    const victim = backup.manifest.raw[0]!;
    const file = path.join(backup.path, victim.file);
    const bytes = fs.readFileSync(file);
    bytes[0] = bytes[0]! ^ 0xff;
    fs.writeFileSync(file, bytes);
    const env = freshEnv('from-damaged');
    await expect(restoreBackup(backup.path, readEnv({ ...process.env, ...env }))).rejects.toThrow(new RegExp(`${victim.file} does not match its SHA-256`));
    expect(fs.existsSync(env.DATABASE_PATH)).toBe(false);
  }, 60_000);

  it('does not overwrite an existing database unless asked to', async () => {
    const backup = await createBackup(h.ctx, path.join(scratch, 'again'), { archive: false });
    await expect(restoreBackup(backup.path, h.ctx.env)).rejects.toThrow(/already exists.*--force/);
  }, 60_000);

  it('npm run backup and npm run restore do the same from the command line', async () => {
    const run = promisify(execFile);
    const root = path.resolve(import.meta.dirname, '../..');
    const source = { ...process.env, DATABASE_PATH: h.ctx.env.databasePath, UPLOADS_DIR: h.ctx.env.uploadsDir, BACKUP_DIR: path.join(scratch, 'cli'), SEED_DEMO: 'never', LOG_LEVEL: 'silent' };
    const made = await run(process.execPath, ['--import', 'tsx', 'server/backup/cli.ts', 'backup'], { cwd: root, env: source });
    expect(made.stdout).toMatch(/Backup written: .*cellwright-backup-\d{8}-\d{6}(-\d+)?\.tar/);
    const archive = /Backup written: (\S+\.tar)/.exec(made.stdout)![1]!;
    const target = freshEnv('cli-restored');
    const restored = await run(process.execPath, ['--import', 'tsx', 'server/backup/cli.ts', 'restore', archive], { cwd: root, env: { ...process.env, ...target } });
    expect(restored.stdout).toMatch(/Restored [\s\S]* raw files checked/);
    const ctx = createContext(target);
    try {
      expect(await snapshot(ctx)).toEqual(await snapshot(h.ctx));
    } finally {
      ctx.db.$client.close();
    }
  }, 120_000);

  it('the admin button writes a backup archive into BACKUP_DIR, lists it and serves it for download; others are refused', async () => {
    const made = await h.as.admin.post('/api/admin/backups');
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    expect(made.body.backup.name).toMatch(/^cellwright-backup-\d{8}-\d{6}(-\d+)?\.tar$/);
    const list = await h.as.admin.get('/api/admin/backups');
    expect(list.body.backups.map((b: { name: string }) => b.name)).toContain(made.body.backup.name);
    const download = await h.as.admin.get(`/api/admin/backups/${made.body.backup.name}`).buffer(true).parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });
    expect(download.status).toBe(200);
    expect((download.body as Buffer).length).toBe(made.body.backup.bytes);
    expect((await h.as.pi.post('/api/admin/backups')).status).toBe(403);
    expect((await h.as.admin.get('/api/admin/backups/..%2F..%2Fdb.sqlite')).status).toBe(404);
  }, 60_000);
});
