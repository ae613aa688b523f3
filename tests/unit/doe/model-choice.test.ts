import { describe, expect, it } from 'vitest';
import { checkModelSupport, chooseModel, fitSurface, surfaceEffects, checkSupport, DoeInputError, type Factor, type Observation } from '../../../shared/doe/model';

const factors: Factor[] = [
  { key: 'binder', label: 'PTFE binder', unit: 'wt %', kind: 'continuous', low: 10, high: 40 },
  { key: 'cellTemp', label: 'Cell temperature', unit: '°C', kind: 'continuous', low: 160, high: 200 },
  { key: 'gdl', label: 'GDL', kind: 'categorical', levels: ['paper', 'cloth'] },
];
// invented noise-free surface in coded units: y = 0.60 + 0.02a − 0.01b + 0.015ab − 0.02a² + 0.005·[cloth]
const surface = (a: number, b: number, gdl: string) => 0.6 + 0.02 * a - 0.01 * b + 0.015 * a * b - 0.02 * a * a + (gdl === 'cloth' ? 0.005 : 0);
const grid: Observation[] = [];
for (const gdl of ['paper', 'cloth']) for (const a of [-1, 0, 1]) for (const b of [-1, 0, 1]) {
  // a small fixed wobble stands in for build-to-build noise
  const wobble = 0.0005 * Math.sin(7 * grid.length);
  grid.push({ factors: { binder: 25 + 15 * a, cellTemp: 180 + 20 * b, gdl }, y: surface(a, b, gdl) + wobble, label: `B-${grid.length + 1}` });
}

describe('checkModelSupport', () => {
  it('counts distinct recipes against the model columns', () => {
    const four = grid.filter((r) => r.factors.gdl === 'paper').slice(0, 4);
    // derived by hand: the quadratic in 2 continuous + 1 two-level factor has 1+3+3+2 = 9 columns
    const quad = checkModelSupport(factors, grid, 'quadratic', 'the full quadratic model');
    expect(quad.columns).toBe(9);
    expect(quad.distinctRuns).toBe(18);
    expect(quad.supported).toBe(true);
    const tooFew = checkModelSupport(factors.slice(0, 2), four, 'quadratic', 'the full quadratic model');
    expect(tooFew.supported).toBe(false);
    expect(tooFew.code).toBe('too-few-runs');
    expect(tooFew.reason).toBe('The full quadratic model has 6 terms (the constant included) but the builds give only 4 distinct recipes; it needs at least 7. Fit fewer terms, or make builds at new recipes.');
  });

  it('names aliased terms and what they move with, in words', () => {
    // GDL cloth only ever built at binder 40 and binder 40 only with cloth: indistinguishable
    const rows: Observation[] = [[10, 160, 'paper'], [25, 200, 'paper'], [10, 200, 'paper'], [25, 160, 'paper'], [40, 180, 'cloth'], [40, 170, 'cloth']].map(([binder, cellTemp, gdl], i) => ({ factors: { binder, cellTemp, gdl }, y: i }));
    const s = checkModelSupport(factors, rows, { terms: ['binder', 'cellTemp', 'gdl', 'binder^2'] }, 'your term list');
    expect(s.supported).toBe(false);
    expect(s.code).toBe('aliased-terms');
    expect(s.aliased.map((a) => a.label)).toEqual(['PTFE binder²']);
    expect(s.reason).toMatch(/terms of your term list cannot be told apart from others: PTFE binder² \(moves together with PTFE binder and GDL: cloth\)/);
  });
});

describe('chooseModel', () => {
  it('finds the terms of the generating surface and prefers the simpler of two near-equal models', () => {
    const choice = chooseModel({ factors, rows: grid });
    expect(choice.distinctRuns).toBe(18);
    const chosen = choice.chosen;
    // the generating surface has binder, cellTemp, gdl, binder×cellTemp and binder² (invented above)
    for (const term of ['binder', 'cellTemp', 'binder*cellTemp', 'binder^2']) expect(chosen.terms).toContain(term);
    expect(chosen.termLabels).toContain('PTFE binder × Cell temperature');
    // the rule: the fewest columns within 5 % of the lowest leave-one-out error
    const supported = choice.candidates.filter((c) => c.supported);
    const lowest = Math.min(...supported.map((c) => c.looRmse!));
    expect(chosen.looRmse!).toBeLessThanOrEqual(lowest * 1.05);
    for (const c of supported) if (c.looRmse! <= lowest * 1.05) expect(chosen.columns).toBeLessThanOrEqual(c.columns);
    expect(choice.rule).toMatch(/simplest model within 5 %/);
  });

  it('drops to what the runs can support, and refuses when nothing can be', () => {
    const five = grid.filter((r) => r.factors.gdl === 'paper').slice(0, 5);
    const choice = chooseModel({ factors: factors.slice(0, 2), rows: five });
    // 5 distinct recipes: a model needs its columns + 2, so at most 3 columns
    expect(choice.chosen.columns).toBeLessThanOrEqual(3);
    expect(choice.candidates.find((c) => c.name === 'quadratic')!.reason).toBe('needs 8 distinct recipes, the builds give 5');
    expect(() => chooseModel({ factors: factors.slice(0, 1), rows: five.slice(0, 2) })).toThrow(DoeInputError);
  });
});

describe('surfaceEffects', () => {
  it('turns coded coefficients into effects over the ranges, with 95 % intervals', () => {
    const fit = fitSurface({ factors, rows: grid, model: { terms: ['binder', 'cellTemp', 'gdl', 'binder*cellTemp', 'binder^2'] } });
    const effects = surfaceEffects(fit);
    const by = Object.fromEntries(effects.map((e) => [e.term, e]));
    // derived by hand from the invented surface: main effect = 2b, interaction = 4b, curvature = −b, level = b
    expect(by.binder!.effect).toBeCloseTo(0.04, 2);
    expect(by.binder!.label).toBe('PTFE binder 10→40 wt %');
    expect(by['binder*cellTemp']!.effect).toBeCloseTo(0.06, 2);
    expect(by['binder*cellTemp']!.meaning).toBe('how much larger the PTFE binder effect (10→40 wt %) is at 200 °C than at 160 °C');
    expect(by['binder^2']!.effect).toBeCloseTo(0.02, 2);
    expect(by['binder^2']!.meaning).toBe('how far 25 wt % sits above the straight line between 10 wt % and 40 wt %');
    expect(by['gdl[cloth]']!.effect).toBeCloseTo(0.005, 2);
    expect(by['gdl[cloth]']!.label).toBe('GDL: paper → cloth');
    for (let i = 1; i < effects.length; i++) expect(Math.abs(effects[i - 1]!.effect)).toBeGreaterThanOrEqual(Math.abs(effects[i]!.effect));
    // every interval is effect ± t(0.975, df)·SE with one t for the whole fit
    const t = (effects[0]!.high - effects[0]!.effect) / effects[0]!.se;
    expect(t).toBeGreaterThan(1.96);
    for (const e of effects) {
      expect(e.low).toBeLessThan(e.effect);
      expect((e.high - e.effect) / e.se).toBeCloseTo(t, 10);
      expect((e.effect - e.low) / e.se).toBeCloseTo(t, 10);
    }
  });
});

describe('checkSupport (trust region)', () => {
  it('is inside at the builds, outside beyond the ranges run or at levels not built', () => {
    const paperOnly = grid.filter((r) => r.factors.gdl === 'paper' && (r.factors.binder as number) <= 25);
    const fit = fitSurface({ factors, rows: paperOnly, model: 'linear' });
    for (const row of paperOnly) expect(checkSupport(fit, row.factors).inside).toBe(true);
    const beyond = checkSupport(fit, { binder: 35, cellTemp: 180, gdl: 'paper' });
    expect(beyond.inside).toBe(false);
    expect(beyond.reasons[0]).toBe('PTFE binder 35 wt % is outside the range built so far (10–25 wt %).');
    const cloth = checkSupport(fit, { binder: 20, cellTemp: 180, gdl: 'cloth' });
    expect(cloth.reasons).toContain('GDL "cloth" has not been built yet.');
    // the limit is the largest leverage of the builds (Montgomery, Peck & Vining §3.8)
    expect(beyond.leverageLimit).toBeCloseTo(Math.max(...fit.leverage), 12);
  });
});
