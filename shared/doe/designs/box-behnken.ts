// Box–Behnken design in coded units: three-level runs that never sit on a corner of the cube,
// built by putting small two-level factorials on chosen groups of factors while the rest sit
// at their centre. Centre points are added by the finishing step.
import { DesignInputError } from './design-input-error';
import type { CoreDesign, CorePoint } from './types';

/**
 * Factor groups (0-based) that carry the ±1 factorial for k = 6 and 7.
 * k = 6: six groups of three, each factor in three groups and every pair of factors together
 * at least once (a partially balanced incomplete block design) → 6 · 2³ = 48 runs.
 * k = 7: the seven lines of the Fano plane {0,1,3} + i mod 7, a balanced incomplete block
 * design (7, 3, 1): every pair of factors together exactly once → 7 · 2³ = 56 runs.
 * Source: from memory (the usual 6- and 7-factor Box–Behnken layouts); the balance and the
 * estimability of the full quadratic model are checked in tests/unit/doe/designs-box-behnken.test.ts.
 */
const BLOCK_GROUPS: Readonly<Record<number, readonly (readonly number[])[]>> = {
  6: [
    [0, 1, 3],
    [1, 2, 4],
    [2, 3, 5],
    [0, 3, 4],
    [1, 4, 5],
    [0, 2, 5],
  ],
  7: [
    [0, 1, 3],
    [1, 2, 4],
    [2, 3, 5],
    [3, 4, 6],
    [0, 4, 5],
    [1, 5, 6],
    [0, 2, 6],
  ],
};

function pairGroups(k: number): number[][] {
  const groups: number[][] = [];
  for (let first = 0; first < k; first++) {
    for (let second = first + 1; second < k; second++) groups.push([first, second]);
  }
  return groups;
}

/**
 * The Box–Behnken design for k = 3…7 continuous factors.
 * k = 3, 4, 5: every pair of factors runs through the 2² factorial (±1, ±1) with the other
 * factors at 0 → 12, 24, 40 edge runs. k = 6, 7: groups of three factors from an incomplete
 * block design run through the 2³ factorial → 48, 56 runs. Group order as listed; within a
 * group, the first factor alternates fastest.
 * Reference: NIST/SEMATECH e-Handbook of Statistical Methods §5.3.3.6.2 (3 factors: 12 edge runs +
 * centre points); Box & Behnken (1960), Technometrics 2, 455–475 (from memory).
 * Cost: O(k · runs).
 * centerPoints is only used to warn when there are none.
 * @throws DesignInputError when k is not an integer from 3 to 7.
 * @example boxBehnken(3, 3).points.length // 12 (the 3 centre points are added when the design is finished)
 */
export function boxBehnken(k: number, centerPoints = 0): CoreDesign {
  if (!Number.isInteger(k) || k < 3 || k > 7) {
    throw new DesignInputError('boxBehnken', 'factors', `a Box–Behnken design needs 3 to 7 continuous factors, got ${k}`);
  }
  const groups = k <= 5 ? pairGroups(k) : (BLOCK_GROUPS[k] as readonly (readonly number[])[]);
  const points: CorePoint[] = [];
  for (const group of groups) {
    const cornerCount = 2 ** group.length;
    for (let corner = 0; corner < cornerCount; corner++) {
      const coded = new Array<number>(k).fill(0);
      for (let position = 0; position < group.length; position++) {
        coded[group[position] as number] = (corner >>> position) & 1 ? 1 : -1;
      }
      points.push({ coded, pointType: 'edge' });
    }
  }
  const warnings: string[] = [];
  // Every edge run has the same number of non-zero coordinates, so Σx_i² is constant over
  // them: without centre points that sum duplicates the intercept and the quadratic model is singular.
  if (centerPoints === 0) {
    warnings.push('No centre points: a Box–Behnken design needs at least one (3–5 is common practice), otherwise the pure quadratic terms cannot be estimated.');
  }
  const construction =
    k <= 5
      ? `every pair of the ${k} factors at (±1, ±1), the others at 0`
      : `groups of three factors from an incomplete block design (${groups.length} groups) at (±1, ±1, ±1), the others at 0`;
  return {
    points,
    info: { notes: [`Box–Behnken design for ${k} factors: ${points.length} runs, ${construction}.`] },
    warnings,
  };
}
