// Two-level full factorial 2^k in coded units, in standard (Yates) order.
import { DesignInputError } from './design-input-error';
import type { CoreDesign, CorePoint } from './types';

/** Largest design any generator returns (runs), to keep plans and the browser responsive. */
export const MAX_DESIGN_RUNS = 4096;

/**
 * The 2^k full factorial: every combination of −1/+1 over k factors, in Yates order
 * (the first factor alternates fastest: run r, factor j is +1 when bit j of r is set).
 * With k = 0 it returns one empty point (a purely categorical design is then the level grid).
 * Reference: NIST/SEMATECH e-Handbook of Statistical Methods §5.3.3.3 (full factorial designs, standard order).
 * Cost: O(k · 2^k).
 * @throws DesignInputError when k is not an integer in 0…12 (2^12 = 4096 runs at most).
 * @example fullFactorial2(2).points.map(p => p.coded) // [[-1,-1],[1,-1],[-1,1],[1,1]]
 */
export function fullFactorial2(k: number): CoreDesign {
  if (!Number.isInteger(k) || k < 0) throw new DesignInputError('fullFactorial2', 'factors', `needs a whole number of continuous factors, got ${k}`);
  const runCount = 2 ** k;
  if (runCount > MAX_DESIGN_RUNS) {
    throw new DesignInputError('fullFactorial2', 'factors', `2^${k} = ${runCount} runs is more than ${MAX_DESIGN_RUNS}; use a fractional factorial`);
  }
  const points: CorePoint[] = [];
  const factorialPointIndices: number[] = [];
  for (let run = 0; run < runCount; run++) {
    const coded: number[] = [];
    for (let factor = 0; factor < k; factor++) coded.push((run >>> factor) & 1 ? 1 : -1);
    points.push({ coded, pointType: k === 0 ? 'level' : 'factorial' });
    factorialPointIndices.push(run);
  }
  const design: CoreDesign = {
    points,
    info: { notes: [`2^${k} full factorial in Yates standard order (first factor alternates fastest).`] },
    warnings: [],
  };
  if (k > 0) design.twoLevel = { baseMask: runCount - 1, definingWords: [], factorialPointIndices };
  return design;
}
