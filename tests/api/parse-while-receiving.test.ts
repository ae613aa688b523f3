// A text upload read by a worker while its bytes arrive gives exactly what reading the received
// file from disk gives: the same table (columns, line numbers, header, conditions), the same
// SHA-256, the same refusal naming the same line; a workbook is left to the disk path; a stream
// waiting for bytes shares its worker and a dropped one leaves it free; and through HTTP the
// stored curve is the same either way.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { ParsePool, parsePool, workbookLimits } from '../../server/uploads/parse-runner';
import { createApp } from '../../server/app';
import { sizeHintOf } from '../../server/lib/receive-file';
import { readEnv } from '../../server/env';
import { mulberry32 } from '../../shared/stats/random';
import { createHarness, demoIds, type Harness } from './harness';
import { workbook, POLARIZATION_ROWS } from './xlsx-fixtures';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-stream-'));
const pool = new ParsePool({ workers: 1, timeoutMs: 60_000, memoryMb: 256 });
const limits = workbookLimits(readEnv({}));
afterAll(async () => {
  await pool.close();
  fs.rmSync(dir, { recursive: true, force: true });
});

/** A station log of `rows` rows (invented numbers): header, a metadata line, LF or CR LF. */
function stationLog(rows: number, options: { eol?: string; decimalComma?: boolean; ragged?: number } = {}): string {
  const eol = options.eol ?? '\n';
  const sep = options.decimalComma ? ';' : ',';
  const num = (x: number, digits: number) => (options.decimalComma ? x.toFixed(digits).replace('.', ',') : x.toFixed(digits));
  const lines = ['Cell area: 25 cm2', ['Time (h)', 'Current density (A/cm2)', 'Voltage (V)', 'Temperature (C)'].join(sep)];
  for (let i = 0; i < rows; i++) {
    const cells = [num(i * 0.01, 4), num(0.2 + (i % 7) * 1e-5, 5), num(0.62 - i * 1e-7, 6), num(160 + (i % 5) * 0.1, 2)];
    if (options.ragged === i) cells.pop();
    lines.push(cells.join(sep));
  }
  return lines.join(eol) + eol;
}

async function fromDisk(name: string, bytes: Uint8Array) {
  const file = path.join(dir, name);
  fs.writeFileSync(file, bytes);
  return pool.parse(file, { maxRows: 2_000_000 }, limits, name);
}

/** The same bytes pushed in pieces of random sizes (1 byte to 200 kB, seeded), as a network gives them. */
function whileReceived(name: string, bytes: Uint8Array, seed: number) {
  const stream = pool.parseStream({ maxRows: 2_000_000, sizeHintBytes: bytes.length + 300, fileName: name });
  const random = mulberry32(seed);
  for (let at = 0; at < bytes.length;) {
    const size = Math.max(1, Math.floor(random() ** 3 * 200_000));
    stream.push(bytes.subarray(at, at + size));
    at += size;
  }
  return stream.end();
}

const enc = (text: string) => new TextEncoder().encode(text);
const cases: [string, Uint8Array][] = [
  ['log-lf.csv', enc(stationLog(30_000))],
  ['log-crlf.csv', enc(stationLog(30_000, { eol: '\r\n' }))],
  ['log-comma.csv', enc('\uFEFF' + stationLog(20_000, { decimalComma: true }))],
  ['short.csv', enc(stationLog(40))],
  // UTF-16 with its byte-order mark: read the text way, never from the bytes
  ['log-utf16.csv', new Uint8Array(Buffer.from('\uFEFF' + stationLog(5_000), 'utf16le'))],
];

describe('a text file read while it is received', () => {
  for (const [name, bytes] of cases) {
    it(`${name}: the same table and hash as read from disk, whatever the pieces`, async () => {
      const disk = await fromDisk(name, bytes);
      for (const seed of [1, 2, 3]) {
        const streamed = await whileReceived(name, bytes, seed);
        expect(streamed).not.toBeNull();
        expect(streamed!.sha256).toBe(disk.sha256);
        expect(streamed!.table).toEqual(disk.table);
      }
    });
  }

  it('a ragged row deep in the log is refused at the same line with the same words', async () => {
    const bytes = enc(stationLog(20_000, { ragged: 15_000 }));
    const disk = await fromDisk('ragged.csv', bytes).then(() => null, (error: Error) => error);
    const streamed = await whileReceived('ragged.csv', bytes, 4).then(() => null, (error: Error) => error);
    expect(disk).toBeInstanceOf(Error);
    expect(streamed?.message).toBe(disk!.message);
    expect((streamed as { line?: number }).line).toBe((disk as { line?: number }).line);
    expect((streamed as { line?: number }).line).toBe(15_003); // metadata line, header, then row 15,000 (0-based) → line 15,003
  });

  it('an empty file is refused as empty', async () => {
    await expect(whileReceived('empty.csv', new Uint8Array(0), 5)).rejects.toThrow('The file is empty.');
  });

  it('a workbook is left to the disk path (null), which reads it', async () => {
    const bytes = new Uint8Array(workbook([{ name: 'Data', rows: POLARIZATION_ROWS }]));
    expect(await whileReceived('plain.xlsx', bytes, 6)).toBeNull();
  });

  it('a stream waiting for bytes shares the only worker: a file from disk is read meanwhile; a dropped stream leaves it working', async () => {
    const slow = pool.parseStream({ maxRows: 1000, fileName: 'slow.csv' });
    slow.push(enc('Time (h),Voltage (V)\n0,0.6\n'));
    // a partner's slow link: the stream is open, and another upload is read from disk beside it
    const other = await fromDisk('beside.csv', enc(stationLog(2_000)));
    expect(other.table.rowCount).toBe(2_000);
    expect(pool.size).toBe(1);
    const second = pool.parseStream({ maxRows: 1000, fileName: 'second.csv' });
    second.push(enc('Time (h),Voltage (V)\n0,0.61\n1,0.6\n'));
    slow.push(enc('1,0.59\n'));
    expect((await second.end())!.table.rowCount).toBe(2);
    expect((await slow.end())!.table.rowCount).toBe(2);
    const dropped = pool.parseStream({ maxRows: 1000, fileName: 'dropped.csv' });
    dropped.push(enc('Time (h),Voltage (V)\n0,0.6\n'));
    dropped.abort();
    const next = await whileReceived('after.csv', enc(stationLog(100)), 7);
    expect(next!.table.rowCount).toBe(100);
  });
});

describe('the columns sized from the request', () => {
  it('from its length, never beyond the upload limit, and not at all without a length', () => {
    expect(sizeHintOf('1048576', 52_428_800)).toBe(1_048_576);
    expect(sizeHintOf('99999999999', 52_428_800)).toBe(52_428_800); // a client claiming 100 GB reserves no more than the limit allows
    expect(sizeHintOf(undefined, 52_428_800)).toBeUndefined();
    expect(sizeHintOf('nonsense', 52_428_800)).toBeUndefined();
    expect(sizeHintOf('0', 52_428_800)).toBeUndefined();
  });
});

describe('through HTTP, read while received or from disk', () => {
  let on: Harness;
  let off: Harness;
  beforeAll(async () => {
    on = await createHarness();
    off = await createHarness({ env: { UPLOAD_PARSE_WHILE_RECEIVING: 'false' } });
  });
  afterAll(() => {
    on.close();
    off.close();
  });

  it('stores the same curve, metrics and file either way', async () => {
    const content = stationLog(50_000);
    const send = (h: Harness) => h.as.researcher.upload(`/api/builds/${demoIds(h.ctx).build('C-014')}/curves`, { name: 'station.csv', content }, { kind: 'durability' });
    const [a, b] = [await send(on), await send(off)];
    expect(a.status, JSON.stringify(a.body)).toBe(201);
    expect(b.status, JSON.stringify(b.body)).toBe(201);
    expect(a.body.curve.pointCount).toBe(50_000);
    expect(a.body.curve.metrics).toEqual(b.body.curve.metrics);
    expect(a.body.curve.summary.importNotes).toEqual(b.body.curve.summary.importNotes);
    const sha = (h: Harness) => (h.ctx.db.$client.prepare('select sha256 from files where original_name = ?').get('station.csv') as { sha256: string }).sha256;
    expect(sha(on)).toBe(sha(off));
    expect(fs.readdirSync(path.join(on.ctx.env.uploadsDir, 'tmp'))).toEqual([]);
  });

  it('a refused text upload names the file and line the same way, and stores nothing', async () => {
    const content = stationLog(5_000, { ragged: 4_000 });
    const send = (h: Harness) => h.as.researcher.upload(`/api/builds/${demoIds(h.ctx).build('C-014')}/curves`, { name: 'ragged.csv', content }, { kind: 'durability' });
    const [a, b] = [await send(on), await send(off)];
    expect(a.status).toBe(422);
    expect(a.body.error.message).toBe(b.body.error.message);
    expect(a.body.error.message).toMatch(/ragged\.csv.*line 4,?003/);
    expect(fs.readdirSync(path.join(on.ctx.env.uploadsDir, 'tmp'))).toEqual([]);
  });

  it('a body cut off mid-file leaves no temporary file and the worker free', async () => {
    const server = createApp(on.ctx, { serveClient: false }).listen(0, '127.0.0.1');
    await new Promise((resolve) => server.once('listening', resolve));
    const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    try {
      const login = await fetch(`${base}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'researcher@demo.cellwright.test', password: 'demo-password' }) });
      const cookie = login.headers.get('set-cookie')!.split(';')[0]!;
      const { csrfToken } = (await login.json()) as { csrfToken: string };
      const head = '--cut\r\nContent-Disposition: form-data; name="file"; filename="cut.csv"\r\nContent-Type: text/csv\r\n\r\n';
      const body = stationLog(100_000);
      const req = http.request(`${base}/api/builds/${demoIds(on.ctx).build('C-014')}/curves`, { method: 'POST', headers: { cookie, 'x-csrf-token': csrfToken, 'content-type': 'multipart/form-data; boundary=cut', 'content-length': String(head.length + body.length + 64) } });
      req.on('error', () => {});
      req.write(head);
      req.write(body.slice(0, 1_500_000));
      const pool = parsePool(on.ctx.env);
      for (let i = 0; i < 100 && pool.busy === 0; i++) await new Promise((resolve) => setTimeout(resolve, 10));
      expect(pool.busy).toBe(1); // the worker is reading the bytes so far
      req.destroy();
      for (let i = 0; i < 100 && (pool.busy > 0 || fs.readdirSync(path.join(on.ctx.env.uploadsDir, 'tmp')).length > 0); i++) await new Promise((resolve) => setTimeout(resolve, 10));
      expect(pool.busy).toBe(0);
      expect(fs.readdirSync(path.join(on.ctx.env.uploadsDir, 'tmp'))).toEqual([]);
    } finally {
      server.close();
    }
  });
});
