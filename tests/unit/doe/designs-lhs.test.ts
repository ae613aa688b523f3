import { describe, it, expect } from 'vitest';
import { generateDesign, minPairwiseDistance } from '../../../shared/doe/designs';
import type { Design, DesignFactor } from '../../../shared/doe/designs';

// Invented screening factors for an HT-PEM cathode: ionomer/binder wt %, PTFE wt %, loading mg/cm².
const factors: DesignFactor[] = [
  { key: 'binderWt', kind: 'continuous', low: 5, high: 35 },
  { key: 'ptfeWt', kind: 'continuous', low: 10, high: 40 },
  { key: 'loadingMgCm2', kind: 'continuous', low: 0.3, high: 1.5 },
];

function points(design: Design): number[][] {
  return design.runs
    .slice()
    .sort((a, b) => a.standardOrder - b.standardOrder)
    .map((run) => design.factorKeys.map((key) => run.coded[key] as number));
}

describe('Latin hypercube', () => {
  it('puts exactly one point in each of the n strata of every factor', () => {
    for (const runs of [2, 7, 25]) {
      const design = generateDesign({ kind: 'latin-hypercube', factors, runs, seed: 17 });
      expect(design.runs.length).toBe(runs);
      expect(design.info.runsByType).toEqual({ lhs: runs });
      for (let factor = 0; factor < factors.length; factor++) {
        const strata = points(design).map((point) => Math.floor((((point[factor] as number) + 1) / 2) * runs));
        // McKay, Beckman & Conover (1979), definition of a Latin hypercube sample: strata 0…n−1 each used once
        expect(strata.slice().sort((a, b) => a - b)).toEqual(Array.from({ length: runs }, (_, index) => index));
        for (const point of points(design)) {
          expect(point[factor]).toBeGreaterThanOrEqual(-1);
          expect(point[factor]).toBeLessThan(1);
        }
      }
    }
  });

  it('gives the same design for the same seed and a different one for another seed', () => {
    const first = generateDesign({ kind: 'latin-hypercube', factors, runs: 12, seed: 404 });
    const again = generateDesign({ kind: 'latin-hypercube', factors, runs: 12, seed: 404 });
    const other = generateDesign({ kind: 'latin-hypercube', factors, runs: 12, seed: 405 });
    expect(again.runs).toEqual(first.runs);
    expect(points(other)).not.toEqual(points(first));
    expect(first.info.seed).toBe(404);
  });

  it('maximin spreads the points out at least as well as the plain draw with the same seed', () => {
    const plain = generateDesign({ kind: 'latin-hypercube', factors, runs: 15, seed: 8 });
    const spread = generateDesign({ kind: 'latin-hypercube', factors, runs: 15, seed: 8, maximin: true, iterations: 40 });
    expect(spread.info.maximin).toBe(true);
    expect(spread.info.iterations).toBe(40);
    // derived by hand: the maximin search starts from the same first draw and only keeps improvements
    expect(spread.info.minPairwiseDistance as number).toBeGreaterThanOrEqual(plain.info.minPairwiseDistance as number);
    expect(spread.info.minPairwiseDistance).toBeCloseTo(minPairwiseDistance(points(spread)), 12);
    // the search keeps the Latin property
    for (let factor = 0; factor < factors.length; factor++) {
      const strata = points(spread).map((point) => Math.floor((((point[factor] as number) + 1) / 2) * 15));
      expect(new Set(strata).size).toBe(15); // derived by hand: 15 distinct strata
    }
  });

  it('measures the smallest pairwise distance', () => {
    expect(minPairwiseDistance([[0, 0], [3, 4], [10, 0]])).toBe(5); // derived by hand: the 3-4-5 triangle; other gaps are √65 and 10
    expect(minPairwiseDistance([[1, 1]])).toBe(Number.POSITIVE_INFINITY); // derived by hand: no pair
  });

  it('throws without runs and for bad runs or iterations', () => {
    expect(() => generateDesign({ kind: 'latin-hypercube', factors })).toThrow('generateDesign: runs: is required for a Latin hypercube (the number of points)');
    expect(() => generateDesign({ kind: 'latin-hypercube', factors, runs: 1 })).toThrow('generateDesign: runs: must be a whole number from 2 to 4096, got 1');
    expect(() => generateDesign({ kind: 'latin-hypercube', factors, runs: 5000 })).toThrow('from 2 to 4096');
    expect(() => generateDesign({ kind: 'latin-hypercube', factors, runs: 10, maximin: true, iterations: 0 })).toThrow('generateDesign: iterations: must be a whole number from 1 to 10000, got 0');
    expect(() => generateDesign({ kind: 'latin-hypercube', factors: [{ key: 'gdl', kind: 'categorical', levels: ['a', 'b'] }], runs: 5 })).toThrow(
      'generateDesign: factors: a Latin hypercube needs at least 1 continuous factor, got 0',
    );
  });
});
