import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkSupport, fitSurface, type Factor, type Observation } from '../../../shared/doe/model';
import { proposeBuilds } from '../../../shared/doe/proposals';
import { reversibleCellVoltage } from '../../../shared/doe/limits';

// Random noise-free quadratic voltages over cell temperature (150–200 °C), a binder fraction and
// sometimes a GDL choice, the builds covering a random part of the ranges. The invented surfaces
// often rise past the reversible voltage, so the physical limit is exercised. Whatever the
// strategy: a proposal outside the trust region is labelled exploratory, and no reported
// prediction or interval end exceeds E_rev at the proposal's cell temperature
// (Larminie & Dicks Table 2.2 through reversibleCellVoltage).
const problem = fc.record({
  withGdl: fc.boolean(),
  coefficients: fc.array(fc.double({ min: -0.3, max: 0.3, noNaN: true }), { minLength: 7, maxLength: 7 }),
  base: fc.double({ min: 0.5, max: 1.25, noNaN: true }),
  span: fc.array(fc.tuple(fc.double({ min: 0, max: 0.4, noNaN: true }), fc.double({ min: 0.6, max: 1, noNaN: true })), { minLength: 2, maxLength: 2 }),
  points: fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true })), { minLength: 14, maxLength: 14 }),
  strategy: fc.constantFrom('exploit' as const, 'explore' as const, 'balance' as const),
  goal: fc.constantFrom('maximize' as const, 'minimize' as const),
  count: fc.integer({ min: 1, max: 3 }),
  exploratory: fc.integer({ min: 0, max: 2 }),
  seed: fc.integer({ min: 0, max: 1_000_000 }),
});

describe('proposals stay inside the trust region unless labelled, and below E_rev (property)', () => {
  it('holds on random noise-free quadratic data', () => {
    fc.assert(
      fc.property(problem, (p) => {
        const factors: Factor[] = [
          { key: 'cellTemp', label: 'Cell temperature', unit: '°C', kind: 'continuous', low: 150, high: 200 },
          { key: 'binder', label: 'PTFE binder', unit: 'wt %', kind: 'continuous', low: 10, high: 40 },
        ];
        if (p.withGdl) factors.push({ key: 'gdl', label: 'GDL', kind: 'categorical', levels: ['paper', 'cloth'] });
        const rows: Observation[] = p.points.map(([u, v], i) => {
          const a = p.span[0]![0] + u * (p.span[0]![1] - p.span[0]![0]);
          const b = p.span[1]![0] + v * (p.span[1]![1] - p.span[1]![0]);
          const z1 = 2 * a - 1;
          const z2 = 2 * b - 1;
          const c = p.coefficients;
          let y = p.base + c[0]! * z1 + c[1]! * z2 + c[2]! * z1 * z2 + c[3]! * z1 * z1 + c[4]! * z2 * z2;
          const values: Record<string, number | string> = { cellTemp: 150 + 50 * a, binder: 10 + 30 * b };
          if (p.withGdl) {
            values.gdl = i % 2 ? 'cloth' : 'paper';
            if (i % 2) y += c[5]!;
          }
          return { factors: values, y };
        });
        const fit = fitSurface({ factors, rows, model: 'quadratic', responseKey: 'vAtRef' });
        const proposals = proposeBuilds({ fit, factors, goal: p.goal, count: p.count, exploratory: p.exploratory, strategy: p.strategy, seed: p.seed, limits: { response: 'vAtRef', cellTemperatureFactor: 'cellTemp' } });
        expect(proposals.length).toBeGreaterThanOrEqual(1);
        for (const proposal of proposals) {
          const inside = checkSupport(fit, proposal.factors).inside;
          if (!inside) {
            expect(proposal.kind).toBe('exploratory');
            expect(proposal.flagged).toBe(true);
          }
          if (proposal.kind === 'supported') expect(inside).toBe(true);
          const ceiling = reversibleCellVoltage(proposal.factors.cellTemp as number);
          expect(proposal.predicted).toBeLessThanOrEqual(ceiling);
          expect(proposal.high).toBeLessThanOrEqual(ceiling);
          if (proposal.modelPredicted >= ceiling) {
            expect(proposal.limit.hitsLimit).toBe(true);
            expect(proposal.flagged).toBe(true);
          }
        }
      }),
      { numRuns: 60, seed: 20261124 },
    );
  });
});
