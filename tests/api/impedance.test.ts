// Impedance spectra through the ordinary upload path: headers, delimiters, decimal comma,
// metadata lines, a workbook; Ω total turned into Ω·cm² with the area; either sign of Z″; |Z| and
// phase; the metrics hfr, rct, cpeQ, cpeN with the fit in the summary; too little data refused or
// left null with a reason, never a 500.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHarness, demoIds, type Harness } from './harness';
import { circuitImpedance } from '../../shared/impedance';
import { workbook } from './xlsx-fixtures';

let h: Harness;
let ids: ReturnType<typeof demoIds>;

// A circuit of known parameters (Ω·cm²; invented): R_Ω 0.25, R_ct 0.8, Q 0.02 F·s^(n−1)/cm², n 0.9.
const TRUE = { rOhm: 0.25, rCt: 0.8, cpeQ: 0.02, cpeN: 0.9 };
const AREA = 25; // cm²
const FREQUENCIES = Array.from({ length: 41 }, (_, k) => 10 ** (5 - k * 0.175)); // 100 kHz → ~10 mHz, 5.7 points per decade
const Z = circuitImpedance('charge-transfer', TRUE, FREQUENCIES);

type Curve = { id: number; kind: string; pointCount: number; metrics: Record<string, number | null>; metricNotes: Record<string, string>; method: Record<string, { method: string; inputs: Record<string, unknown> }>; summary: Record<string, unknown> };

async function upload(name: string, content: string | Buffer, fields: Record<string, string> = {}) {
  return h.as.researcher.upload(`/api/builds/${ids.build('C-014')}/curves`, { name, content }, fields);
}

beforeAll(async () => {
  h = await createHarness();
  ids = demoIds(h.ctx);
});
afterAll(() => h.close());

describe('impedance upload', () => {
  it('reads a semicolon file with a decimal comma, metadata lines, −Z″ and Ω total, and recovers the circuit', async () => {
    const lines = ['# station: invented bench 2', `Active area: ${AREA} cm2`, "Freq (Hz);Z' (Ohm);-Z'' (Ohm)"];
    // total impedance = area-specific / area; the file writes −Z″ (positive on the arc)
    FREQUENCIES.forEach((f, k) => lines.push([f.toPrecision(10), (Z.real[k] / AREA).toPrecision(12), (-Z.imag[k] / AREA).toPrecision(12)].join(';').replace(/\./g, ',')));
    const res = await upload('spectrum.txt', lines.join('\n') + '\n');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const curve = res.body.curve as Curve;
    expect(curve.kind).toBe('impedance');
    expect(curve.pointCount).toBe(41);
    // noise-free: the fit recovers the parameters to 1e-6 relative (target derived by hand: the spectrum was made from them)
    expect(Math.abs(curve.metrics.rct! / TRUE.rCt - 1)).toBeLessThan(1e-6);
    expect(Math.abs(curve.metrics.cpeQ! / TRUE.cpeQ - 1)).toBeLessThan(1e-6);
    expect(Math.abs(curve.metrics.cpeN! / TRUE.cpeN - 1)).toBeLessThan(1e-6);
    // HFR: the spectrum never reaches Z″ = 0 at 100 kHz (a CPE arc), so the fitted R_Ω stands in, and says so
    expect(Math.abs(curve.metrics.hfr! / TRUE.rOhm - 1)).toBeLessThan(1e-3);
    expect(curve.method.hfr.method).toMatch(/intercept|series resistance/);
    expect(curve.method.rct.inputs).toHaveProperty('standardError');
    const notes = (curve.summary.importNotes as string[]).join(' ');
    expect(notes).toMatch(/−Z″/);
    expect(notes).toMatch(/area-normalised with the active area 25 cm²/);
    const table = JSON.parse(String(curve.summary.fitTable)) as { key: string; value: number; unit: string }[];
    expect(table.map((row) => row.key)).toEqual(['rOhm', 'rCt', 'cpeQ', 'cpeN']);
    expect(Number(curve.summary.rmsRelativePercent)).toBeLessThan(1e-4);
    // the points come back for the Nyquist and Bode plots, falling frequency, Ω·cm², Z″ = Im Z
    const points = await h.as.researcher.get(`/api/curves/${curve.id}`);
    expect(points.status).toBe(200);
    const stored = points.body.points as { frequencyHz: number[]; zReal: number[]; zImag: number[] };
    expect(stored.frequencyHz[0]).toBeCloseTo(1e5, 3);
    expect(stored.zImag[20]).toBeCloseTo(Z.imag[20], 9); // sign turned back and × area (derived by hand)
  });

  it('takes Z″ with the physics sign, mΩ·cm² and kHz from a workbook', async () => {
    const rows: (string | number)[][] = [['Frequency (kHz)', 'Zreal (mOhm cm2)', 'Zimag (mOhm cm2)']];
    FREQUENCIES.forEach((f, k) => rows.push([f / 1000, Z.real[k] * 1000, Z.imag[k] * 1000]));
    const res = await upload('eis.xlsx', workbook([{ name: 'EIS', rows }]));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const curve = res.body.curve as Curve;
    expect(curve.kind).toBe('impedance');
    expect(Math.abs(curve.metrics.rct! / TRUE.rCt - 1)).toBeLessThan(1e-6); // as above, derived by hand
    expect((curve.summary.importNotes as string[]).join(' ')).toMatch(/kHz/);
  });

  it('computes Z′ and Z″ from |Z| and phase when that is all a file gives', async () => {
    const lines = ['f (Hz),|Z| (Ohm cm2),Phase (deg)'];
    FREQUENCIES.forEach((f, k) => lines.push([f, Math.hypot(Z.real[k], Z.imag[k]), (Math.atan2(Z.imag[k], Z.real[k]) * 180) / Math.PI].join(',')));
    const res = await upload('polar.csv', lines.join('\n'), { kind: 'impedance' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const curve = res.body.curve as Curve;
    expect(Math.abs(curve.metrics.rct! / TRUE.rCt - 1)).toBeLessThan(1e-6); // Z = |Z|e^{jφ}, derived by hand
  });

  it('refuses a spectrum of two rows naming the file, and leaves the fit null with a reason for three', async () => {
    const two = await upload('short.csv', "Freq (Hz),Z' (Ohm cm2),Z'' (Ohm cm2)\n1000,0.3,-0.1\n100,0.5,-0.3\n");
    expect(two.status).toBe(422);
    expect(two.body.error.message).toMatch(/short\.csv.*at least 3/);
    // three points, one inductive (Z″ > 0, left out of the fit): two are too few for four parameters
    const four = await upload('three.csv', "Freq (Hz),Z' (Ohm cm2),Z'' (Ohm cm2)\n10000,0.26,0.02\n1000,0.3,-0.1\n100,0.5,-0.3\n");
    expect(four.status, JSON.stringify(four.body)).toBe(201);
    const curve = four.body.curve as Curve;
    expect(curve.metrics.rct).toBeNull();
    expect(curve.metricNotes.rct).toMatch(/fit/);
  });

  it('asks for the area when a total impedance has none', async () => {
    const lines = ["Freq (Hz),Z' (Ohm),Z'' (Ohm)"];
    FREQUENCIES.slice(0, 10).forEach((f, k) => lines.push([f, Z.real[k] / AREA, Z.imag[k] / AREA].join(',')));
    // a build with no recorded area: make one
    const buildId = ids.build('C-014');
    h.ctx.db.$client.prepare('update builds set area_cm2 = null where id = ?').run(buildId);
    const res = await h.as.researcher.upload(`/api/builds/${buildId}/curves`, { name: 'no-area.csv', content: lines.join('\n') });
    h.ctx.db.$client.prepare('update builds set area_cm2 = 25 where id = ?').run(buildId);
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/area/);
  });
});

describe('impedance mapping confirmed by hand', () => {
  it('takes a confirmed mapping for headers it cannot read, and asks when none is given', async () => {
    const lines = ['col A,col B,col C'];
    FREQUENCIES.forEach((f, k) => lines.push([f, Z.real[k], Z.imag[k]].join(',')));
    const ask = await upload('anon.csv', lines.join('\n'), { kind: 'impedance' });
    expect(ask.status).toBe(422);
    expect(ask.body.error.code).toBe('mapping-needed');
    const mapping = { frequency: { column: 0, unit: 'Hz' }, zReal: { column: 1, unit: 'ohm*cm2' }, zImag: { column: 2, unit: 'ohm*cm2' } };
    const res = await upload('anon.csv', lines.join('\n'), { kind: 'impedance', mapping: JSON.stringify(mapping) });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(Math.abs((res.body.curve as Curve).metrics.rct! / TRUE.rCt - 1)).toBeLessThan(1e-6); // derived by hand, as above
    const bad = await upload('anon.csv', lines.join('\n'), { kind: 'impedance', mapping: JSON.stringify({ frequency: { column: 0, unit: 'Hz' } }) });
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body)).toMatch(/zReal/);
  });
});
