// Survival-style comparison of builds in accelerated tests: how many reached N hours, and the
// Kaplan–Meier estimate with logs that ended without failure counted as censored.
import { normalQuantile } from '../stats/distributions';

/** One build's accelerated test: failed at `hours` (onset found) or still running when its log ended. */
export interface SurvivalUnit {
  buildId: number;
  /** hours to the onset of rapid failure, or the length of the log when there was none */
  hours: number;
  /** true: failure (onset) at `hours`; false: censored (log ended at `hours` without failure) */
  failed: boolean;
}

export interface SurvivalStep {
  /** a failure time, h */
  hours: number;
  /** units still under test just before this time (failed or censored at it included) */
  atRisk: number;
  failures: number;
  /** units censored at exactly this time (counted at risk here, gone after) */
  censoredHere: number;
  /** Kaplan–Meier survival just after this time */
  survival: number;
  /** Greenwood standard error of the survival */
  standardError: number;
  /** interval on the log(−log) scale; null when survival is 0 or 1 */
  low: number | null;
  high: number | null;
}

export interface SurvivalCurve {
  steps: SurvivalStep[];
  units: number;
  failures: number;
  censored: number;
  /** first time the survival falls to 0.5 or below, or null when it never does */
  medianHours: number | null;
  confidence: number;
  method: string;
}

export interface SurvivalAt {
  hours: number;
  /** units whose log reached `hours` without failing before it */
  reached: number;
  /** units that failed before `hours` */
  failedBefore: number;
  /** units whose log ended before `hours` without failure: unknown, left out of `reached` */
  censoredBefore: number;
  units: number;
  /** Kaplan–Meier survival at `hours` with its interval */
  survival: number;
  low: number | null;
  high: number | null;
  /** e.g. "3 of 5 builds reached 1000 h (1 failed before, 1 log ended before)" */
  summary: string;
}

function checkUnits(units: readonly SurvivalUnit[], caller: string): void {
  if (!Array.isArray(units) || units.length === 0) throw new RangeError(`${caller}: units must be a non-empty array of builds`);
  units.forEach((unit, index) => {
    if (unit === null || typeof unit !== 'object') throw new RangeError(`${caller}: unit ${index} must be an object`);
    if (!(Number.isFinite(unit.hours) && unit.hours >= 0)) throw new RangeError(`${caller}: unit ${index} (build ${unit.buildId}): hours must be a number ≥ 0, got ${unit.hours}`);
    if (typeof unit.failed !== 'boolean') throw new RangeError(`${caller}: unit ${index} (build ${unit.buildId}): failed must be true or false`);
  });
}

/**
 * Kaplan–Meier survival of builds in accelerated tests.
 * Definition: at each failure time tᵢ with nᵢ units at risk and dᵢ failures, S(t) = Π_{tᵢ ≤ t}
 * (1 − dᵢ/nᵢ); a unit censored at tᵢ is at risk at tᵢ (censoring after failures at the same time).
 * Greenwood: Var S = S²·Σ dᵢ/(nᵢ(nᵢ − dᵢ)). Interval on the log(−log S) scale,
 * exp(−exp(log(−log S) ± z·SE/(S·|log S|))), which stays inside (0, 1).
 * Reference: Kaplan & Meier (1958), J. Am. Stat. Assoc. 53, 457–481; Greenwood (1926); the
 * log(−log) interval as Kalbfleisch & Prentice, "The Statistical Analysis of Failure Time Data";
 * checked against scipy.stats.ecdf (tests/reference/survival_reference.py).
 * Cost: O(n log n).
 * @throws RangeError when units is empty or malformed, or confidence is not in (0, 1).
 * @example kaplanMeier([{ buildId: 1, hours: 800, failed: true }, { buildId: 2, hours: 1500, failed: false }]).steps[0].survival // 0.5
 */
export function kaplanMeier(units: readonly SurvivalUnit[], confidence = 0.95): SurvivalCurve {
  checkUnits(units, 'kaplanMeier');
  if (!(confidence > 0 && confidence < 1)) throw new RangeError(`kaplanMeier: confidence must be in (0, 1), got ${confidence}`);
  const z = normalQuantile((1 + confidence) / 2);
  const times = [...new Set(units.filter((unit) => unit.failed).map((unit) => unit.hours))].sort((a, b) => a - b);
  const steps: SurvivalStep[] = [];
  let survival = 1;
  let greenwood = 0;
  for (const time of times) {
    const atRisk = units.filter((unit) => unit.hours >= time).length;
    const failures = units.filter((unit) => unit.failed && unit.hours === time).length;
    const censoredHere = units.filter((unit) => !unit.failed && unit.hours === time).length;
    survival *= 1 - failures / atRisk;
    if (atRisk > failures) greenwood += failures / (atRisk * (atRisk - failures));
    const standardError = survival * Math.sqrt(greenwood);
    let low: number | null = null;
    let high: number | null = null;
    if (survival > 0 && survival < 1) {
      const logLog = Math.log(-Math.log(survival));
      const spread = (z * Math.sqrt(greenwood)) / Math.abs(Math.log(survival));
      low = Math.exp(-Math.exp(logLog + spread));
      high = Math.exp(-Math.exp(logLog - spread));
    }
    steps.push({ hours: time, atRisk, failures, censoredHere, survival, standardError, low, high });
  }
  const medianStep = steps.find((step) => step.survival <= 0.5);
  const failures = units.filter((unit) => unit.failed).length;
  return {
    steps,
    units: units.length,
    failures,
    censored: units.length - failures,
    medianHours: medianStep ? medianStep.hours : null,
    confidence,
    method: `Kaplan–Meier product-limit estimate; a log that ended without an onset of rapid failure is censored at its last reading; Greenwood standard errors, ${Number((confidence * 100).toPrecision(4))} % interval on the log(−log) scale`,
  };
}

/**
 * How many builds reached N hours, and the Kaplan–Meier survival at N.
 * Definition: reached = units with hours ≥ N that had not failed before N (a failure exactly at N
 * counts as reaching it); failedBefore = failures at < N; censoredBefore = logs that ended before N
 * without failure (unknown: neither reached nor failed). Survival at N is the Kaplan–Meier step at
 * the last failure time ≤ N.
 * Reference: as kaplanMeier.
 * Cost: O(n log n).
 * @throws RangeError as kaplanMeier, or when hours is not a number ≥ 0.
 * @example survivalAt(units, 1000).summary // "3 of 5 builds reached 1000 h (1 failed before, 1 log ended before)"
 */
export function survivalAt(units: readonly SurvivalUnit[], hours: number, confidence = 0.95): SurvivalAt {
  checkUnits(units, 'survivalAt');
  if (!(Number.isFinite(hours) && hours >= 0)) throw new RangeError(`survivalAt: hours must be a number ≥ 0, got ${hours}`);
  const curve = kaplanMeier(units, confidence);
  const reached = units.filter((unit) => unit.hours >= hours).length;
  const failedBefore = units.filter((unit) => unit.failed && unit.hours < hours).length;
  const censoredBefore = units.filter((unit) => !unit.failed && unit.hours < hours).length;
  let step: SurvivalStep | null = null;
  for (const candidate of curve.steps) if (candidate.hours <= hours) step = candidate;
  const parts: string[] = [];
  if (failedBefore > 0) parts.push(`${failedBefore} failed before`);
  if (censoredBefore > 0) parts.push(`${censoredBefore} log${censoredBefore === 1 ? '' : 's'} ended before`);
  const hoursText = Number(hours.toPrecision(6)).toString();
  return {
    hours,
    reached,
    failedBefore,
    censoredBefore,
    units: units.length,
    survival: step ? step.survival : 1,
    low: step ? step.low : null,
    high: step ? step.high : null,
    summary: `${reached} of ${units.length} build${units.length === 1 ? '' : 's'} reached ${hoursText} h${parts.length > 0 ? ` (${parts.join(', ')})` : ''}`,
  };
}

/**
 * Survival units from onset results: failed at the onset, else censored at the end of the log.
 * Cost: O(n).
 * @throws RangeError when an entry has neither a valid onset nor a valid log length.
 * @example survivalUnits([{ buildId: 7, onsetHours: null, hoursRun: 1500 }]) // [{ buildId: 7, hours: 1500, failed: false }]
 */
export function survivalUnits(results: readonly { buildId: number; onsetHours: number | null; hoursRun: number }[]): SurvivalUnit[] {
  if (!Array.isArray(results)) throw new RangeError('survivalUnits: results must be an array');
  return results.map((result, index) => {
    if (result.onsetHours !== null) {
      if (!(Number.isFinite(result.onsetHours) && result.onsetHours >= 0)) throw new RangeError(`survivalUnits: entry ${index} (build ${result.buildId}): onsetHours must be ≥ 0 or null`);
      return { buildId: result.buildId, hours: result.onsetHours, failed: true };
    }
    if (!(Number.isFinite(result.hoursRun) && result.hoursRun >= 0)) throw new RangeError(`survivalUnits: entry ${index} (build ${result.buildId}): hoursRun must be ≥ 0`);
    return { buildId: result.buildId, hours: result.hoursRun, failed: false };
  });
}
