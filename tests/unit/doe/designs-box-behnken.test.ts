import { describe, it, expect } from 'vitest';
import { SingularValueDecomposition } from 'ml-matrix';
import { generateDesign } from '../../../shared/doe/designs';
import type { Design, DesignFactor } from '../../../shared/doe/designs';

function factors(count: number): DesignFactor[] {
  // Invented recipe factors; ranges are made up.
  const list: DesignFactor[] = [];
  for (let index = 0; index < count; index++) list.push({ key: `step${index + 1}`, kind: 'continuous', low: 10 * index, high: 10 * index + 4 });
  return list;
}

function rows(design: Design): number[][] {
  return design.runs.map((run) => design.factorKeys.map((key) => run.coded[key] as number));
}

/** Full quadratic model matrix: 1, x_i, x_i·x_j, x_i². */
function quadraticModelRank(design: Design): { rank: number; terms: number } {
  const k = design.factorKeys.length;
  const matrix = rows(design).map((x) => {
    const row = [1, ...x];
    for (let first = 0; first < k; first++) for (let second = first + 1; second < k; second++) row.push((x[first] as number) * (x[second] as number));
    for (let factor = 0; factor < k; factor++) row.push((x[factor] as number) ** 2);
    return row;
  });
  const terms = (matrix[0] as number[]).length;
  return { rank: new SingularValueDecomposition(matrix).rank, terms };
}

describe('Box–Behnken design', () => {
  it('three factors: 12 edge runs + centre points, every edge run has exactly one 0', () => {
    const design = generateDesign({ kind: 'box-behnken', factors: factors(3), centerPoints: 3, seed: 21 });
    // NIST/SEMATECH e-Handbook §5.3.3.6.2: the 3-factor Box–Behnken design has 12 edge runs plus centre points
    expect(design.info.runsByType).toEqual({ edge: 12, centre: 3 });
    expect(design.runs.length).toBe(15); // derived by hand: 12 + 3
    for (const run of design.runs.filter((item) => item.pointType === 'edge')) {
      const values = design.factorKeys.map((key) => run.coded[key] as number);
      expect(values.filter((value) => value === 0).length).toBe(1); // NIST §5.3.3.6.2: edge midpoints, one factor at its centre
      expect(values.filter((value) => Math.abs(value) === 1).length).toBe(2);
    }
    const distinct = new Set(design.runs.filter((item) => item.pointType === 'edge').map((run) => design.factorKeys.map((key) => run.coded[key]).join(',')));
    expect(distinct.size).toBe(12); // derived by hand: the 12 edge midpoints of the cube are all different
  });

  it('has the usual run counts for 4 to 7 factors', () => {
    // derived by hand: k = 4, 5 → C(k,2)·4 = 24, 40; k = 6, 7 → (6 or 7 groups of three)·2³ = 48, 56 (from memory: the usual Box–Behnken sizes)
    const expected: Record<number, number> = { 4: 24, 5: 40, 6: 48, 7: 56 };
    for (const k of [4, 5, 6, 7]) {
      const design = generateDesign({ kind: 'box-behnken', factors: factors(k), centerPoints: 1, seed: 2 });
      expect(design.info.runsByType.edge).toBe(expected[k]);
    }
  });

  it('is balanced: every factor at −1, 0, +1 symmetrically, and never on a corner', () => {
    for (const k of [3, 4, 5, 6, 7]) {
      const design = generateDesign({ kind: 'box-behnken', factors: factors(k), centerPoints: 0, seed: 2 });
      const matrix = rows(design);
      for (let factor = 0; factor < k; factor++) {
        const column = matrix.map((row) => row[factor] as number);
        // derived by hand: each factor's ±1 values come from full 2² / 2³ factorials, so as many −1 as +1, and the same count for every factor
        expect(column.filter((value) => value === 1).length).toBe(column.filter((value) => value === -1).length);
        expect(column.filter((value) => value !== 0).length).toBe(matrix.map((row) => row[0] as number).filter((value) => value !== 0).length);
      }
      for (const row of matrix) expect(row.filter((value) => value === 0).length).toBeGreaterThan(0); // derived by hand: no run has all factors at ±1
    }
  });

  it('puts every pair of factors together (7 factors: exactly once per group, a BIBD)', () => {
    for (const k of [6, 7]) {
      const design = generateDesign({ kind: 'box-behnken', factors: factors(k), centerPoints: 0, seed: 2 });
      const together = new Map<string, number>();
      for (const row of rows(design)) {
        for (let first = 0; first < k; first++) {
          for (let second = first + 1; second < k; second++) {
            if (row[first] !== 0 && row[second] !== 0) together.set(`${first}-${second}`, (together.get(`${first}-${second}`) ?? 0) + 1);
          }
        }
      }
      expect(together.size).toBe((k * (k - 1)) / 2); // derived by hand: every one of the C(k,2) pairs appears
      // derived by hand: a pair inside one group of three shows up in that group's 2³ = 8 runs; k = 7 has λ = 1 (Fano plane)
      if (k === 7) for (const count of together.values()) expect(count).toBe(8);
    }
  });

  it('estimates the full quadratic model with centre points, and not without', () => {
    for (const k of [3, 4, 5, 6, 7]) {
      const withCentre = quadraticModelRank(generateDesign({ kind: 'box-behnken', factors: factors(k), centerPoints: 3, seed: 2 }));
      expect(withCentre.rank).toBe(withCentre.terms); // derived by hand: 1 + k + k(k−1)/2 + k terms, all estimable
      const withoutCentre = generateDesign({ kind: 'box-behnken', factors: factors(k), centerPoints: 0, seed: 2 });
      // derived by hand: Σx_i² is the same on every edge run, so it duplicates the intercept → rank one short
      expect(quadraticModelRank(withoutCentre).rank).toBe(withCentre.terms - 1);
      expect(withoutCentre.warnings.some((warning) => warning.startsWith('No centre points'))).toBe(true);
    }
  });

  it('throws outside 3 to 7 factors', () => {
    expect(() => generateDesign({ kind: 'box-behnken', factors: factors(2) })).toThrow('generateDesign: factors: a Box–Behnken design needs 3 to 7 continuous factors, got 2');
    expect(() => generateDesign({ kind: 'box-behnken', factors: factors(8) })).toThrow('needs 3 to 7 continuous factors, got 8');
  });
});
