// API tests of designed experiments: designs, planning runs as builds (all or nothing),
// the surface fit on tested builds, and proposals. The statistics themselves are checked in
// tests/unit/doe; here we check the routes wire data, rules and errors correctly.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHarness, demoIds, type Harness } from './harness';
import { longleyCertified, longleyRows } from '../fixtures/nist/longley';
import { pontiusCertified, pontiusRows } from '../fixtures/nist/pontius';
import { reversibleCellVoltage } from '../../shared/doe/limits/reversible-voltage';

let h: Harness;
let ids: ReturnType<typeof demoIds>;
let C: number;

beforeAll(async () => {
  h = await createHarness();
  ids = demoIds(h.ctx);
  C = ids.project('C');
});
afterAll(() => h.close());

const buildCount = (projectId: number) => (h.ctx.db.$client.prepare('select count(*) as n from builds where project_id = ?').get(projectId) as { n: number }).n;

describe('POST /api/projects/:id/designs', () => {
  it('generates a Box–Behnken design in actual units, reproducibly from its seed', async () => {
    const body = { kind: 'box-behnken', factors: ['binder', 'activationTemp', 'cellTemp'], centerPoints: 3, seed: 11 };
    const res = await h.as.researcher.post(`/api/projects/${C}/designs`, body);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const { design } = res.body;
    // NIST/SEMATECH e-Handbook §5.3.3.6.2: 3-factor Box–Behnken = 12 edge runs + centre points
    expect(design.runs).toHaveLength(15);
    expect(design.info.runsByType).toMatchObject({ edge: 12, centre: 3 });
    // binder range 10–40 wt % in the demo seed: coded 0 = 25 wt %
    const centre = design.runs.find((r: { pointType: string }) => r.pointType === 'centre');
    expect(centre.actual.binder).toBe(25);
    for (const run of design.runs) {
      expect(run.actual.binder).toBeGreaterThanOrEqual(10);
      expect(run.actual.binder).toBeLessThanOrEqual(40);
    }
    const again = await h.as.researcher.post(`/api/projects/${C}/designs`, body);
    expect(again.body.design.runs.map((r: { standardOrder: number }) => r.standardOrder)).toEqual(design.runs.map((r: { standardOrder: number }) => r.standardOrder));
  });

  it('crosses categorical factors and reports the alias structure of a fraction', async () => {
    const res = await h.as.pi.post(`/api/projects/${C}/designs`, { kind: 'fractional-factorial', factors: ['binder', 'activationTemp', 'activationTime', 'cellTemp', 'gdl'], generators: ['D=ABC'], seed: 2 });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // 2^(4−1) = 8 runs × 2 GDL levels = 16 (derived by hand)
    expect(res.body.design.runs).toHaveLength(16);
    // I = ABCD: resolution IV (Montgomery, Design and Analysis of Experiments, §8.2)
    expect(res.body.design.info.resolution).toBe(4);
    expect(res.body.design.info.aliasChains.length).toBeGreaterThan(0);
  });

  it('names the field of a bad request: unknown factor 400, impossible generator 422', async () => {
    const unknown = await h.as.pi.post(`/api/projects/${C}/designs`, { kind: 'full-factorial-2', factors: ['binder', 'nope'] });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.details.fields[0].path).toBe('factors.1');
    const bad = await h.as.pi.post(`/api/projects/${C}/designs`, { kind: 'fractional-factorial', factors: ['binder', 'activationTemp', 'cellTemp'], generators: ['C=AZ'] });
    expect(bad.status).toBe(422);
    expect(bad.body.error.message).toMatch(/generators/);
    const kind = await h.as.pi.post(`/api/projects/${C}/designs`, { kind: 'simplex', factors: ['binder'] });
    expect(kind.status).toBe(400);
    expect(kind.body.error.details.fields[0].path).toBe('kind');
  });
});

describe('POST /api/projects/:id/designs/plan', () => {
  it('turns runs into planned builds with codes, parent and a lab per block', async () => {
    const design = (await h.as.pi.post(`/api/projects/${C}/designs`, { kind: 'full-factorial-2', factors: ['binder', 'cellTemp'], replicates: 2, blocks: 2, seed: 5 })).body.design;
    const kestrel = ids.lab('Kestrel');
    const home = ids.lab('Northgate');
    const before = buildCount(C);
    const res = await h.as.researcher.post(`/api/projects/${C}/designs/plan`, { runs: design.runs, parentId: ids.build('C-010'), labsByBlock: { '1': home, '2': kestrel }, designKind: design.kind, seed: design.info.seed, note: 'binder × cell temperature screen' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    // 2^2 × 2 replicates = 8 runs (derived by hand)
    expect(res.body.builds).toHaveLength(8);
    expect(buildCount(C)).toBe(before + 8);
    const codes = res.body.builds.map((b: { code: string }) => Number(b.code.slice(2)));
    for (let i = 1; i < codes.length; i++) expect(codes[i]).toBe(codes[i - 1] + 1);
    for (const b of res.body.builds) {
      expect(b.status).toBe('planned');
      expect(b.parentId).toBe(ids.build('C-010'));
      expect(b.changeNote).toMatch(/^binder × cell temperature screen — design run \d+ of 8/);
    }
    const runOne = design.runs.find((r: { runOrder: number }) => r.runOrder === 1);
    // every factor: the design's two, the rest held at the parent's values (demo seed: C-010 is
    // 350 °C, 3 h, woven carbon)
    expect(res.body.builds[0].factors).toEqual({ binder: 30, activationTemp: 350, activationTime: 3, gdl: 'woven carbon', cellTemp: 180, ...runOne.actual });
    expect(res.body.builds[0].labId).toBe(runOne.block === 1 ? home : kestrel);
    // a link back to the stored design and the day it was planned
    const today = new Date().toISOString().slice(0, 10);
    for (const b of res.body.builds) {
      expect(b.designId).toBe(res.body.designId);
      expect(b.plannedOn).toBe(today);
    }
    const list = await h.as.viewer.get(`/api/projects/${C}/designs`);
    expect(list.status).toBe(200);
    const stored = list.body.designs.find((d: { id: number }) => d.id === res.body.designId);
    expect(stored.kind).toBe('full-factorial-2');
    expect(stored.seed).toBe(5);
    expect(stored.runCount).toBe(8);
    expect(stored.builds.map((b: { code: string }) => b.code)).toEqual(res.body.builds.map((b: { code: string }) => b.code));
    const one = await h.as.viewer.get(`/api/builds/${res.body.builds[0].id}`);
    expect(one.body.build.designId).toBe(res.body.designId);
  });

  it('holds the factors a design leaves out at the values chosen, and refuses a plan that leaves one unset', async () => {
    const design = (await h.as.pi.post(`/api/projects/${C}/designs`, { kind: 'full-factorial-2', factors: ['binder', 'cellTemp'], seed: 3 })).body.design;
    const before = buildCount(C);
    const missing = await h.as.pi.post(`/api/projects/${C}/designs/plan`, { runs: design.runs, held: { activationTemp: 340 } });
    expect(missing.status).toBe(422);
    expect(missing.body.error.details.fields.map((f: { path: string }) => f.path).sort()).toEqual(['held.activationTime', 'held.gdl']);
    expect(missing.body.error.message).toMatch(/Activation time is not in the design/);
    expect(buildCount(C)).toBe(before);
    const res = await h.as.pi.post(`/api/projects/${C}/designs/plan`, { runs: design.runs, held: { activationTemp: 340, activationTime: 2, gdl: 'carbon paper' } });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    for (const b of res.body.builds) expect(b.factors).toMatchObject({ activationTemp: 340, activationTime: 2, gdl: 'carbon paper' });
    const outside = await h.as.pi.post(`/api/projects/${C}/designs/plan`, { runs: design.runs, held: { activationTemp: 500, activationTime: 2, gdl: 'carbon paper' } });
    expect(outside.status).toBe(422);
    expect(outside.body.error.details.fields[0].path).toBe('held.activationTemp');
  });

  it('plans nothing when one run is outside a factor’s range (circumscribed axial points)', async () => {
    const design = (await h.as.pi.post(`/api/projects/${C}/designs`, { kind: 'central-composite', factors: ['binder', 'cellTemp'], centerPoints: 2, seed: 5 })).body.design;
    const before = buildCount(C);
    const res = await h.as.pi.post(`/api/projects/${C}/designs/plan`, { runs: design.runs, held: { activationTemp: 340, activationTime: 2, gdl: 'woven carbon' } });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/outside the factor's range/);
    expect(res.body.error.details.fields.length).toBe(4); // 4 axial runs at α = 1.414 (NIST e-Handbook §5.3.3.6.1)
    expect(buildCount(C)).toBe(before);
  });

  it('refuses a parent from another project', async () => {
    const res = await h.as.pi.post(`/api/projects/${C}/designs/plan`, { runs: [{ runOrder: 1, actual: { binder: 20 } }], parentId: ids.build('A-001') });
    expect(res.status).toBe(422);
    expect(res.body.error.details.fields[0].path).toBe('parentId');
  });
});

describe('POST /api/projects/:id/surface', () => {
  it('fits V at j_ref on the tested and reviewed demo builds, replicates as separate runs', async () => {
    const res = await h.as.researcher.post(`/api/projects/${C}/surface`, { response: 'vAtRef', model: 'linear' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const { fit, runs } = res.body;
    // demo seed: C-001…C-012, C-014…C-020, C-022 and C-023 are tested/reviewed (C-013 discarded, C-021 planned) → 21
    expect(fit.n).toBe(21);
    expect(runs).toHaveLength(21);
    expect(fit.distinctRuns).toBeLessThan(21); // replicate pairs share settings (demo seed)
    // 1 + 4 continuous + 1 GDL dummy = 6 columns; model df 5, residual df 15 (derived by hand)
    expect(fit.coefficients).toHaveLength(6);
    expect(fit.anova.model.df).toBe(5);
    expect(fit.anova.residual.df).toBe(15);
    expect(fit.anova.pureError.df).toBeGreaterThan(0);
    expect(fit.r2).toBeGreaterThan(0);
    expect(fit.r2).toBeLessThanOrEqual(1);
    for (const run of runs) expect(run.observed - run.residual).toBeCloseTo(run.predicted, 12);
    expect(res.body.gases).toEqual(['H2/air']);
  });

  it('reproduces a 2² factorial with centre points worked by hand (coded and actual units, lack of fit)', async () => {
    const project = (await h.as.pi.post('/api/projects', { name: 'Hand-worked 2² check', codePrefix: 'HW', settings: { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'catalyst' } })).body.project;
    const P = project.id;
    await h.as.pi.post(`/api/projects/${P}/factors`, { key: 'binder', label: 'Binder', unit: 'wt %', kind: 'continuous', low: 10, high: 40 });
    await h.as.pi.post(`/api/projects/${P}/factors`, { key: 'cellTemp', label: 'Cell temperature', unit: '°C', kind: 'continuous', low: 160, high: 200 });
    await h.as.pi.post(`/api/projects/${P}/responses`, { key: 'score', label: 'Score', unit: '', goal: 'maximize' });
    const runs: [number, number, number][] = [[10, 160, 10], [40, 160, 14], [10, 200, 12], [40, 200, 18], [25, 180, 13], [25, 180, 13.5], [25, 180, 12.5]];
    for (const [binder, cellTemp, score] of runs) {
      const b = await h.as.pi.post(`/api/projects/${P}/builds`, { status: 'tested', factors: { binder, cellTemp }, responses: { score } });
      expect(b.status, JSON.stringify(b.body)).toBe(201);
    }
    const res = await h.as.pi.post(`/api/projects/${P}/surface`, { response: 'score', model: 'interactions' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const coef = Object.fromEntries(res.body.fit.coefficients.map((c: { term: string }) => [c.term, c])) as Record<string, { coded: number; actual: number }>;
    // derived by hand: contrasts of the 2² runs (10, 14, 12, 18) / 4; intercept = 93/7 (orthogonal columns)
    expect(coef.intercept!.coded).toBeCloseTo(93 / 7, 10);
    expect(coef.binder!.coded).toBeCloseTo(2.5, 10);
    expect(coef.cellTemp!.coded).toBeCloseTo(1.5, 10);
    expect(coef['binder*cellTemp']!.coded).toBeCloseTo(0.5, 10);
    // derived by hand: x1 = (binder − 25)/15, x2 = (T − 180)/20 expanded into actual monomials
    expect(coef['binder*cellTemp']!.actual).toBeCloseTo(0.5 / 300, 12);
    expect(coef.binder!.actual).toBeCloseTo(2.5 / 15 - (0.5 * 180) / 300, 10);
    expect(coef.cellTemp!.actual).toBeCloseTo(1.5 / 20 - (0.5 * 25) / 300, 10);
    expect(coef.intercept!.actual).toBeCloseTo(93 / 7 - (2.5 * 25) / 15 - (1.5 * 180) / 20 + (0.5 * 25 * 180) / 300, 9);
    const anova = res.body.fit.anova;
    // derived by hand: pure error from the centre runs 13, 13.5, 12.5 → SS 0.5 on 2 df;
    // lack of fit = curvature nF·nC(ȳF − ȳC)²/(nF + nC) = 4·3·0.25/7 = 3/7 on 1 df (Montgomery §6.8)
    expect(anova.pureError.ss).toBeCloseTo(0.5, 10);
    expect(anova.pureError.df).toBe(2);
    expect(anova.lackOfFit.ss).toBeCloseTo(3 / 7, 10);
    expect(anova.lackOfFit.df).toBe(1);
    expect(anova.residual.ss).toBeCloseTo(0.5 + 3 / 7, 10);
  });

  it('answers 422 when the model has more terms than runs, 400 for an unknown response or factor', async () => {
    const quad = await h.as.pi.post(`/api/projects/${C}/surface`, { response: 'vAtRef', model: 'quadratic' });
    expect(quad.status).toBe(422);
    expect(quad.body.error.code).toBe('too-few-runs');
    const unknown = await h.as.pi.post(`/api/projects/${C}/surface`, { response: 'voltage', model: 'linear' });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.details.fields[0].path).toBe('response');
    const factor = await h.as.pi.post(`/api/projects/${C}/surface`, { response: 'vAtRef', model: 'linear', factors: ['binder', 'ovenHumidity'] });
    expect(factor.status).toBe(400);
    expect(factor.body.error.details.fields[0].path).toBe('factors.1');
    const term = await h.as.pi.post(`/api/projects/${C}/surface`, { response: 'vAtRef', model: { terms: ['binder*zzz'] } });
    expect(term.status).toBe(422);
    const empty = await h.as.pi.post(`/api/projects/${C}/surface`, { response: 'thicknessUm', model: 'linear' });
    expect(empty.status).toBe(422);
  });

  it('fits an explicit hierarchical term list over chosen factors', async () => {
    const res = await h.as.pi.post(`/api/projects/${C}/surface`, { response: 'vAtRef', model: { terms: ['binder', 'cellTemp', 'binder^2'] }, factors: ['binder', 'cellTemp'] });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.fit.terms).toEqual(['intercept', 'binder', 'cellTemp', 'binder^2']);
    expect(res.body.factors.map((f: { key: string }) => f.key)).toEqual(['binder', 'cellTemp']);
  });
});

describe('POST /api/projects/:id/proposals', () => {
  it('proposes spread-out builds inside the constraints, with intervals, reasons, parent and cautions', async () => {
    const res = await h.as.researcher.post(`/api/projects/${C}/proposals`, {
      response: 'vAtRef',
      model: 'linear',
      count: 3,
      strategy: 'balance',
      constraints: { fixed: { gdl: 'woven carbon' }, bounds: { binder: { max: 30 } } },
    });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const { proposals } = res.body;
    expect(proposals).toHaveLength(3);
    const keys = new Set<string>();
    for (const p of proposals) {
      expect(p.factors.gdl).toBe('woven carbon');
      expect(p.factors.binder).toBeLessThanOrEqual(30);
      expect(p.factors.binder).toBeGreaterThanOrEqual(10);
      expect(p.low).toBeLessThan(p.predicted);
      expect(p.high).toBeGreaterThan(p.predicted);
      expect(p.reason).toMatch(/balance/);
      expect(typeof p.extrapolation).toBe('boolean');
      expect(p.nearest.code).toMatch(/^C-0\d\d$/);
      // demo tests run on H2/air (demo seed), so every proposal carries the fuel caution
      expect(p.cautions.join(' ')).toMatch(/flammable/);
      keys.add(JSON.stringify(p.factors));
    }
    expect(keys.size).toBe(3);
    expect(res.body.goal).toBe('maximize'); // V at j_ref: higher is better (common practice in the trade)
  });

  it('flags a temperature above the highest tested one', async () => {
    const res = await h.as.pi.post(`/api/projects/${C}/proposals`, { response: 'vAtRef', model: 'linear', count: 1, strategy: 'exploit', constraints: { fixed: { activationTemp: 380 } } });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // highest tested activation temperature in the demo seed: 370 °C (C-017; C-013 at 380 °C was discarded)
    expect(res.body.proposals[0].cautions.join(' ')).toMatch(/Activation temperature 380 °C is above the highest tested \(370 °C\)/);
  });

  it('refuses bad constraints with 422 and a bad count with 400', async () => {
    const unknown = await h.as.pi.post(`/api/projects/${C}/proposals`, { response: 'vAtRef', model: 'linear', count: 2, constraints: { fixed: { nope: 1 } } });
    expect(unknown.status).toBe(422);
    expect(unknown.body.error.message).toMatch(/constraints/);
    const empty = await h.as.pi.post(`/api/projects/${C}/proposals`, { response: 'vAtRef', model: 'linear', count: 2, constraints: { bounds: { binder: { min: 35, max: 20 } } } });
    expect(empty.status).toBe(422);
    const count = await h.as.pi.post(`/api/projects/${C}/proposals`, { response: 'vAtRef', model: 'linear', count: 0 });
    expect(count.status).toBe(400);
    expect(count.body.error.details.fields[0].path).toBe('count');
  });

  it('keeps viewers and partners to reading', async () => {
    for (const who of ['viewer', 'partner'] as const) {
      expect((await h.as[who].post(`/api/projects/${C}/proposals`, { response: 'vAtRef', count: 1 })).status).toBe(403);
      expect((await h.as[who].post(`/api/projects/${C}/surface`, { response: 'vAtRef' })).status).toBe(403);
      expect((await h.as[who].post(`/api/projects/${C}/designs`, { kind: 'full-factorial-2', factors: ['binder'] })).status).toBe(403);
    }
    expect((await h.anonymous.post(`/api/projects/${C}/surface`, { response: 'vAtRef' })).status).toBe(401);
  });
});

/** A project of continuous factors and one hand-entered response, with tested builds. */
async function projectWith(name: string, prefix: string, factors: { key: string; low: number; high: number }[], rows: { x: number[]; y: number }[]): Promise<number> {
  const project = (await h.as.pi.post('/api/projects', { name, codePrefix: prefix, settings: { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'catalyst' } })).body.project;
  for (const f of factors) {
    const r = await h.as.pi.post(`/api/projects/${project.id}/factors`, { key: f.key, label: f.key, unit: '', kind: 'continuous', low: f.low, high: f.high });
    expect(r.status, JSON.stringify(r.body)).toBe(201);
  }
  await h.as.pi.post(`/api/projects/${project.id}/responses`, { key: 'y', label: 'Response', unit: '', goal: 'maximize' });
  for (const row of rows) {
    const b = await h.as.pi.post(`/api/projects/${project.id}/builds`, { status: 'tested', factors: Object.fromEntries(factors.map((f, i) => [f.key, row.x[i]])), responses: { y: row.y } });
    expect(b.status, JSON.stringify(b.body)).toBe(201);
  }
  return project.id;
}

const relative = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('NIST StRD through the API (certified values, at least 9 significant digits)', () => {
  it('Longley: the six-predictor linear fit', async () => {
    const keys = ['deflator', 'gnp', 'unemployed', 'armedForces', 'population', 'year'];
    const factors = keys.map((key, i) => ({ key, low: Math.min(...longleyRows.map((r) => r.x[i]!)), high: Math.max(...longleyRows.map((r) => r.x[i]!)) }));
    const P = await projectWith('NIST Longley check', 'NL', factors, longleyRows.map((r) => ({ x: [...r.x], y: r.y })));
    const res = await h.as.pi.post(`/api/projects/${P}/surface`, { response: 'y', model: 'linear' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const { coefficients, rmse, r2 } = res.body.fit;
    // NIST StRD Longley.dat certified estimates and standard deviations
    coefficients.forEach((c: { actual: number; actualSE: number }, i: number) => {
      expect(relative(c.actual, longleyCertified.estimates[i]!)).toBeLessThan(1e-9);
      expect(relative(c.actualSE, longleyCertified.standardErrors[i]!)).toBeLessThan(1e-9);
    });
    expect(relative(rmse, longleyCertified.residualSD)).toBeLessThan(1e-9);
    expect(relative(r2, longleyCertified.rSquared)).toBeLessThan(1e-9);
  });

  it('Pontius: the quadratic in load, with its replicate loads as pure error', async () => {
    const P = await projectWith('NIST Pontius check', 'NP', [{ key: 'load', low: 150000, high: 3000000 }], pontiusRows.map((r) => ({ x: [r.x], y: r.y })));
    const res = await h.as.pi.post(`/api/projects/${P}/surface`, { response: 'y', model: 'quadratic' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const { coefficients, rmse, r2, anova } = res.body.fit;
    expect(coefficients.map((c: { term: string }) => c.term)).toEqual(['intercept', 'load', 'load^2']);
    // NIST StRD Pontius.dat certified estimates and standard deviations
    coefficients.forEach((c: { actual: number; actualSE: number }, i: number) => {
      expect(relative(c.actual, pontiusCertified.estimates[i]!)).toBeLessThan(1e-9);
      expect(relative(c.actualSE, pontiusCertified.standardErrors[i]!)).toBeLessThan(1e-9);
    });
    expect(relative(rmse, pontiusCertified.residualSD)).toBeLessThan(1e-9);
    expect(relative(r2, pontiusCertified.rSquared)).toBeLessThan(1e-9);
    // each load was run twice: 20 replicate pairs, 20 df of pure error (derived by hand)
    expect(anova.pureError.df).toBe(20);
    // leave-one-out error by explicit refits in numpy: tests/reference/leave_one_out.py
    expect(relative(res.body.quality.looRmse, 0.0002148975383779)).toBeLessThan(1e-9);
    expect(res.body.quality.replicateGroups).toBe(20);
  });
});

describe('the surface as the page opens it: automatic model, quality, effects, limits', () => {
  it('chooses the simplest adequate model the demo builds support, and says why', async () => {
    const res = await h.as.researcher.post(`/api/projects/${C}/surface`, { response: 'vAtRef', model: 'auto' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const { model, quality, effects, support, limits, trustRegion, fit } = res.body;
    expect(model.requested).toBe('auto');
    expect(model.choice.rule).toMatch(/leave-one-out/);
    const byName = Object.fromEntries(model.choice.candidates.map((c: { name: string }) => [c.name, c]));
    // demo seed: 13 distinct recipes; interactions need 16 + 2, the quadratic 20 + 2 (derived by hand)
    expect(model.choice.distinctRuns).toBe(13);
    expect(byName.interactions.supported).toBe(false);
    expect(byName.interactions.distinctNeeded).toBe(18);
    expect(byName.quadratic.supported).toBe(false);
    expect(byName.linear.supported).toBe(true);
    const chosen = model.choice.chosen;
    expect(chosen.supported).toBe(true);
    for (const c of model.choice.candidates) if (c.supported) expect(chosen.looRmse).toBeLessThanOrEqual(c.looRmse * 1.05 + 1e-15);
    expect(fit.terms.slice(1)).toEqual(chosen.terms);
    expect(support.supported).toBe(true);
    // quality in the response's unit: leave-one-out error and the replicate spread (demo has replicates)
    expect(quality.looRmse).toBeCloseTo(chosen.looRmse, 12);
    expect(quality.replicateSd).toBeGreaterThan(0);
    expect(quality.replicateGroups).toBeGreaterThan(0);
    expect(['as-good-as-repeats', 'usable', 'misses-something', 'no-better-than-average']).toContain(quality.verdict);
    // effects: largest first, labelled in words with units, never a factor key
    for (let i = 1; i < effects.length; i++) expect(Math.abs(effects[i - 1].effect)).toBeGreaterThanOrEqual(Math.abs(effects[i].effect));
    for (const e of effects) {
      expect(e.label).not.toMatch(/activationTemp|cellTemp|activationTime|\[/);
      expect(e.low).toBeLessThanOrEqual(e.effect);
      expect(e.high).toBeGreaterThanOrEqual(e.effect);
    }
    const binder = effects.find((e: { term: string }) => e.term === 'binder');
    if (binder) expect(binder.label).toBe('PTFE binder 10→40 wt %');
    // physics: the cell-temperature factor sets the reversible-voltage limit
    expect(limits.cellTemperatureFactor).toBe('cellTemp');
    expect(trustRegion.leverageLimit).toBeCloseTo(Math.max(...fit.leverage), 12);
    expect(trustRegion.ranges.find((r: { key: string }) => r.key === 'activationTemp')).toMatchObject({ low: 320, high: 370 }); // demo seed: tested builds span 320–370 °C
    for (const w of fit.warnings) expect(w).not.toMatch(/\brow \d+|activationTemp|cellTemp|gdl\[/);
  });

  it('refuses models the builds cannot support before fitting, with the reason in words', async () => {
    const interactions = await h.as.pi.post(`/api/projects/${C}/surface`, { response: 'vAtRef', model: 'interactions' });
    expect(interactions.status).toBe(422);
    expect(interactions.body.error.code).toBe('too-few-runs');
    // 1 + 5 main-effect columns + 6 continuous pairs + 4 continuous × GDL = 16 (derived by hand)
    expect(interactions.body.error.message).toMatch(/two-factor interaction has 16 terms .* only 13 distinct recipes; it needs at least 17/);
    // two factors that always move together in a small invented project: aliased
    const P = await projectWith('Aliased check', 'AL', [{ key: 'ink', low: 0, high: 10 }, { key: 'solvent', low: 0, high: 20 }], [0, 2, 4, 6, 8, 10].map((v, i) => ({ x: [v, 2 * v], y: 1 + v + 0.1 * (i % 2) })));
    const aliased = await h.as.pi.post(`/api/projects/${P}/surface`, { response: 'y', model: 'linear' });
    expect(aliased.status).toBe(422);
    expect(aliased.body.error.code).toBe('aliased-terms');
    expect(aliased.body.error.message).toMatch(/solvent \(moves together with ink\)/);
  });
});

describe('proposals inside the data and physics', () => {
  it('keeps supported proposals in the trust region, labels exploratory ones, and holds predictions below E_rev', async () => {
    const res = await h.as.researcher.post(`/api/projects/${C}/proposals`, { response: 'vAtRef', model: 'auto', count: 3, exploratory: 1, strategy: 'balance' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const { proposals } = res.body;
    expect(proposals.filter((p: { kind: string }) => p.kind === 'supported')).toHaveLength(3);
    expect(proposals.filter((p: { kind: string }) => p.kind === 'exploratory')).toHaveLength(1);
    for (const p of proposals) {
      expect(p.support.inside).toBe(p.kind === 'supported');
      expect(p.extrapolation).toBe(p.kind === 'exploratory');
      if (p.kind === 'exploratory') {
        expect(p.flagged).toBe(true);
        expect(p.flags.join(' ')).toMatch(/Outside the builds' support/);
        expect(p.reason).toMatch(/^exploratory: a step outside/);
        // a stated step: leverage at most 3 × the limit
        expect(p.support.leverage).toBeLessThanOrEqual(3 * p.support.leverageLimit * (1 + 1e-9));
      }
      // Larminie & Dicks Table 2.2 through reversibleCellVoltage, at the proposal's cell temperature
      expect(p.predicted).toBeLessThanOrEqual(reversibleCellVoltage(p.factors.cellTemp));
      expect(p.high).toBeLessThanOrEqual(reversibleCellVoltage(p.factors.cellTemp));
      expect(p.reason).not.toMatch(/vAtRef|activationTemp/);
    }
  });

  it('plans a proposal; a flagged one only with a written reason, which the build keeps', async () => {
    const base = { response: 'vAtRef', model: 'linear' };
    // inside: a tested recipe (C-010)
    const inside = await h.as.researcher.post(`/api/projects/${C}/proposals/plan`, { ...base, recipe: { binder: 30, activationTemp: 350, activationTime: 3, gdl: 'woven carbon', cellTemp: 180 }, parentId: ids.build('C-010') });
    expect(inside.status, JSON.stringify(inside.body)).toBe(201);
    expect(inside.body.flagged).toBe(false);
    expect(inside.body.build.status).toBe('planned');
    expect(inside.body.build.planReason).toBeNull();
    expect(inside.body.build.plannedOn).toBe(new Date().toISOString().slice(0, 10));
    // outside: activation at 380 °C, beyond the 320–370 °C the tested builds span (demo seed)
    const recipe = { binder: 40, activationTemp: 380, activationTime: 4, gdl: 'carbon paper', cellTemp: 200 };
    const before = buildCount(C);
    const refused = await h.as.researcher.post(`/api/projects/${C}/proposals/plan`, { ...base, recipe });
    expect(refused.status).toBe(422);
    expect(refused.body.error.code).toBe('reason-required');
    expect(refused.body.error.message).toMatch(/Activation temperature 380 °C is outside the range built so far/);
    expect(refused.body.error.details.fields[0].path).toBe('reason');
    const short = await h.as.researcher.post(`/api/projects/${C}/proposals/plan`, { ...base, recipe, reason: 'why not' });
    expect(short.status).toBe(422);
    expect(buildCount(C)).toBe(before);
    const reason = 'Checking whether a hotter activation pays off before the next design.';
    const ok = await h.as.researcher.post(`/api/projects/${C}/proposals/plan`, { ...base, recipe, reason });
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
    expect(ok.body.flagged).toBe(true);
    const stored = await h.as.viewer.get(`/api/builds/${ok.body.build.id}`);
    expect(stored.body.build.planReason).toBe(reason);
    expect(stored.body.build.factors).toEqual(recipe);
  });
});
