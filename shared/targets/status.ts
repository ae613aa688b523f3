// Where a project stands against one target: met (by which build, when) or not yet (the best so
// far and the gap in the target's unit), and the best-to-date series for the progress chart. Pure.
import { conversionFactor } from './target-units';

export type Comparator = '>=' | '<=';
export type Basis = 'catalyst' | 'metal';

export interface TargetSpec {
  comparator: Comparator;
  value: number;
  /** the unit the target is stated in */
  unit: string;
  /** for activities per mass: per gram of catalyst or of metal; null when it does not matter */
  basis?: Basis | null;
}

export interface TargetObservation {
  buildId: number;
  code: string;
  /** YYYY-MM-DD: when the build's value was obtained (tested, else built, else recorded) */
  date: string;
  value: number;
  /** unit of `value` */
  unit: string;
  /** basis of `value` where it has one */
  basis?: Basis | null;
}

export interface TargetPoint {
  buildId: number;
  code: string;
  date: string;
  /** in the target's unit */
  value: number;
}

export interface TargetStatus {
  state: 'met' | 'not-yet' | 'no-data';
  /** the first build (by date) whose value meets the target */
  metBy: TargetPoint | null;
  /** the best value of all comparable builds */
  best: TargetPoint | null;
  /** how far the best is short of the target, in the target's unit (> 0 short, ≤ 0 met); null without data */
  gap: number | null;
  /** best-to-date value after each comparable build, in date order */
  series: (TargetPoint & { best: number; bestCode: string })[];
  /** builds left out and why (another basis, a unit that does not convert) */
  notComparable: { code: string; reason: string }[];
}

/** relative tolerance under which a converted value counts as equal to the target (600 mV vs 0.6 V) */
const TIE = 1e-9;

/** Does `v` meet the target (ties meet)? */
function meets(v: number, target: TargetSpec): boolean {
  const slack = TIE * Math.max(1, Math.abs(target.value));
  return target.comparator === '>=' ? v >= target.value - slack : v <= target.value + slack;
}

function better(a: number, b: number, comparator: Comparator): boolean {
  return comparator === '>=' ? a > b : a < b;
}

/**
 * Target status. Each observation is converted to the target's unit (`conversionFactor`); those
 * on another basis, or in a unit that does not convert, are set aside as not comparable. Met: the
 * earliest build (date, then the order given) whose value is ≥ (or ≤) the target, ties included.
 * Gap: target − best for ≥, best − target for ≤, so a positive gap is what is still missing.
 * Reference: derived by hand (the definition of a one-sided specification limit).
 * Cost: O(n log n) for n observations (the date sort).
 * @throws RangeError when the target value is not finite.
 * @example targetStatus({comparator: '>=', value: 650, unit: 'mV'}, [{buildId: 1, code: 'B-001', date: '2026-03-01', value: 0.612, unit: 'V'}]).gap // ≈ 38
 */
export function targetStatus(target: TargetSpec, observations: readonly TargetObservation[]): TargetStatus {
  if (!Number.isFinite(target.value)) throw new RangeError(`targetStatus: the target value must be a finite number, got ${target.value}`);
  const notComparable: TargetStatus['notComparable'] = [];
  const usable: { point: TargetPoint; order: number }[] = [];
  observations.forEach((o, order) => {
    if (!Number.isFinite(o.value)) return;
    if (target.basis && o.basis && o.basis !== target.basis) {
      notComparable.push({ code: o.code, reason: `per gram of ${o.basis}, the target is per gram of ${target.basis}` });
      return;
    }
    const factor = conversionFactor(o.unit, target.unit);
    if (factor === null) {
      notComparable.push({ code: o.code, reason: `${o.unit} does not convert to ${target.unit}` });
      return;
    }
    usable.push({ point: { buildId: o.buildId, code: o.code, date: o.date, value: o.value * factor }, order });
  });
  usable.sort((a, b) => (a.point.date < b.point.date ? -1 : a.point.date > b.point.date ? 1 : a.order - b.order));

  let best: TargetPoint | null = null;
  let metBy: TargetPoint | null = null;
  const series: TargetStatus['series'] = [];
  for (const { point } of usable) {
    if (!best || better(point.value, best.value, target.comparator)) best = point;
    if (!metBy && meets(point.value, target)) metBy = point;
    series.push({ ...point, best: best.value, bestCode: best.code });
  }
  if (!best) return { state: 'no-data', metBy: null, best: null, gap: null, series, notComparable };
  const rawGap = target.comparator === '>=' ? target.value - best.value : best.value - target.value;
  const gap = Math.abs(rawGap) <= TIE * Math.max(1, Math.abs(target.value)) ? 0 : rawGap;
  return { state: metBy ? 'met' : 'not-yet', metBy, best, gap, series, notComparable };
}
