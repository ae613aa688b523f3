// API tests of designed experiments: designs, planning runs as builds (all or nothing),
// the surface fit on tested builds, and proposals. The statistics themselves are checked in
// tests/unit/doe; here we check the routes wire data, rules and errors correctly.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHarness, demoIds, type Harness } from './harness';

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
    expect(res.body.builds[0].factors).toEqual(runOne.actual);
    expect(res.body.builds[0].labId).toBe(runOne.block === 1 ? home : kestrel);
  });

  it('plans nothing when one run is outside a factor’s range (circumscribed axial points)', async () => {
    const design = (await h.as.pi.post(`/api/projects/${C}/designs`, { kind: 'central-composite', factors: ['binder', 'cellTemp'], centerPoints: 2, seed: 5 })).body.design;
    const before = buildCount(C);
    const res = await h.as.pi.post(`/api/projects/${C}/designs/plan`, { runs: design.runs });
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
    // demo seed: C-001…C-012 and C-014…C-020 are tested/reviewed (C-013 discarded, C-021 planned) → 19
    expect(fit.n).toBe(19);
    expect(runs).toHaveLength(19);
    expect(fit.distinctRuns).toBeLessThan(19); // replicate pairs share settings (demo seed)
    // 1 + 4 continuous + 1 GDL dummy = 6 columns; model df 5, residual df 13 (derived by hand)
    expect(fit.coefficients).toHaveLength(6);
    expect(fit.anova.model.df).toBe(5);
    expect(fit.anova.residual.df).toBe(13);
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
    expect(res.body.goal).toBe('maximize'); // V at j_ref: higher is better (domain guide)
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
