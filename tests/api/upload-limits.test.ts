// Uploads that must not hurt the server: workbooks whose parts expand enormously (or lie about
// it), media bombs, cells in the last column, too many cells, a single enormous line, a parse
// that takes too long or too much memory. Each is refused with a 422 naming the limit, stores
// nothing, and the service keeps answering while a slow file is parsed.
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createHarness, demoIds, type Harness } from './harness';
import { createApp } from '../../server/app';
import { parsePool } from '../../server/uploads/parse-runner';
import { workbook, sheetXml, declareSize, POLARIZATION_ROWS, type Row } from './xlsx-fixtures';

/** What is stored: curves, files and the bytes on disk (the temporary folder included). */
function stored(h: Harness) {
  const sqlite = h.ctx.db.$client;
  const count = (table: string) => (sqlite.prepare(`select count(*) as n from ${table}`).get() as { n: number }).n;
  const onDisk: string[] = [];
  const walk = (dir: string) => {
    if (!fs.existsSync(dir)) return;
    for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) walk(full);
      else onDisk.push(full);
    }
  };
  walk(h.ctx.env.uploadsDir);
  return { curves: count('curves'), files: count('files'), onDisk: onDisk.sort() };
}

/** rows × 3 numeric columns under a header: a long polarization-like log (values invented). */
function longRows(rows: number): Row[] {
  const out: Row[] = [['Current density (A/cm2)', 'Voltage (V)', 'HFR (Ohm cm2)']];
  for (let k = 0; k < rows; k++) out.push([Number((k / rows).toFixed(6)), Number((0.95 - 0.4 * (k / rows)).toFixed(6)), 0.12]);
  return out;
}

/** The same database and demo, served by an app with other parse limits; signed in as the researcher. */
async function withLimits(h: Harness, limits: Partial<Harness['ctx']['env']>) {
  const app = createApp({ ...h.ctx, env: { ...h.ctx.env, ...limits } }, { serveClient: false });
  const agent = request.agent(app);
  const login = await agent.post('/api/auth/login').send({ email: 'researcher@demo.cellwright.test', password: 'demo-password' });
  return {
    upload: (url: string, name: string, content: Buffer, fields: Record<string, string> = {}) => {
      let t = agent.post(url).set('X-CSRF-Token', login.body.csrfToken);
      for (const [k, v] of Object.entries(fields)) t = t.field(k, v);
      return t.attach('file', content, name);
    },
  };
}

let h: Harness;
let build: number;
beforeAll(async () => {
  h = await createHarness();
  build = demoIds(h.ctx).build('C-014');
});
afterAll(() => h.close());

describe('hostile workbooks are refused before they are parsed', () => {
  let upload: (name: string, content: Buffer, fields?: Record<string, string>) => Promise<request.Response>;
  beforeAll(async () => {
    const researcher = await withLimits(h, { UPLOAD_XLSX_MAX_PART_BYTES: 2 * 1024 * 1024, UPLOAD_XLSX_MAX_CELLS: 20_000 });
    upload = (name, content, fields = {}) => researcher.upload(`/api/builds/${build}/curves`, name, content, fields);
  });

  const expectRefused = async (name: string, content: Buffer, limit: RegExp, fields: Record<string, string> = {}) => {
    const before = stored(h);
    const res = await upload(name, content, fields);
    expect(res.status, JSON.stringify(res.body)).toBe(422);
    expect(res.body.error.message).toMatch(limit);
    expect(res.body.error.message).toContain(name);
    expect(stored(h)).toEqual(before);
    return res;
  };

  it('an ordinary workbook still uploads', async () => {
    const res = await upload('plain.xlsx', workbook([{ name: 'Data', rows: POLARIZATION_ROWS }]));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.curve.metrics.vAtRef).toBeCloseTo(0.62, 6); // the file's own value at 0.2 A/cm²
  });

  it('a sheet that expands beyond the per-part limit (counted while inflating)', async () => {
    const res = await expectRefused('big-sheet.xlsx', workbook([{ name: 'Data', rows: longRows(60_000) }]), /expands to more than 2 MB|declares .* above the 2 MB limit/);
    expect(res.body.error.details.limit).toBe('UPLOAD_XLSX_MAX_PART_BYTES');
  });

  it('a sheet whose zip header lies about its size', async () => {
    const honest = workbook([{ name: 'Data', rows: longRows(60_000) }]);
    const lying = declareSize(honest, 'xl/worksheets/sheet1.xml', 1000);
    await expectRefused('lying.xlsx', lying, /expands to more than|cannot be read|too many bytes/i);
  });

  it('a sheet padded to expand a thousand times its compressed size (zip bomb)', async () => {
    const padding = ' '.repeat(1_500_000);
    const xml = sheetXml(POLARIZATION_ROWS).replace('<sheetData>', `${padding}<sheetData>`);
    const res = await expectRefused('bomb.xlsx', workbook([{ name: 'Data', xml }], {}, 9), /times its compressed size/);
    expect(res.body.error.details.limit).toBe('UPLOAD_XLSX_MAX_RATIO');
  });

  it('a 32 MB media entry is skipped, never inflated: the curve uploads', async () => {
    const media = new Uint8Array(32 * 1024 * 1024);
    const res = await upload('with-media.xlsx', workbook([{ name: 'Data', rows: POLARIZATION_ROWS }], { 'xl/media/image1.png': media }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
  });

  it('cells in the last column (XFD) on every row', async () => {
    const rows = POLARIZATION_ROWS.map((row, r) => `<row r="${r + 1}">${row.map((v, c) => `<c r="${String.fromCharCode(65 + c)}${r + 1}"><v>${typeof v === 'number' ? v : 0}</v></c>`).join('')}<c r="XFD${r + 1}"><v>1</v></c></row>`).join('');
    const xml = `<?xml version="1.0" encoding="UTF-8"?><worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>${rows}</sheetData></worksheet>`;
    await expectRefused('xfd.xlsx', workbook([{ name: 'Data', xml }]), /column XFD \(16,384\), beyond the 1,024 columns/);
  });

  it('more cells than the per-sheet limit', async () => {
    const res = await expectRefused('many-cells.xlsx', workbook([{ name: 'Data', rows: longRows(8000) }]), /holds 24,003 cells, above the 20,000/);
    expect(res.body.error.details.limit).toBe('UPLOAD_XLSX_MAX_CELLS');
  });

  it('when the sheet is named, a big sheet beside it is left out instead of refusing the workbook', async () => {
    const res = await upload('two-sheets.xlsx', workbook([{ name: 'Raw log', rows: longRows(60_000) }, { name: 'Data', rows: POLARIZATION_ROWS }]), { sheet: 'Data' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.curve.summary.sheet).toBe('Data');
  });

  it('a single enormous line in a text file is refused at the limit, naming the line', async () => {
    const before = stored(h);
    const res = await upload('one-line.csv', Buffer.concat([Buffer.from('Current density (A/cm2),Voltage (V)\n'), Buffer.alloc(12 * 1024 * 1024, '7')]));
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('line-too-long');
    expect(res.body.error.message).toMatch(/^one-line\.csv: line 2: longer than 262,144 characters/);
    expect(stored(h)).toEqual(before);
  });
});

describe('parsing runs off the main event loop, with time and memory limits', () => {
  it('the health check answers while a large workbook is parsed', async () => {
    {
      const big = workbook([{ name: 'Data', rows: longRows(40_000) }]);
      let finished = false;
      const pending = h.as.researcher.upload(`/api/builds/${build}/curves/preview`, { name: 'large.xlsx', content: big }).then((res) => {
        finished = true;
        return res;
      });
      // answers that came back while a worker thread was busy with the file
      let answeredDuring = 0;
      while (!finished) {
        const health = await request(h.app).get('/api/health');
        expect(health.status).toBe(200);
        if (!finished && parsePool(h.ctx.env).busy > 0) answeredDuring++;
        await new Promise((resolve) => setTimeout(resolve, 20));
      }
      const res = await pending;
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body.preview.rowCount).toBe(40_000);
      // the parse ran in the pool, and the main thread kept answering meanwhile
      expect(answeredDuring).toBeGreaterThan(2);
    }
  }, 60_000);

  it('a parse that takes longer than UPLOAD_PARSE_TIMEOUT_MS is stopped: 422, nothing stored, and the next upload works', async () => {
    {
      const researcher = await withLimits(h, { UPLOAD_PARSE_TIMEOUT_MS: 1000 });
      const before = stored(h);
      const res = await researcher.upload(`/api/builds/${build}/curves`, 'slow.xlsx', workbook([{ name: 'Data', rows: longRows(120_000) }]));
      expect(res.status, JSON.stringify(res.body)).toBe(422);
      expect(res.body.error.code).toBe('parse-timeout');
      expect(res.body.error.message).toMatch(/slow\.xlsx: reading the file took longer than 1 s.*UPLOAD_PARSE_TIMEOUT_MS/);
      expect(stored(h)).toEqual(before);
      const small = await researcher.upload(`/api/builds/${build}/curves`, 'small.csv', Buffer.from('Current density (A/cm2),Voltage (V)\n0,0.98\n0.1,0.69\n0.2,0.62\n0.4,0.52\n'));
      expect(small.status, JSON.stringify(small.body)).toBe(201);
    }
  }, 60_000);

  it('a parse that needs more memory than UPLOAD_PARSE_MEMORY_MB is stopped: 422 naming the limit, nothing stored', async () => {
    {
      const researcher = await withLimits(h, { UPLOAD_PARSE_MEMORY_MB: 96 });
      const before = stored(h);
      const res = await researcher.upload(`/api/builds/${build}/curves`, 'hungry.xlsx', workbook([{ name: 'Data', rows: longRows(150_000) }]));
      expect(res.status, JSON.stringify(res.body)).toBe(422);
      expect(res.body.error.code).toBe('parse-memory');
      expect(res.body.error.message).toMatch(/hungry\.xlsx: reading the file needed more than 96 MB.*UPLOAD_PARSE_MEMORY_MB/);
      expect(stored(h)).toEqual(before);
    }
  }, 120_000);
});
