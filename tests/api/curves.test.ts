// Curves through the HTTP route: files shaped like several labs' exports, metrics at the
// project's reference point, raw bytes kept unchanged, bad files refused with nothing stored.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fs from 'node:fs';
import path from 'node:path';
import fc from 'fast-check';
import ExcelJS from 'exceljs';
import { createHarness, demoIds, type Harness } from './harness';
import { semiEmpiricalVoltage } from '../../shared/curves';
import { FIXTURE_MODEL } from '../fixtures/curves/model-parameters';

const fixture = (name: string) => fs.readFileSync(path.join(__dirname, '../fixtures/curves', name));

let h: Harness;
let ids: ReturnType<typeof demoIds>;
let buildId: number;

function counts() {
  const q = (sql: string) => (h.ctx.db.$client.prepare(sql).get() as { n: number }).n;
  const stored = fs.readdirSync(h.ctx.env.uploadsDir, { recursive: true }).filter((f) => !String(f).startsWith('tmp') && /[0-9a-f]{64}$/.test(String(f))).length;
  return { curves: q('select count(*) n from curves'), files: q('select count(*) n from files'), stored };
}

beforeAll(async () => {
  h = await createHarness();
  ids = demoIds(h.ctx);
  const res = await h.as.researcher.post(`/api/projects/${ids.project('C')}/builds`, { status: 'built', factors: { binder: 25, activationTemp: 340, activationTime: 2, gdl: 'woven carbon', cellTemp: 160 }, loadingMgCm2: 4.0, areaCm2: 25 });
  buildId = res.body.build.id;
});
afterAll(() => h.close());

describe('uploading polarization curves', () => {
  // Expected values come from the model the fixtures were generated with (no noise): V at the
  // 0.2 A/cm² step is the model's own value there; iR-free adds j·HFR = 0.2 × 0.25 Ω·cm².
  const vModel = semiEmpiricalVoltage(FIXTURE_MODEL, 0.2);

  it.each([
    ['lab-a-semicolon-decimal-comma.csv', {}],
    ['lab-c-metadata-header.csv', {}],
    ['lab-d-whitespace-mV.txt', {}],
  ])('%s gives V at j_ref from the model', async (name, fields) => {
    const res = await h.as.researcher.upload(`/api/builds/${buildId}/curves`, { name, content: fixture(name) }, fields);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const m = res.body.curve.metrics;
    expect(m.vAtRef).toBeCloseTo(vModel, 3); // the model itself, rounded to 4 decimals in the file
    expect(m.vAtRefIrFree).toBeCloseTo(vModel + 0.2 * 0.25, 3); // V + j·HFR, derived by hand
    expect(m.hfr).toBeCloseTo(0.25, 4);
  });

  it('up and down sweeps are averaged and their hysteresis reported (BOM + CRLF file)', async () => {
    const res = await h.as.researcher.upload(`/api/builds/${buildId}/curves`, { name: 'lab-e.csv', content: fixture('lab-e-bom-crlf.csv') });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    // the fixture's down sweep is 8 mV above the model (generate-fixtures.ts), so the mean of the
    // two sweeps sits 4 mV above it; noise 1 mV per reading, 6 readings: tolerance 2 mV
    expect(Math.abs(res.body.curve.metrics.vAtRef - (vModel + 0.004))).toBeLessThan(0.002);
  });

  it('total current in mA with no area anywhere: 422 naming the area, nothing stored', async () => {
    const bare = await h.as.researcher.post(`/api/projects/${ids.project('C')}/builds`, { status: 'planned', factors: {} });
    const before = counts();
    const refused = await h.as.researcher.upload(`/api/builds/${bare.body.build.id}/curves`, { name: 'noarea.csv', content: fixture('units-total-ma-no-area.csv') }, { mapping: JSON.stringify({ current: { column: 0, unit: 'mA' }, voltage: { column: 1, unit: 'V' } }) });
    expect(refused.status, JSON.stringify(refused.body)).toBe(422);
    expect(refused.body.error.message).toMatch(/area/i);
    expect(counts()).toEqual(before);
    // with the area given on the form the same bytes are accepted
    const ok = await h.as.researcher.upload(`/api/builds/${bare.body.build.id}/curves`, { name: 'noarea.csv', content: fixture('units-total-ma-no-area.csv') }, { areaCm2: '25', mapping: JSON.stringify({ current: { column: 0, unit: 'mA' }, voltage: { column: 1, unit: 'V' } }) });
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
  });

  it('a tab-separated total-current export with an area from the build', async () => {
    const detect = await h.as.researcher.upload(`/api/builds/${buildId}/curves/preview`, { name: 'lab-b.txt', content: fixture('lab-b-tab-mA-total-current.txt') });
    expect(detect.status).toBe(200);
    const mapping = detect.body.preview.applied ?? detect.body.preview.detected;
    const res = await h.as.researcher.upload(`/api/builds/${buildId}/curves`, { name: 'lab-b.txt', content: fixture('lab-b-tab-mA-total-current.txt') }, { mapping: JSON.stringify(mapping), areaCm2: '25', saveProfileAs: 'Lab B station' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.curve.metrics.vAtRef).toBeCloseTo(vModel, 3); // model value; 125 mA on 25 cm² = 5 mA/cm², by hand
    // the saved profile is applied automatically the next time the same shape arrives
    const again = await h.as.researcher.upload(`/api/builds/${buildId}/curves`, { name: 'lab-b-2.txt', content: fixture('lab-b-tab-mA-total-current.txt') }, { areaCm2: '25' });
    expect(again.status, JSON.stringify(again.body)).toBe(201);
    expect(again.body.curve.summary.mappingSource).toMatch(/profile/);
  });

  it('mass activity at the project reference point (V_ref 0.6 V, iR-free, catalyst basis)', async () => {
    const res = await h.as.researcher.upload(`/api/builds/${buildId}/curves`, { name: 'lab-c.csv', content: fixture('lab-c-metadata-header.csv') });
    const m = res.body.curve.metrics;
    // A/g = j(A/cm²) / (4.0 mg/cm² × 1e-3 g/mg): definition in domain guide; loading of this build
    expect(m.massActivity).toBeCloseTo(m.jAtRefIrFree / (4.0e-3), 6);
    expect(res.body.curve.conditions.temperatureC).toBe(180); // read from the file's metadata line
  });

  it('keeps the raw bytes unchanged and stores identical content once', async () => {
    const bytes = fixture('lab-a-semicolon-decimal-comma.csv');
    const a = await h.as.researcher.upload(`/api/builds/${buildId}/curves`, { name: 'same.csv', content: bytes });
    const before = counts();
    const b = await h.as.researcher.upload(`/api/builds/${buildId}/curves`, { name: 'same-again.csv', content: bytes });
    const after = counts();
    expect(after.stored).toBe(before.stored); // same SHA-256, one copy on disk
    expect(after.files).toBe(before.files + 1);
    const raw = await h.as.viewer.get(`/api/files/${b.body.curve.fileId}/raw`).buffer(true).parse((res, cb) => { const chunks: Buffer[] = []; res.on('data', (c: Buffer) => chunks.push(c)); res.on('end', () => cb(null, Buffer.concat(chunks))); });
    expect(Buffer.compare(raw.body as Buffer, bytes)).toBe(0);
    expect(a.body.curve.fileId).not.toBe(b.body.curve.fileId);
  });

  it('reads a chosen sheet of an .xlsx workbook', async () => {
    const wb = new ExcelJS.Workbook();
    wb.addWorksheet('notes').addRow(['station log, see sheet 2']);
    const sheet = wb.addWorksheet('pol');
    sheet.addRow(['Current density (A/cm2)', 'Voltage (V)']);
    for (const j of [0, 0.05, 0.1, 0.2, 0.3]) sheet.addRow([j, Number(semiEmpiricalVoltage(FIXTURE_MODEL, j).toFixed(4))]);
    const buffer = Buffer.from(await wb.xlsx.writeBuffer());
    const res = await h.as.researcher.upload(`/api/builds/${buildId}/curves`, { name: 'book.xlsx', content: buffer }, { sheet: 'pol' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.curve.metrics.vAtRef).toBeCloseTo(vModel, 3); // model value at the 0.2 A/cm² row
    // without a sheet named, the notes sheet in front is passed over for the one with numbers
    const guessed = await h.as.researcher.upload(`/api/builds/${buildId}/curves`, { name: 'book.xlsx', content: buffer });
    expect(guessed.status, JSON.stringify(guessed.body)).toBe(201);
    expect(guessed.body.curve.summary.sheet).toBe('pol');
    const missing = await h.as.researcher.upload(`/api/builds/${buildId}/curves`, { name: 'book.xlsx', content: buffer }, { sheet: 'nope' });
    expect(missing.status).toBe(422);
    expect(missing.body.error.message).toContain('pol');
  });

  it('recomputes every curve when the PI moves the reference point, and versions the metrics', async () => {
    const project = await h.as.pi.get(`/api/projects/${ids.project('C')}`);
    const version = project.body.project.metricsVersion;
    const res = await h.as.pi.patch(`/api/projects/${ids.project('C')}`, { settings: { ...project.body.project.settings, refCurrentDensity: 0.1 } });
    expect(res.status).toBe(200);
    expect(res.body.project.metricsVersion).toBe(version + 1);
    expect(res.body.project.recomputedCurves).toBeGreaterThan(10);
    const build = await h.as.pi.get(`/api/builds/${buildId}`);
    const pol = build.body.curves.filter((c: { kind: string }) => c.kind === 'polarization');
    for (const c of pol) expect(c.metricsVersion).toBe(version + 1);
    expect(build.body.build.values.vAtRef).toBeCloseTo(semiEmpiricalVoltage(FIXTURE_MODEL, 0.1), 3); // model at the new j_ref
    await h.as.pi.patch(`/api/projects/${ids.project('C')}`, { settings: project.body.project.settings });
  });
});

describe('bad files get a 422 naming the problem, and nothing is stored', () => {
  it.each([
    ['bad-empty.csv', 'empty', null],
    ['bad-whitespace-only.csv', 'empty', null],
    ['bad-header-only.csv', 'header-only', null],
    ['bad-text-only.txt', 'no-numbers', null],
    ['bad-one-column.csv', 'one-column', null],
    ['bad-blank-cell.csv', null, /line \d+/],
    ['bad-nan-cell.csv', null, /line \d+/],
    ['bad-700-volts.csv', null, /700/],
  ])('%s', async (name, code, pattern) => {
    const before = counts();
    const res = await h.as.researcher.upload(`/api/builds/${buildId}/curves`, { name, content: fixture(name) });
    expect(res.status, JSON.stringify(res.body)).toBe(422);
    if (code) expect(res.body.error.code).toBe(code);
    if (pattern) expect(res.body.error.message).toMatch(pattern);
    expect(res.body.error.message).toContain(name);
    expect(counts()).toEqual(before);
  });

  it('binary content is refused whatever its extension', async () => {
    const png = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52, 0, 0, 0, 1]);
    const res = await h.as.researcher.upload(`/api/builds/${buildId}/curves`, { name: 'curve.csv', content: png });
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('binary');
  });

  it('a missing file field and a bad mapping are 400s naming the field', async () => {
    const none = await h.as.researcher.post(`/api/builds/${buildId}/curves`, {});
    expect(none.status).toBe(400);
    const bad = await h.as.researcher.upload(`/api/builds/${buildId}/curves`, { name: 'a.csv', content: fixture('lab-e-bom-crlf.csv') }, { mapping: '{"voltage":{"column":9,"unit":"V"}}' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/mapping\.voltage\.column/);
    const notJson = await h.as.researcher.upload(`/api/builds/${buildId}/curves`, { name: 'a.csv', content: fixture('lab-e-bom-crlf.csv') }, { mapping: 'not json' });
    expect(notJson.status).toBe(400);
  });

  it('arbitrary bytes never crash the route: a 201 or a 4xx, never a 500 (property test)', async () => {
    await fc.assert(
      fc.asyncProperty(fc.oneof(fc.uint8Array({ maxLength: 400 }), fc.string({ maxLength: 300 }).map((s) => Buffer.from(s))), async (bytes) => {
        const res = await h.as.researcher.upload(`/api/builds/${buildId}/curves/preview`, { name: 'random.csv', content: Buffer.from(bytes) });
        expect(res.status < 300 || (res.status >= 400 && res.status < 500)).toBe(true);
      }),
      { numRuns: 40, seed: 20261201 },
    );
  });
});
