// Three-level full factorial 3^k in coded units (−1, 0, +1 on every continuous factor).
import { DesignInputError } from './design-input-error';
import { MAX_DESIGN_RUNS } from './full-factorial-2';
import type { CoreDesign, CorePoint, PointType } from './types';

const LEVELS = [-1, 0, 1];

/**
 * The 3^k full factorial: every combination of the levels −1, 0, +1 over k factors, in
 * standard order (first factor changes fastest, levels in the order −1, 0, +1).
 * Point types: all factors at ±1 → 'factorial', all at 0 → 'centre', mixed → 'level'.
 * With k = 0 it returns one empty point (purely categorical design).
 * Reference: NIST/SEMATECH e-Handbook of Statistical Methods §5.3.3.6 (three-level designs), from memory.
 * Cost: O(k · 3^k).
 * @throws DesignInputError when k is not an integer in 0…7 (3^7 = 2187; 3^8 = 6561 > 4096 runs).
 * @example fullFactorial3(1).points.map(p => p.coded) // [[-1],[0],[1]]
 */
export function fullFactorial3(k: number): CoreDesign {
  if (!Number.isInteger(k) || k < 0) throw new DesignInputError('fullFactorial3', 'factors', `needs a whole number of continuous factors, got ${k}`);
  const runCount = 3 ** k;
  if (runCount > MAX_DESIGN_RUNS) {
    throw new DesignInputError('fullFactorial3', 'factors', `3^${k} = ${runCount} runs is more than ${MAX_DESIGN_RUNS}; use a central composite or Box–Behnken design`);
  }
  const points: CorePoint[] = [];
  for (let run = 0; run < runCount; run++) {
    const coded: number[] = [];
    let remainder = run;
    let zeros = 0;
    for (let factor = 0; factor < k; factor++) {
      const level = LEVELS[remainder % 3] as number;
      remainder = Math.floor(remainder / 3);
      if (level === 0) zeros++;
      coded.push(level);
    }
    let pointType: PointType = 'level';
    if (zeros === 0) pointType = k === 0 ? 'level' : 'factorial';
    else if (zeros === k) pointType = 'centre';
    points.push({ coded, pointType });
  }
  return {
    points,
    info: { notes: [`3^${k} full factorial in standard order (first factor changes fastest; levels -1, 0, +1).`] },
    warnings: [],
  };
}
