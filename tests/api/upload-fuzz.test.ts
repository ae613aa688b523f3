// The upload route under malformed multipart bodies, hand-picked and fuzzed: every answer is a
// 2xx or a 4xx with a message, never a 5xx, and a refused upload leaves nothing behind (no
// curve, no file row, no stored bytes, no temporary file).
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createHarness, demoIds, type Harness } from './harness';

const CSV = 'Current density (A/cm2),Voltage (V)\n0,0.98\n0.05,0.74\n0.1,0.69\n0.2,0.62\n0.3,0.57\n0.4,0.52\n';

let h: Harness;
let url: string;

beforeAll(async () => {
  h = await createHarness();
  url = `/api/builds/${demoIds(h.ctx).build('C-014')}/curves`;
});
afterAll(() => h.close());

function part(boundary: string, headers: string, content: string): string {
  return `--${boundary}\r\n${headers}\r\n\r\n${content}\r\n`;
}
function fileBody(boundary: string, fileName = 'pol.csv', content = CSV): string {
  return part(boundary, `Content-Disposition: form-data; name="file"; filename="${fileName}"\r\nContent-Type: text/csv`, content) + `--${boundary}--\r\n`;
}

/** What is stored: curves, files and the bytes on disk (the temporary folder included). */
function storedState() {
  const sqlite = h.ctx.db.$client;
  const count = (table: string) => (sqlite.prepare(`select count(*) as n from ${table}`).get() as { n: number }).n;
  const onDisk: string[] = [];
  const walk = (dir: string) => {
    if (!fs.existsSync(dir)) return;
    for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) walk(full);
      else onDisk.push(path.relative(h.ctx.env.uploadsDir, full));
    }
  };
  walk(h.ctx.env.uploadsDir);
  return { curves: count('curves'), files: count('files'), onDisk: onDisk.sort() };
}

const send = (contentType: string, body: string | Buffer) => h.as.researcher.raw('post', url).set('Content-Type', contentType).send(body);

describe('malformed multipart bodies are a 400 with a clear message, and store nothing', () => {
  const cases: [string, string, string | Buffer, RegExp][] = [
    ['a truncated body', 'multipart/form-data; boundary=B0UND', fileBody('B0UND').slice(0, 120), /ended before|incomplete|truncated/i],
    ['multipart without a boundary', 'multipart/form-data', fileBody('B0UND'), /boundary/i],
    ['a boundary that does not match the body', 'multipart/form-data; boundary=OTHER', fileBody('B0UND'), /boundary|ended before/i],
    ['a NUL byte in the file name (raw)', 'multipart/form-data; boundary=B0UND', fileBody('B0UND', 'pol\u0000.csv'), /file name|header/i],
    ['an empty body', 'multipart/form-data; boundary=B0UND', '', /ended before|boundary|incomplete/i],
    ['bytes that are not multipart at all', 'multipart/form-data; boundary=B0UND', Buffer.from([0, 1, 2, 3, 255, 254]), /ended before|boundary|incomplete/i],
  ];
  for (const [what, type, body, message] of cases) {
    it(what, async () => {
      const before = storedState();
      const res = await send(type, body);
      expect(res.status, JSON.stringify(res.body)).toBe(400);
      expect(res.body.error.message).toMatch(message);
      expect(storedState()).toEqual(before);
    });
  }

  it('a NUL in an encoded file name (filename*=UTF-8\'\'…%00…) is a 400 naming the file name', async () => {
    const before = storedState();
    const body = part('B0UND', "Content-Disposition: form-data; name=\"file\"; filename*=UTF-8''pol%00evil.csv\r\nContent-Type: text/csv", CSV) + '--B0UND--\r\n';
    const res = await send('multipart/form-data; boundary=B0UND', body);
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    expect(res.body.error.message).toMatch(/file name/i);
    expect(storedState()).toEqual(before);
  });

  it('a well-formed body still uploads (the checks refuse only what is broken)', async () => {
    const res = await send('multipart/form-data; boundary=B0UND', fileBody('B0UND'));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
  });
});

describe('fuzzed multipart bodies (fast-check, seeded)', () => {
  // mutations of a valid body: cut it, flip bytes, change or drop the boundary, odd file names
  const valid = Buffer.from(fileBody('FuzzB0undary'));
  const mutation = fc.oneof(
    fc.record({ kind: fc.constant('cut' as const), at: fc.nat({ max: valid.length }) }),
    fc.record({ kind: fc.constant('flip' as const), at: fc.nat({ max: valid.length - 1 }), byte: fc.integer({ min: 0, max: 255 }) }),
    fc.record({ kind: fc.constant('boundary' as const), boundary: fc.oneof(fc.constant(''), fc.string({ maxLength: 80 })) }),
    fc.record({ kind: fc.constant('name' as const), name: fc.string({ maxLength: 40, unit: 'binary' }) }),
    fc.record({ kind: fc.constant('bytes' as const), bytes: fc.uint8Array({ maxLength: 300 }) }),
    fc.record({ kind: fc.constant('type' as const), type: fc.constantFrom('multipart/form-data', 'multipart/mixed; boundary=FuzzB0undary', 'multipart/form-data; boundary="FuzzB0undary"', 'multipart/form-data; boundary=FuzzB0undary; charset=utf-16', 'text/csv', 'application/json') }),
  );

  it('never answers 5xx, and a refusal stores nothing', async () => {
    await fc.assert(
      fc.asyncProperty(mutation, async (m) => {
        let type = 'multipart/form-data; boundary=FuzzB0undary';
        let body: Buffer = valid;
        if (m.kind === 'cut') body = valid.subarray(0, m.at);
        else if (m.kind === 'flip') { body = Buffer.from(valid); body[m.at] = m.byte; }
        else if (m.kind === 'boundary') type = m.boundary ? `multipart/form-data; boundary=${m.boundary.replace(/[\r\n]/g, '')}` : 'multipart/form-data';
        else if (m.kind === 'name') body = Buffer.from(fileBody('FuzzB0undary', m.name.replace(/["\r\n]/g, '')));
        else if (m.kind === 'bytes') body = Buffer.from(m.bytes);
        else type = m.type;
        const before = storedState();
        if (process.env.FUZZ_DEBUG) console.log('case', JSON.stringify(m).slice(0, 200));
        const res = await send(type, body).timeout(5000);
        expect(res.status, `${m.kind}: ${JSON.stringify(res.body)}`).toBeLessThan(500);
        if (res.status >= 400) {
          expect(res.body.error.message).toBeTypeOf('string');
          expect(storedState()).toEqual(before);
        } else {
          // a curve was stored: the temporary file is gone all the same
          expect(storedState().onDisk.some((f) => f.startsWith('tmp'))).toBe(false);
        }
      }),
      { numRuns: 300, seed: 120_2026 },
    );
  }, 120_000);
});
