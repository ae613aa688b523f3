// Metrics of the curve kinds beyond the polarization curve: failure onset of an accelerated test,
// decay and loss of an open-circuit hold, and the impedance metrics with the circuit fit.
import { detectFailureOnset, DEFAULT_ONSET_RULE } from '../../shared/durability';
import type { OnsetRule } from '../../shared/durability';
import { holdMetrics, DEFAULT_HOLD_RULE } from '../../shared/hold';
import type { HoldRule } from '../../shared/hold';
import { impedanceMetrics } from '../../shared/impedance';
import type { CircuitKind } from '../../shared/impedance';
import type { CurveData, CurveMetrics, MetricMethod, MetricsResult } from '../../shared/curves/types';

type Notes = MetricsResult['metricNotes'];
type Methods = MetricsResult['method'];
type Summary = MetricsResult['summary'];

const EMPTY_POLARIZATION: CurveMetrics = {
  vAtRef: null, vAtRefIrFree: null, jAtRef: null, jAtRefIrFree: null, massActivity: null,
  peakPower: null, ocv: null, tafelSlope: null, hfr: null,
};

/** The rule as used: project setting, then the curve's own option, over the default. */
export function onsetRuleOf(projectRule: Partial<OnsetRule> | undefined, curveRule: Partial<OnsetRule> | undefined): OnsetRule {
  return { ...DEFAULT_ONSET_RULE, ...(projectRule ?? {}), ...(curveRule ?? {}) };
}

export function holdRuleOf(projectRule: Partial<HoldRule> | undefined, curveRule: Partial<HoldRule> | undefined): HoldRule {
  return { ...DEFAULT_HOLD_RULE, ...(projectRule ?? {}), ...(curveRule ?? {}) };
}

function ruleText(rule: Record<string, number>): string {
  return Object.entries(rule).map(([key, value]) => `${key} ${value}`).join(', ');
}

/** onsetHours of a durability log, with the rule stored beside it. */
/** The onset metric of a log: its value, why it is missing, its method and what the summary keeps. */
export type OnsetOutcome = { value: number | null; note?: string; method: MetricMethod; summary: Summary };

export function onsetMetric(curve: CurveData, rule: OnsetRule): OnsetOutcome {
  if (!curve.tHours || curve.tHours.length < 3) {
    return { value: null, note: 'no time column: the onset of rapid failure needs a log against time', method: { method: 'two-piece line fit of voltage against time', inputs: { rule: ruleText(rule as never) } }, summary: {} };
  }
  try {
    const onset = detectFailureOnset({ tHours: curve.tHours, v: curve.v, j: curve.j }, rule);
    return {
      value: onset.onsetHours,
      note: onset.onsetHours === null ? `no onset of rapid failure found: ${onset.verdict}` : undefined,
      method: {
        method: onset.method,
        inputs: {
          rule: ruleText(onset.rule as never),
          stableRateUvPerH: onset.stableRateUvPerH,
          failureRateUvPerH: onset.failureRateUvPerH,
          onsetLowHours: onset.onsetLowHours,
          onsetHighHours: onset.onsetHighHours,
        },
      },
      summary: {
        onsetVerdict: onset.verdict,
        onsetLowHours: onset.onsetLowHours,
        onsetHighHours: onset.onsetHighHours,
        onsetStableRate: onset.stableRateUvPerH,
        onsetFailureRate: onset.failureRateUvPerH,
        onsetHoursRun: onset.hoursRun,
        onsetRule: JSON.stringify(onset.rule),
      },
    };
  } catch (error) {
    if (!(error instanceof RangeError)) throw error;
    return { value: null, note: `the onset could not be read: ${error.message.replace(/^\w+: /, '')}`, method: { method: 'two-piece line fit of voltage against time', inputs: { rule: ruleText(rule as never) } }, summary: {} };
  }
}

/** holdDecay and holdLoss of an open-circuit hold, with the settling rule stated. */
export function holdMetricValues(curve: CurveData, rule: HoldRule): { metrics: Pick<CurveMetrics, 'holdDecay' | 'holdLoss'>; notes: Notes; method: Methods; summary: Summary } {
  const notes: Notes = {};
  const method: Methods = {};
  if (!curve.tHours || curve.tHours.length < 3) {
    const why = 'no time column: a hold needs voltage against time';
    return { metrics: { holdDecay: null, holdLoss: null }, notes: { holdDecay: why, holdLoss: why }, method, summary: {} };
  }
  try {
    const hold = holdMetrics({ tHours: curve.tHours, v: curve.v, j: curve.j }, rule);
    const ruleWords = `settling rule: the first ${hold.rule.settleMinutes} min after the load is removed are skipped; loss from the means of the first and last ${hold.rule.edgeMinutes} min of the rest`;
    const inputs = { fromHours: hold.window?.fromHours ?? null, toHours: hold.window?.toHours ?? null, settleMinutes: hold.rule.settleMinutes, edgeMinutes: hold.rule.edgeMinutes, readings: hold.readingsUsed };
    method.holdDecay = { method: `${hold.method}; ${ruleWords}`, inputs: { ...inputs, low: hold.decayLow, high: hold.decayHigh } };
    method.holdLoss = { method: `mean open-circuit voltage over the first minus the last edge of the hold; ${ruleWords}`, inputs };
    if (hold.holdDecay === null) notes.holdDecay = hold.notes.join(' ') || 'too few readings after settling';
    if (hold.holdLoss === null) notes.holdLoss = hold.notes.join(' ') || 'too few readings after settling';
    return {
      metrics: { holdDecay: hold.holdDecay, holdLoss: hold.holdLoss },
      notes,
      method,
      summary: { holdDecayLow: hold.decayLow, holdDecayHigh: hold.decayHigh, holdStartV: hold.startV, holdEndV: hold.endV, holdLossFromStartMv: hold.lossFromStartMv, holdRule: JSON.stringify(hold.rule), holdNotes: hold.notes.join(' ') },
    };
  } catch (error) {
    if (!(error instanceof RangeError)) throw error;
    const why = `the hold could not be measured: ${error.message.replace(/^\w+: /, '')}`;
    return { metrics: { holdDecay: null, holdLoss: null }, notes: { holdDecay: why, holdLoss: why }, method, summary: {} };
  }
}

/** The metrics of an impedance spectrum; a spectrum that cannot be fitted gives nulls with the reason. */
export function impedanceResult(curve: CurveData, options: { circuit?: CircuitKind } = {}): MetricsResult {
  if (!curve.frequencyHz || !curve.zReal || !curve.zImag) throw new RangeError('impedance: the curve holds no spectrum');
  const spectrum = { frequencyHz: curve.frequencyHz, zReal: curve.zReal, zImag: curve.zImag };
  const result = impedanceMetrics(spectrum, options.circuit ? { circuit: options.circuit } : {});
  const metrics: CurveMetrics = { ...EMPTY_POLARIZATION, hfr: result.metrics.hfr, rct: result.metrics.rct, cpeQ: result.metrics.cpeQ, cpeN: result.metrics.cpeN };
  const metricNotes: Notes = { ...result.metricNotes };
  const method: Methods = { ...result.method };
  if (result.fit?.parameters.sigmaW != null) {
    metrics.sigmaW = result.fit.parameters.sigmaW;
    const row = result.fit.table.find((entry) => entry.key === 'sigmaW');
    method.sigmaW = { method: result.fit.method, inputs: { standardError: row?.standardError ?? null, low: row?.low ?? null, high: row?.high ?? null } };
  }
  for (const key of Object.keys(metricNotes) as (keyof typeof metricNotes)[]) if (metricNotes[key] == null || metricNotes[key] === '') delete metricNotes[key];
  const fit = result.fit;
  const summary: Summary = {
    ...result.summary,
    fitMethod: fit?.method ?? null,
    fitTable: fit ? JSON.stringify(fit.table) : null,
    fitParameters: fit ? JSON.stringify(fit.parameters) : null,
    residualSD: fit?.residualSD ?? null,
    chiSquare: fit?.chiSquare ?? null,
    fitConfidence: fit?.confidence ?? null,
    fitFromHz: fit ? Math.min(...fit.frequencyRangeHz) : null,
    fitToHz: fit ? Math.max(...fit.frequencyRangeHz) : null,
    interceptMethod: result.intercept.method,
    interceptFrequencyHz: result.intercept.frequencyHz,
    interceptNote: result.intercept.note,
  };
  if (!fit) summary.fitProblem = metricNotes.rct ?? 'no fit';
  return { metrics, metricNotes, method, summary };
}
