import { describe, it, expect } from 'vitest';
import { compareLots, type LotValue } from '../../../shared/lots';

// Invented V at j_ref (V): lot 1 a small batch, lot 2 its scale-up; recipe R1 made from both,
// R2 only from the small batch (left out of the comparison).
const values: LotValue[] = [
  ...[0.612, 0.605, 0.618, 0.609].map((value) => ({ lotId: 1, recipe: 'R1', value })),
  ...[0.598, 0.603, 0.59].map((value) => ({ lotId: 2, recipe: 'R1', value })),
  { lotId: 1, recipe: 'R2', value: 0.64 },
  { lotId: 3, recipe: 'R1', value: 0.5 },
];

describe('compareLots', () => {
  const c = compareLots(1, 2, values);

  it('means, SDs and n over matched recipes only (scipy, tests/reference/lot_welch.py)', () => {
    expect(c.matchedRecipes).toEqual(['R1']);
    expect(c.unmatched).toBe(1); // derived by hand: the R2 build
    expect(c.a.n).toBe(4);
    expect(c.b.n).toBe(3);
    expect(c.a.mean).toBeCloseTo(0.611, 12); // scipy reference: 0.611
    expect(c.a.sd).toBeCloseTo(0.00547722557505167, 12); // scipy reference (ddof=1)
    expect(c.b.mean).toBeCloseTo(0.597, 12); // scipy reference
    expect(c.b.sd).toBeCloseTo(0.00655743852430201, 12); // scipy reference (ddof=1)
  });

  it('Welch 95 % interval of scale-up − small batch (scipy, tests/reference/lot_welch.py)', () => {
    expect(c.welch!.diff).toBeCloseTo(-0.014, 12); // scipy reference
    expect(c.welch!.se).toBeCloseTo(0.00467261525629207, 12); // scipy reference
    expect(c.welch!.df).toBeCloseTo(3.92430825520238, 9); // scipy reference (Welch–Satterthwaite)
    expect(c.welch!.low).toBeCloseTo(-0.027072542766319, 6); // scipy reference: stats.t.ppf(0.975, df)
    expect(c.welch!.high).toBeCloseTo(-0.000927457233680994, 6); // scipy reference
    expect(c.byRecipe[0].welch!.diff).toBeCloseTo(-0.014, 12); // one matched recipe: same as overall
  });

  it('no interval when a side has fewer than 2 values; same lot twice is refused', () => {
    const thin = compareLots(1, 2, [{ lotId: 1, recipe: 'R', value: 1 }, { lotId: 1, recipe: 'R', value: 2 }, { lotId: 2, recipe: 'R', value: 3 }]);
    expect(thin.welch).toBeNull();
    expect(thin.b).toEqual({ n: 1, mean: 3, sd: null });
    expect(compareLots(1, 2, []).a).toEqual({ n: 0, mean: null, sd: null });
    expect(() => compareLots(1, 1, values)).toThrow(RangeError);
  });
});
