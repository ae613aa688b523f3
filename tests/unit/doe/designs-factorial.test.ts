import { describe, it, expect } from 'vitest';
import { generateDesign, DesignInputError } from '../../../shared/doe/designs';
import type { Design, DesignFactor } from '../../../shared/doe/designs';

// Invented recipe factors for a PGM-free cathode campaign.
const binder: DesignFactor = { key: 'binderWt', kind: 'continuous', low: 10, high: 30 }; // wt %
const anneal: DesignFactor = { key: 'annealC', kind: 'continuous', low: 900, high: 1050 }; // °C
const loading: DesignFactor = { key: 'loadingMgCm2', kind: 'continuous', low: 2, high: 4 }; // mg/cm²
const hold: DesignFactor = { key: 'holdH', kind: 'continuous', low: 0.5, high: 2.5 }; // hours
const pressing: DesignFactor = { key: 'pressKN', kind: 'continuous', low: 5, high: 15 };

function codedColumns(design: Design, keys: string[]): number[][] {
  const rows = design.runs.slice().sort((a, b) => a.standardOrder - b.standardOrder);
  return keys.map((key) => rows.map((run) => run.coded[key] as number));
}

function dot(first: number[], second: number[]): number {
  let sum = 0;
  for (let index = 0; index < first.length; index++) sum += (first[index] as number) * (second[index] as number);
  return sum;
}

describe('two-level full factorial 2^k', () => {
  it('lists the 2^3 in Yates standard order', () => {
    const design = generateDesign({ kind: 'full-factorial-2', factors: [binder, anneal, loading], seed: 1, randomize: false });
    const rows = design.runs.map((run) => [run.coded.binderWt, run.coded.annealC, run.coded.loadingMgCm2]);
    // NIST/SEMATECH e-Handbook §5.3.3.3 (2^3 full factorial in standard order): (1), a, b, ab, c, ac, bc, abc
    expect(rows).toEqual([
      [-1, -1, -1],
      [1, -1, -1],
      [-1, 1, -1],
      [1, 1, -1],
      [-1, -1, 1],
      [1, -1, 1],
      [-1, 1, 1],
      [1, 1, 1],
    ]);
    expect(design.runs.map((run) => run.standardOrder)).toEqual([1, 2, 3, 4, 5, 6, 7, 8]); // derived by hand: randomize false keeps standard order
    expect(design.info.runsByType).toEqual({ factorial: 8 }); // derived by hand: 2^3 = 8
    expect(design.info.factorLetters).toEqual({ A: 'binderWt', B: 'annealC', C: 'loadingMgCm2' });
  });

  it('is balanced and orthogonal: column sums 0, dot products 0, including interactions', () => {
    for (const factors of [[binder, anneal], [binder, anneal, loading], [binder, anneal, loading, hold, pressing]]) {
      const design = generateDesign({ kind: 'full-factorial-2', factors, seed: 5 });
      const keys = factors.map((factor) => factor.key);
      const columns = codedColumns(design, keys);
      expect(design.runs.length).toBe(2 ** factors.length); // derived by hand: 2^k runs
      for (let first = 0; first < columns.length; first++) {
        // derived by hand: each column has 2^(k−1) runs at −1 and 2^(k−1) at +1, so its sum is 0 and Σx² = 2^k
        expect(dot(columns[first] as number[], new Array(design.runs.length).fill(1))).toBe(0);
        expect(dot(columns[first] as number[], columns[first] as number[])).toBe(2 ** factors.length);
        for (let second = first + 1; second < columns.length; second++) {
          // derived by hand: every (±1, ±1) pair occurs 2^(k−2) times, so the products cancel
          expect(dot(columns[first] as number[], columns[second] as number[])).toBe(0);
          const interaction = (columns[first] as number[]).map((value, index) => value * ((columns[second] as number[])[index] as number));
          for (let third = 0; third < columns.length; third++) expect(dot(interaction, columns[third] as number[])).toBe(0); // derived by hand: x_i·x_j·x_l sums to 0 over the full factorial
        }
      }
    }
  });

  it('maps coded units to actual settings: actual = centre + coded · halfRange', () => {
    const design = generateDesign({ kind: 'full-factorial-2', factors: [binder, hold], centerPoints: 2, seed: 3, randomize: false });
    expect(design.runs[0]?.actual).toEqual({ binderWt: 10, holdH: 0.5 }); // derived by hand: coded −1 → low
    expect(design.runs[3]?.actual).toEqual({ binderWt: 30, holdH: 2.5 }); // derived by hand: coded +1 → high
    expect(design.runs[4]?.actual).toEqual({ binderWt: 20, holdH: 1.5 }); // derived by hand: centre (10+30)/2, (0.5+2.5)/2
    expect(design.runs[4]?.pointType).toBe('centre');
    expect(design.info.runsByType).toEqual({ factorial: 4, centre: 2 }); // derived by hand: 2^2 + 2 centre points
  });

  it('refuses more than 4096 runs', () => {
    const factors: DesignFactor[] = [];
    for (let index = 0; index < 13; index++) factors.push({ key: `f${index}`, kind: 'continuous', low: 0, high: 1 });
    // derived by hand: 2^13 = 8192 > 4096
    expect(() => generateDesign({ kind: 'full-factorial-2', factors })).toThrow(DesignInputError);
    expect(() => generateDesign({ kind: 'full-factorial-2', factors })).toThrow('fullFactorial2: factors: 2^13 = 8192 runs is more than 4096');
  });
});

describe('three-level full factorial 3^k', () => {
  it('has 3^k runs with every level equally often and orthogonal linear columns', () => {
    const design = generateDesign({ kind: 'full-factorial-3', factors: [binder, anneal, loading], seed: 8 });
    expect(design.runs.length).toBe(27); // derived by hand: 3^3 = 27
    const columns = codedColumns(design, ['binderWt', 'annealC', 'loadingMgCm2']);
    for (const column of columns) {
      for (const level of [-1, 0, 1]) expect(column.filter((value) => value === level).length).toBe(9); // derived by hand: 27 / 3 = 9 per level
    }
    expect(dot(columns[0] as number[], columns[1] as number[])).toBe(0); // derived by hand: balanced grid, products cancel
    expect(design.info.runsByType).toEqual({ factorial: 8, centre: 1, level: 18 }); // derived by hand: 2^3 corners, 1 centre, 27 − 9 others
  });

  it('lists 3^2 in standard order, first factor fastest', () => {
    const design = generateDesign({ kind: 'full-factorial-3', factors: [binder, anneal], seed: 8, randomize: false });
    // derived by hand: levels −1, 0, +1 with the first factor changing fastest
    expect(design.runs.map((run) => [run.coded.binderWt, run.coded.annealC])).toEqual([
      [-1, -1],
      [0, -1],
      [1, -1],
      [-1, 0],
      [0, 0],
      [1, 0],
      [-1, 1],
      [0, 1],
      [1, 1],
    ]);
  });

  it('refuses 3^8 runs', () => {
    const factors: DesignFactor[] = [];
    for (let index = 0; index < 8; index++) factors.push({ key: `f${index}`, kind: 'continuous', low: 0, high: 1 });
    // derived by hand: 3^8 = 6561 > 4096
    expect(() => generateDesign({ kind: 'full-factorial-3', factors })).toThrow('fullFactorial3: factors: 3^8 = 6561 runs is more than 4096');
  });
});
