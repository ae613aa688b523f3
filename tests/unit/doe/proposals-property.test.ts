import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { fitSurface } from '../../../shared/doe/model';
import type { Factor, Observation } from '../../../shared/doe/model';
import { proposeBuilds } from '../../../shared/doe/proposals';

// Random problems: 1–3 continuous factors with random bounds, an optional categorical factor,
// random quadratic data, random fixed values and narrower bounds. Whatever the strategy, every
// proposal must stay inside the bounds and keep the fixed values (the "never violate" rule).

const problem = fc
  .record({
    continuousCount: fc.integer({ min: 1, max: 3 }),
    withCategorical: fc.boolean(),
    lows: fc.array(fc.double({ min: -500, max: 500, noNaN: true }), { minLength: 3, maxLength: 3 }),
    widths: fc.array(fc.double({ min: 0.01, max: 200, noNaN: true }), { minLength: 3, maxLength: 3 }),
    coefficients: fc.array(fc.double({ min: -5, max: 5, noNaN: true }), { minLength: 10, maxLength: 10 }),
    noise: fc.array(fc.double({ min: -0.2, max: 0.2, noNaN: true }), { minLength: 40, maxLength: 40 }),
    points: fc.array(fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 3, maxLength: 3 }), { minLength: 30, maxLength: 30 }),
    fixIndex: fc.integer({ min: -1, max: 3 }),
    fixFraction: fc.double({ min: 0, max: 1, noNaN: true }),
    boundFractions: fc.array(fc.tuple(fc.double({ min: 0, max: 0.5, noNaN: true }), fc.double({ min: 0.5, max: 1, noNaN: true })), { minLength: 3, maxLength: 3 }),
    fixLevel: fc.boolean(),
    strategy: fc.constantFrom('exploit' as const, 'explore' as const, 'balance' as const),
    goal: fc.oneof(fc.constant('maximize' as const), fc.constant('minimize' as const), fc.record({ target: fc.double({ min: -5, max: 5, noNaN: true }) })),
    count: fc.integer({ min: 1, max: 4 }),
    seed: fc.integer({ min: 0, max: 1_000_000 }),
  });

describe('proposeBuilds never violates bounds or constraints (property)', () => {
  it('holds on random problems', () => {
    fc.assert(
      fc.property(problem, (p) => {
        const factors: Factor[] = [];
        for (let f = 0; f < p.continuousCount; f++) {
          factors.push({ key: `x${f}`, kind: 'continuous', low: p.lows[f], high: p.lows[f] + p.widths[f] });
        }
        if (p.withCategorical) factors.push({ key: 'gdl', kind: 'categorical', levels: ['paper', 'cloth', 'felt'] });
        const levels = ['paper', 'cloth', 'felt'];
        const rows: Observation[] = p.points.map((unit, i) => {
          const values: Record<string, number | string> = {};
          let y = p.coefficients[0] + p.noise[i];
          for (let f = 0; f < p.continuousCount; f++) {
            values[`x${f}`] = p.lows[f] + unit[f] * p.widths[f];
            const z = 2 * unit[f] - 1;
            y += p.coefficients[1 + f] * z + p.coefficients[4 + f] * z * z;
          }
          if (p.continuousCount > 1) y += p.coefficients[7] * (2 * unit[0] - 1) * (2 * unit[1] - 1);
          if (p.withCategorical) {
            values.gdl = levels[i % 3];
            y += (i % 3) * p.coefficients[8];
          }
          return { factors: values, y };
        });
        const fit = fitSurface({ factors, rows, model: 'quadratic' });

        const fixed: Record<string, number | string> = {};
        const bounds: Record<string, { min?: number; max?: number }> = {};
        const allowed: Record<string, [number, number]> = {};
        for (let f = 0; f < p.continuousCount; f++) {
          const low = p.lows[f];
          const width = p.widths[f];
          const [a, b] = p.boundFractions[f];
          const min = low + a * width;
          const max = low + b * width;
          bounds[`x${f}`] = { min, max };
          allowed[`x${f}`] = [min, max];
          if (p.fixIndex === f) fixed[`x${f}`] = min + p.fixFraction * (max - min);
        }
        if (p.withCategorical && p.fixLevel) fixed.gdl = 'cloth';

        const proposals = proposeBuilds({ fit, factors, goal: p.goal, count: p.count, strategy: p.strategy, constraints: { fixed, bounds }, seed: p.seed });
        expect(proposals.length).toBeGreaterThanOrEqual(1);
        expect(proposals.length).toBeLessThanOrEqual(p.count);
        for (const proposal of proposals) {
          for (let f = 0; f < p.continuousCount; f++) {
            const key = `x${f}`;
            const value = proposal.factors[key] as number;
            expect(Number.isFinite(value)).toBe(true);
            if (fixed[key] !== undefined) expect(value).toBe(fixed[key]);
            expect(value).toBeGreaterThanOrEqual(allowed[key][0]);
            expect(value).toBeLessThanOrEqual(allowed[key][1]);
          }
          if (p.withCategorical) {
            expect(levels).toContain(proposal.factors.gdl);
            if (p.fixLevel) expect(proposal.factors.gdl).toBe('cloth');
          }
          expect(proposal.low).toBeLessThanOrEqual(proposal.predicted);
          expect(proposal.high).toBeGreaterThanOrEqual(proposal.predicted);
        }
      }),
      { numRuns: 50, seed: 20240601 },
    );
  });
});
