// GET /api/projects/:id/gains through the route: the demo campaign's default chain, a
// hand-computed waterfall on an invented project, and the refusals.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHarness, demoIds, type Harness } from './harness';

let h: Harness;
let ids: ReturnType<typeof demoIds>;
let P: number;
const made: Record<string, number> = {};

beforeAll(async () => {
  h = await createHarness();
  ids = demoIds(h.ctx);
  // An invented project with one factor and a hand-entered response in mV.
  const project = await h.as.pi.post('/api/projects', { name: 'Gains check project', settings: { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: false, loadingBasis: 'catalyst' } });
  P = project.body.project.id;
  await h.as.pi.post(`/api/projects/${P}/factors`, { key: 'x', label: 'Binder', unit: 'wt %', kind: 'continuous', low: 0, high: 100 });
  await h.as.pi.post(`/api/projects/${P}/responses`, { key: 'score', label: 'Score', unit: 'mV', goal: 'maximize' });
  const add = async (code: string, x: number, score: number | null, extra: Record<string, unknown> = {}) => {
    const res = await h.as.pi.post(`/api/projects/${P}/builds`, { code, factors: { x }, status: 'tested', ...(score == null ? {} : { responses: { score } }), ...extra });
    if (res.status !== 201) throw new Error(JSON.stringify(res.body));
    made[code] = res.body.build.id;
  };
  await add('G-001', 10, 95);
  await add('G-002', 10, 100);
  await add('G-003', 10, 105);
  await add('G-004', 20, 200, { parentId: made['G-001'], changeNote: 'binder 10 → 20' });
  await add('G-005', 30, 203, { parentId: made['G-004'], changeNote: 'binder 20 → 30' });
  await add('G-006', 40, null, { parentId: made['G-005'], status: 'planned' });
});
afterAll(() => h.close());

describe('gains route on an invented project', () => {
  it('walks the best path by default and closes the waterfall exactly', async () => {
    const res = await h.as.pi.get(`/api/projects/${P}/gains?response=score`).expect(200);
    expect(res.body.chain).toBe('best-path');
    expect(res.body.unit).toBe('mV'); // the response's own unit
    expect(res.body.steps.map((s: { code: string }) => s.code)).toEqual(['G-001', 'G-004', 'G-005']); // derived by hand: G-005 (203) is the best descendant
    const [base, first, second] = res.body.steps;
    expect(base.value).toBeCloseTo(100, 12); // derived by hand: (95 + 100 + 105)/3, the same recipe made three times
    expect(base.n).toBe(3);
    expect(base.sd).toBeCloseTo(5, 12); // derived by hand: deviations −5, 0, 5 → √(50/2)
    expect(base.replicates).toEqual(['G-001', 'G-002', 'G-003']);
    expect(first.gain).toBeCloseTo(100, 12); // derived by hand: 200 − 100
    expect(second.gain).toBeCloseTo(3, 12); // derived by hand: 203 − 200
    let sum = 0;
    for (const s of res.body.steps) sum += s.gain ?? 0;
    expect(res.body.total.gain).toBe(sum); // the bars add up to the total bar
    expect(res.body.total.gain).toBeCloseTo(103, 12); // derived by hand: 203 − 100
    expect(res.body.pooledSd).toEqual({ sd: 5, df: 2, groups: 1 }); // derived by hand: one group of 3, SD 5
  });

  it('calls a 3 mV step with a replicate SD of 5 mV within noise, with the pooled t-interval', async () => {
    const res = await h.as.pi.get(`/api/projects/${P}/gains?response=score&builds=${made['G-004']},${made['G-005']}`).expect(200);
    expect(res.body.chain).toBe('given');
    const step = res.body.steps[1];
    // derived by hand: 3 ± t(0.975, 2)·5·√(1/1 + 1/1) = 3 ± 4.303·7.0711 = 3 ± 30.43
    // (t(0.975, 2) = 4.303 from the NIST/SEMATECH e-Handbook t table, 1.3.6.7.2)
    expect(step.high - step.gain).toBeCloseTo(4.303 * 5 * Math.SQRT2, 1);
    expect(step.low).toBeLessThan(0);
    expect(step.withinNoise).toBe(true); // common practice: a step inside the noise is not a gain
    expect(step.method).toBe('pooled');
    expect(step.note).toContain('pooled replicate SD');
  });

  it('calls the 100 mV step beyond noise', async () => {
    const res = await h.as.pi.get(`/api/projects/${P}/gains?response=score&builds=${made['G-002']},${made['G-004']}`).expect(200);
    const step = res.body.steps[1];
    // derived by hand: ± 4.303·5·√(1/3 + 1) = ± 24.84 around 100 (the G-002 step stands for its group of 3)
    expect(step.high - step.gain).toBeCloseTo(4.303 * 5 * Math.sqrt(4 / 3), 1);
    expect(step.withinNoise).toBe(false);
    expect(res.body.steps[0].code).toBe('G-002');
    expect(res.body.steps[0].n).toBe(3);
  });

  it('refuses unknown responses, foreign, repeated or unmeasured builds, and bad lists', async () => {
    const unknown = await h.as.pi.get(`/api/projects/${P}/gains?response=nonsense`).expect(400);
    expect(unknown.body.error.details.fields[0].path).toBe('response');
    const foreign = await h.as.pi.get(`/api/projects/${P}/gains?response=score&builds=${made['G-001']},${ids.build('C-010')}`).expect(400);
    expect(foreign.body.error.message).toContain('is not in this project');
    const twice = await h.as.pi.get(`/api/projects/${P}/gains?response=score&builds=${made['G-001']},${made['G-001']}`).expect(400);
    expect(twice.body.error.message).toContain('listed twice');
    const planned = await h.as.pi.get(`/api/projects/${P}/gains?response=score&builds=${made['G-005']},${made['G-006']}`).expect(422);
    expect(planned.body.error.message).toContain('G-006 (planned)');
    const bad = await h.as.pi.get(`/api/projects/${P}/gains?response=score&builds=1,,x`).expect(400);
    expect(bad.body.error.details.fields[0].path).toBe('builds');
    const noValues = await h.as.pi.get(`/api/projects/${P}/gains?response=peakPower`).expect(422);
    expect(noValues.body.error.code).toBe('no-values');
  });

  it('answers 401 before anything else, 404 for a project one cannot see', async () => {
    await h.anonymous.get(`/api/projects/${P}/gains`).expect(401);
    await h.as.partner.get(`/api/projects/${ids.project('A')}/gains`).expect(404);
  });
});

describe('gains route on the demo campaign', () => {
  it('tells the cathode story from the baseline to the best build, in V', async () => {
    const res = await h.as.pi.get(`/api/projects/${ids.project('C')}/gains?response=vAtRef`).expect(200);
    expect(res.body.response).toMatchObject({ key: 'vAtRef', unit: 'V' }); // vAtRef is kept in V, the fixed unit of the API
    const codes = res.body.steps.map((s: { code: string }) => s.code);
    expect(codes[0]).toBe('C-001'); // the campaign's baseline (demo data)
    expect(codes.length).toBeGreaterThan(3);
    for (const step of res.body.steps.slice(1)) {
      expect(step.low).toBeLessThanOrEqual(step.gain);
      expect(step.high).toBeGreaterThanOrEqual(step.gain);
      expect(typeof step.withinNoise).toBe('boolean');
    }
    expect(res.body.steps[0].replicates).toEqual(['C-001', 'C-002', 'C-003']); // demo data: C-002, C-003 replicate C-001
    const lineage = await h.as.pi.get(`/api/projects/${ids.project('C')}/lineage?response=vAtRef`).expect(200);
    expect(lineage.body.bestPath.buildIds).toEqual(res.body.steps.map((s: { buildId: number }) => s.buildId));
  });
});
