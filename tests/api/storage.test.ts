// Raw files behind the storage interface: the local folder (default) and an S3-compatible store
// (s3rver, a local S3 fake, on a free port). Both keep and return the uploaded bytes unchanged,
// GET /api/files/:id/raw answers the same either way, and a refused upload leaves nothing.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import S3rver from 's3rver';
import { createHarness, demoIds, type Harness } from './harness';
import { localStore } from '../../server/storage/local-store';
import { s3Store } from '../../server/storage/s3-store';
import type { RawStore } from '../../server/storage';
import { workbook, POLARIZATION_ROWS } from './xlsx-fixtures';

const CSV = 'Current density (A/cm2),Voltage (V),HFR (Ohm cm2)\r\n0,0.98,0.12\r\n0.05,0.74,0.12\r\n0.1,0.69,0.12\r\n0.2,0.62,0.12\r\n0.3,0.57,0.12\r\n0.4,0.52,0.12\r\n';
const BUCKET = 'cellwright-raw';

let s3: S3rver;
let endpoint: string;
let s3dir: string;

beforeAll(async () => {
  s3dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-s3-'));
  s3 = new S3rver({ port: 0, address: '127.0.0.1', silent: true, directory: s3dir, configureBuckets: [{ name: BUCKET, configs: [] }] });
  const address = await s3.run();
  endpoint = `http://127.0.0.1:${address.port}`;
});
afterAll(async () => {
  await s3.close();
  fs.rmSync(s3dir, { recursive: true, force: true });
});

const sha = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex');

async function readAll(stream: NodeJS.ReadableStream | null): Promise<Buffer | null> {
  if (!stream) return null;
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(Buffer.from(chunk as Buffer));
  return Buffer.concat(chunks);
}

describe.each([
  ['local folder', () => localStore(fs.mkdtempSync(path.join(os.tmpdir(), 'cw-local-')))],
  ['S3-compatible store', () => s3Store({ bucket: BUCKET, endpoint, region: 'us-east-1', prefix: 'contract/', forcePathStyle: true, accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' })],
])('the %s keeps bytes by SHA-256', (_name, make) => {
  let store: RawStore;
  beforeAll(() => {
    store = make();
  });

  it('put, has, get, list, remove', async () => {
    // every byte value, twice, so nothing is altered on the way (line ends, encodings)
    const bytes = Buffer.from(Array.from({ length: 512 }, (_, k) => k % 256));
    const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'cw-put-')), 'upload');
    fs.writeFileSync(file, bytes);
    const key = sha(bytes);
    expect(await store.has(key)).toBe(false);
    expect(await store.put(key, file)).toEqual({ existed: false });
    fs.writeFileSync(file, bytes);
    expect(await store.put(key, file)).toEqual({ existed: true });
    expect((await readAll(await store.get(key)))!.equals(bytes)).toBe(true);
    const listed: string[] = [];
    for await (const k of store.list()) listed.push(k);
    expect(listed).toContain(key);
    await store.remove(key);
    expect(await store.has(key)).toBe(false);
    expect(await store.get(key)).toBeNull();
  });

  it('refuses keys that are not SHA-256 digests', async () => {
    await expect(store.has('../../etc/passwd')).rejects.toThrow(/not a SHA-256/);
  });
});

describe('uploads through either store', () => {
  let local: Harness;
  let remote: Harness;
  beforeAll(async () => {
    local = await createHarness();
    remote = await createHarness({ env: { STORAGE: 's3', S3_BUCKET: BUCKET, S3_ENDPOINT: endpoint, S3_PREFIX: 'app/', S3_ACCESS_KEY_ID: 'S3RVER', S3_SECRET_ACCESS_KEY: 'S3RVER' } });
  }, 60_000);
  afterAll(() => {
    local?.close();
    remote?.close();
  });

  const objectsInBucket = () => {
    const found: string[] = [];
    const walk = (dir: string) => {
      if (!fs.existsSync(dir)) return;
      for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
        const full = path.join(dir, entry.name);
        if (entry.isDirectory()) walk(full);
        else if (entry.name.endsWith('._S3rver_object')) found.push(full);
      }
    };
    walk(path.join(s3dir, BUCKET, 'app'));
    return found.length;
  };

  it('the demo seeded into S3: its raw files are in the bucket, not the uploads folder', async () => {
    const files = (remote.ctx.db.$client.prepare('select count(distinct sha256) as n from files').get() as { n: number }).n;
    expect(files).toBeGreaterThan(20);
    expect(objectsInBucket()).toBe(files);
    const onDisk = fs.readdirSync(remote.ctx.env.uploadsDir).filter((name) => name !== 'tmp');
    expect(onDisk).toEqual([]);
  });

  for (const [what, name, content] of [
    ['a CSV with CRLF line ends', 'crlf.csv', Buffer.from(CSV)],
    ['an .xlsx workbook', 'curve.xlsx', workbook([{ name: 'Data', rows: POLARIZATION_ROWS }])],
  ] as const) {
    it(`${what}: GET /api/files/:id/raw returns the same bytes from either store`, async () => {
      const answers: Buffer[] = [];
      for (const h of [local, remote]) {
        const build = demoIds(h.ctx).build('C-014');
        const up = await h.as.researcher.upload(`/api/builds/${build}/curves`, { name, content });
        expect(up.status, JSON.stringify(up.body)).toBe(201);
        const raw = await h.as.viewer.get(`/api/files/${up.body.curve.fileId}/raw`).buffer(true).parse((res, done) => {
          const chunks: Buffer[] = [];
          res.on('data', (c: Buffer) => chunks.push(c));
          res.on('end', () => done(null, Buffer.concat(chunks)));
        });
        expect(raw.status).toBe(200);
        expect(raw.headers['x-content-sha256']).toBe(sha(content));
        expect(raw.headers['content-type']).toBe('application/octet-stream');
        answers.push(raw.body as Buffer);
      }
      expect(answers[0]!.equals(content)).toBe(true);
      expect(answers[1]!.equals(content)).toBe(true);
    });
  }

  it('a refused upload leaves no object in the bucket', async () => {
    const before = objectsInBucket();
    const build = demoIds(remote.ctx).build('C-014');
    const res = await remote.as.researcher.upload(`/api/builds/${build}/curves`, { name: 'bad.csv', content: 'Current density (A/cm2),Voltage (V)\n0.1,700\n0.2,0.6\n' });
    expect(res.status).toBe(422);
    expect(objectsInBucket()).toBe(before);
    expect(fs.readdirSync(path.join(remote.ctx.env.uploadsDir, 'tmp'))).toEqual([]);
  });
});
