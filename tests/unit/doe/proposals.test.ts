import { describe, it, expect } from 'vitest';
import { canonicalAnalysis, DoeInputError, fitSurface } from '../../../shared/doe/model';
import type { Factor, Observation } from '../../../shared/doe/model';
import { proposeBuilds } from '../../../shared/doe/proposals';
import { mulberry32 } from '../../../shared/stats/random';

// Invented campaign: PTFE binder fraction (wt %) and oven activation temperature (°C) of a
// cathode GDE, response V at 0.2 A/cm². The generating surface (coded z₁, z₂) is
//   y = 0.62 + 0.02z₁ − 0.01z₂ − 0.03z₁² − 0.03z₂² + 0.02z₁z₂,
// B = [[−0.03, 0.01], [0.01, −0.03]], b = (0.02, −0.01) → z_s = −½B⁻¹b = (0.25, 0), i.e.
// derived by hand: B⁻¹ = (1/0.0008)·[[−0.03, −0.01], [−0.01, −0.03]], B⁻¹b = (−0.5, 0).
const factors: Factor[] = [
  { key: 'binder', kind: 'continuous', low: 10, high: 40, unit: 'wt %' },
  { key: 'oven', kind: 'continuous', low: 300, high: 360, unit: '°C' },
  { key: 'gdl', kind: 'categorical', levels: ['paper', 'cloth'] },
];
function surface(z1: number, z2: number, gdl: string): number {
  return 0.62 + 0.02 * z1 - 0.01 * z2 - 0.03 * z1 * z1 - 0.03 * z2 * z2 + 0.02 * z1 * z2 + (gdl === 'cloth' ? -0.015 : 0);
}
const rows: Observation[] = [];
let index = 0;
for (const gdl of ['paper', 'cloth']) {
  for (const z1 of [-1, 0, 1]) {
    for (const z2 of [-1, 0, 1]) {
      // a small fixed wobble stands in for build-to-build noise
      const wobble = 0.002 * Math.sin(17 * index++);
      rows.push({ factors: { binder: 25 + 15 * z1, oven: 330 + 30 * z2, gdl }, y: surface(z1, z2, gdl) + wobble });
    }
  }
  rows.push({ factors: { binder: 25, oven: 330, gdl }, y: surface(0, 0, gdl) + 0.0015 });
}
const fit = fitSurface({ factors, rows, model: 'quadratic', responseKey: 'vAtRef' });

function codedDistance(a: Record<string, number | string>, b: Record<string, number | string>): number {
  const d1 = ((a.binder as number) - (b.binder as number)) / 15;
  const d2 = ((a.oven as number) - (b.oven as number)) / 30;
  return Math.sqrt(d1 * d1 + d2 * d2 + (a.gdl === b.gdl ? 0 : 1));
}

describe('proposeBuilds', () => {
  it('exploit: the first proposal is at the predicted maximum', () => {
    const proposals = proposeBuilds({ fit, factors, goal: 'maximize', count: 3, strategy: 'exploit', seed: 11 });
    expect(proposals).toHaveLength(3);
    const best = proposals[0];
    // derived by hand (see above): maximum at z = (0.25, 0) → binder 25 + 15·0.25 = 28.75 wt %, oven 330 °C,
    // on paper (cloth is 0.015 V lower); the wobble moves the fitted optimum slightly
    expect(best.factors.gdl).toBe('paper');
    expect(Math.abs((best.factors.binder as number) - 28.75)).toBeLessThan(1.5);
    expect(Math.abs((best.factors.oven as number) - 330)).toBeLessThan(3);
    // and it agrees with the fitted surface's own stationary point (canonical analysis)
    const stationary = canonicalAnalysis(fit, { levels: { gdl: 'paper' } }).stationaryActual as Record<string, number>;
    expect(Math.abs((best.factors.binder as number) - stationary.binder)).toBeLessThan(0.05);
    expect(Math.abs((best.factors.oven as number) - stationary.oven)).toBeLessThan(0.1);
    expect(best.reasonKind).toBe('best predicted');
    expect(best.reason).toMatch(/^best predicted: highest predicted vAtRef/);
    expect(best.low).toBeLessThan(best.predicted);
    expect(best.high).toBeGreaterThan(best.predicted);
    expect(best.extrapolation).toBe(false);
    // spread: each later proposal at least 0.3 coded units from the earlier ones
    for (let i = 1; i < proposals.length; i++) {
      for (let j = 0; j < i; j++) expect(codedDistance(proposals[i].factors, proposals[j].factors)).toBeGreaterThanOrEqual(0.3 - 1e-12);
    }
  });

  it('minimize and target goals aim the right way', () => {
    const low = proposeBuilds({ fit, factors, goal: 'minimize', count: 1, strategy: 'exploit', seed: 3 })[0];
    const high = proposeBuilds({ fit, factors, goal: 'maximize', count: 1, strategy: 'exploit', seed: 3 })[0];
    expect(low.predicted).toBeLessThan(high.predicted);
    // the minimum of a concave surface sits on the boundary of the box
    const onBoundary = [low.coded.binder, low.coded.oven].some((value) => Math.abs(Math.abs(value as number) - 1) < 1e-9);
    expect(onBoundary).toBe(true);
    const target = proposeBuilds({ fit, factors, goal: { target: 0.6 }, count: 1, strategy: 'exploit', seed: 3 })[0];
    // 0.6 V lies inside the range of the surface, so the closest prediction hits it
    expect(target.predicted).toBeCloseTo(0.6, 4);
    expect(target.reason).toMatch(/closest to the target 0.6/);
  });

  it('explore: picks the least-known recipes, spread out by the D-optimal update', () => {
    const proposals = proposeBuilds({ fit, factors, goal: 'maximize', count: 4, strategy: 'explore', seed: 5 });
    expect(proposals).toHaveLength(4);
    expect(proposals[0].reasonKind).toBe('most informative');
    for (let i = 1; i < proposals.length; i++) {
      for (let j = 0; j < i; j++) expect(codedDistance(proposals[i].factors, proposals[j].factors)).toBeGreaterThanOrEqual(0.3 - 1e-12);
    }
    // a 3×3 grid with centre replicates is least certain at the corners (largest leverage)
    const first = proposals[0].coded;
    expect(Math.abs(first.binder as number)).toBeCloseTo(1, 6);
    expect(Math.abs(first.oven as number)).toBeCloseTo(1, 6);
  });

  it('balance: upper confidence bound, reported with its interval', () => {
    const [proposal] = proposeBuilds({ fit, factors, goal: 'maximize', count: 1, strategy: 'balance', seed: 5 });
    expect(proposal.reasonKind).toBe('balance (upper confidence bound)');
    expect(proposal.reason).toMatch(/standard errors/);
    expect(proposal.high - proposal.low).toBeGreaterThan(0);
  });

  it('respects fixed values and narrower bounds', () => {
    const proposals = proposeBuilds({
      fit,
      factors,
      goal: 'maximize',
      count: 3,
      strategy: 'balance',
      constraints: { fixed: { gdl: 'cloth' }, bounds: { binder: { min: 32, max: 38 }, oven: { max: 320 } } },
      seed: 9,
    });
    for (const proposal of proposals) {
      expect(proposal.factors.gdl).toBe('cloth');
      expect(proposal.factors.binder as number).toBeGreaterThanOrEqual(32);
      expect(proposal.factors.binder as number).toBeLessThanOrEqual(38);
      expect(proposal.factors.oven as number).toBeGreaterThanOrEqual(300);
      expect(proposal.factors.oven as number).toBeLessThanOrEqual(320);
    }
    const fixedTemp = proposeBuilds({ fit, factors, goal: 'maximize', count: 2, strategy: 'exploit', constraints: { fixed: { oven: 345 } }, seed: 9 });
    for (const proposal of fixedTemp) expect(proposal.factors.oven).toBe(345);
  });

  it('holds factors the model does not use and says so', () => {
    const withExtra: Factor[] = [...factors, { key: 'hotPressMin', kind: 'continuous', low: 2, high: 10, unit: 'min' }];
    const [proposal] = proposeBuilds({ fit, factors: withExtra, goal: 'maximize', count: 1, strategy: 'exploit' });
    expect(proposal.factors.hotPressMin).toBe(6);
    expect(proposal.reason).toMatch(/hotPressMin is not in the model and was held at 6/);
  });

  it('is reproducible for a seed', () => {
    const a = proposeBuilds({ fit, factors, goal: 'maximize', count: 3, strategy: 'explore', seed: 21 });
    const b = proposeBuilds({ fit, factors, goal: 'maximize', count: 3, strategy: 'explore', seed: 21 });
    expect(a).toEqual(b);
    // the generator itself: same seed, same stream
    const first = mulberry32(42);
    const second = mulberry32(42);
    for (let i = 0; i < 5; i++) expect(first()).toBe(second());
  });

  it('returns fewer proposals when the allowed region has room for fewer distinct recipes', () => {
    const proposals = proposeBuilds({
      fit,
      factors,
      goal: 'maximize',
      count: 5,
      strategy: 'exploit',
      constraints: { fixed: { binder: 20, oven: 330, gdl: 'paper' } },
    });
    // derived by hand: every factor fixed → exactly one possible recipe
    expect(proposals).toHaveLength(1);
  });

  it('throws on bad goals, counts, strategies and constraints', () => {
    const base = { fit, factors, goal: 'maximize' as const, count: 2, strategy: 'exploit' as const };
    expect(() => proposeBuilds({ ...base, goal: 'best' as never })).toThrow(DoeInputError);
    expect(() => proposeBuilds({ ...base, count: 0 })).toThrow(/count must be a whole number/);
    expect(() => proposeBuilds({ ...base, strategy: 'greedy' as never })).toThrow(/strategy must be/);
    expect(() => proposeBuilds({ ...base, constraints: { fixed: { oven: 400 } } })).toThrow(/outside its bounds/);
    expect(() => proposeBuilds({ ...base, constraints: { fixed: { gdl: 'felt' } } })).toThrow(/not an allowed level/);
    expect(() => proposeBuilds({ ...base, constraints: { bounds: { binder: { min: 50 } } } })).toThrow(/leave nothing to choose from/);
    expect(() => proposeBuilds({ ...base, constraints: { bounds: { ionomer: { min: 0 } } } })).toThrow(/unknown factor "ionomer"/);
    expect(() => proposeBuilds({ ...base, constraints: { bounds: { gdl: { min: 0 } } } })).toThrow(/bounds do not apply/);
  });
});
