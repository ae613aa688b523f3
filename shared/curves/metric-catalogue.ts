// Every metric read off a curve, declared once: its key (the API field name), the curve kinds
// that carry it, its internal unit, how people see it (display unit, scale, digits), which way is
// better, its label and a one-line description. Types, the server's lists, the OpenAPI document,
// the client's formatter and the metrics panel's order are all derived from this table, so adding
// a metric is one entry here plus its computation and its test.
import type { ResponseInfo } from '../api-types/responses';

/** Curve kinds a metric may belong to; `impedance` spectra carry metrics before they are a stored kind. */
export type MetricCurveKind = 'polarization' | 'durability' | 'hold' | 'impedance';

export interface CurveMetricEntry {
  /** what people read: short, with the usual symbols */
  label: string;
  /** one line on how the value is defined, for hover text */
  description: string;
  /** the curve kinds whose metrics object carries this key */
  kinds: readonly MetricCurveKind[];
  /**
   * the kinds on which the metrics computation already returns a value; a kind listed in `kinds`
   * but not here is part of the API's metrics object and not computed yet (always null)
   */
  computedOn: readonly MetricCurveKind[];
  /** internal unit, as stored and sent by the API */
  unit: string;
  /** unit shown to people; the stored value times `scale` is the displayed number */
  displayUnit: string;
  scale: number;
  /** decimals shown in `displayUnit` */
  digits: number;
  goal: 'maximize' | 'minimize';
  /** physics a predicted value must respect: a cell voltage (≤ the reversible voltage), or ≥ 0 */
  limit?: 'cell-voltage' | 'non-negative';
  /** the project's reference point the metric is read at */
  readAt?: 'j_ref' | 'V_ref';
  /** read on iR-free voltage: always, or when the project's settings say so */
  irFree?: 'always' | 'setting';
  /** divided by the loading on the project's basis (catalyst or metal) */
  perLoading?: boolean;
}

/**
 * The catalogue, in the order the metrics are shown (the metrics panel, the compare tables and
 * the response pickers follow it). Units are the fixed units of the API.
 */
export const CURVE_METRICS = {
  vAtRef: {
    label: 'V at j_ref', description: 'cell voltage interpolated at the reference current density',
    kinds: ['polarization'], computedOn: ['polarization'], unit: 'V', displayUnit: 'mV', scale: 1000, digits: 0, goal: 'maximize', limit: 'cell-voltage',
    readAt: 'j_ref',
  },
  vAtRefIrFree: {
    label: 'iR-free V at j_ref', description: 'V + j·HFR at the reference current density',
    kinds: ['polarization'], computedOn: ['polarization'], unit: 'V', displayUnit: 'mV', scale: 1000, digits: 0, goal: 'maximize', limit: 'cell-voltage',
    readAt: 'j_ref', irFree: 'always',
  },
  jAtRef: {
    label: 'j at V_ref', description: 'current density where the curve crosses the reference voltage',
    kinds: ['polarization'], computedOn: ['polarization'], unit: 'A/cm²', displayUnit: 'mA/cm²', scale: 1000, digits: 1, goal: 'maximize', limit: 'non-negative',
    readAt: 'V_ref',
  },
  jAtRefIrFree: {
    label: 'iR-free j at V_ref', description: 'current density where the iR-free curve crosses the reference voltage',
    kinds: ['polarization'], computedOn: ['polarization'], unit: 'A/cm²', displayUnit: 'mA/cm²', scale: 1000, digits: 1, goal: 'maximize', limit: 'non-negative',
    readAt: 'V_ref', irFree: 'always',
  },
  massActivity: {
    label: 'Mass activity', description: 'j at V_ref divided by catalyst (or metal) loading',
    kinds: ['polarization'], computedOn: ['polarization'], unit: 'A/g', displayUnit: 'A/g', scale: 1, digits: 2, goal: 'maximize', limit: 'non-negative',
    readAt: 'V_ref', irFree: 'setting', perLoading: true,
  },
  peakPower: {
    label: 'Peak power', description: 'highest j·V measured',
    kinds: ['polarization'], computedOn: ['polarization'], unit: 'W/cm²', displayUnit: 'mW/cm²', scale: 1000, digits: 0, goal: 'maximize', limit: 'non-negative',
  },
  ocv: {
    label: 'OCV', description: 'voltage at open circuit',
    kinds: ['polarization'], computedOn: ['polarization'], unit: 'V', displayUnit: 'mV', scale: 1000, digits: 0, goal: 'maximize', limit: 'cell-voltage',
  },
  tafelSlope: {
    label: 'Tafel slope', description: 'dV/dlog10(j) on iR-free data in the kinetic window',
    kinds: ['polarization'], computedOn: ['polarization'], unit: 'mV/dec', displayUnit: 'mV/dec', scale: 1, digits: 1, goal: 'minimize', limit: 'non-negative',
  },
  hfr: {
    label: 'HFR', description: 'high-frequency resistance: median of the logged values, or the real-axis intercept of a spectrum',
    kinds: ['polarization', 'impedance'], computedOn: ['polarization', 'impedance'], unit: 'Ω·cm²', displayUnit: 'mΩ·cm²', scale: 1000, digits: 0, goal: 'minimize', limit: 'non-negative',
  },
  degradationRate: {
    label: 'Degradation rate', description: 'voltage loss rate after break-in (positive = losing voltage)',
    kinds: ['durability', 'hold'], computedOn: ['durability', 'hold'], unit: 'µV/h', displayUnit: 'µV/h', scale: 1, digits: 1, goal: 'minimize',
  },
  breakInHours: {
    label: 'Break-in', description: 'period excluded from the degradation fit',
    kinds: ['durability'], computedOn: ['durability'], unit: 'h', displayUnit: 'h', scale: 1, digits: 0, goal: 'minimize', limit: 'non-negative',
  },
  onsetHours: {
    label: 'Failure onset', description: 'hours until the loss rate rose well above the stable rate (two-piece line fit); empty when none is found',
    kinds: ['durability'], computedOn: ['durability'], unit: 'h', displayUnit: 'h', scale: 1, digits: 0, goal: 'maximize', limit: 'non-negative',
  },
  holdDecay: {
    label: 'Hold decay', description: 'rate of open-circuit voltage fall during the hold after settling (positive = falling)',
    kinds: ['hold'], computedOn: ['hold'], unit: 'mV/h', displayUnit: 'mV/h', scale: 1, digits: 2, goal: 'minimize',
  },
  holdLoss: {
    label: 'Hold loss', description: 'open-circuit voltage lost over the hold after settling',
    kinds: ['hold'], computedOn: ['hold'], unit: 'mV', displayUnit: 'mV', scale: 1, digits: 1, goal: 'minimize',
  },
  rct: {
    label: 'R_ct', description: 'charge-transfer resistance from the equivalent-circuit fit of the spectrum',
    kinds: ['impedance'], computedOn: ['impedance'], unit: 'Ω·cm²', displayUnit: 'mΩ·cm²', scale: 1000, digits: 0, goal: 'minimize', limit: 'non-negative',
  },
  cpeQ: {
    label: 'CPE Q', description: 'constant-phase-element coefficient of the equivalent-circuit fit',
    kinds: ['impedance'], computedOn: ['impedance'], unit: 'F·s^(n−1)·cm⁻²', displayUnit: 'mF·s^(n−1)/cm²', scale: 1000, digits: 2, goal: 'maximize', limit: 'non-negative',
  },
  cpeN: {
    label: 'CPE n', description: 'constant-phase-element exponent (1 = ideal capacitor)',
    kinds: ['impedance'], computedOn: ['impedance'], unit: '', displayUnit: '', scale: 1, digits: 3, goal: 'maximize', limit: 'non-negative',
  },
  sigmaW: {
    label: 'Warburg σ_W', description: 'Warburg coefficient, from a fit with diffusion chosen for the spectrum (empty with the default charge-transfer circuit)',
    kinds: ['impedance'], computedOn: [], unit: 'Ω·cm²·s^(−1/2)', displayUnit: 'mΩ·cm²·s^(−1/2)', scale: 1000, digits: 1, goal: 'minimize', limit: 'non-negative',
  },
} as const satisfies Record<string, CurveMetricEntry>;

/** The key union of every curve metric (an API field name of the metrics object). */
export type CurveMetricKey = keyof typeof CURVE_METRICS;

/** Every metric key in catalogue order. */
export const CURVE_METRIC_KEYS = Object.keys(CURVE_METRICS) as CurveMetricKey[];

/** The catalogue entry of a key, or undefined for anything that is not a curve metric. */
export function metricEntry(key: string): CurveMetricEntry | undefined {
  return Object.hasOwn(CURVE_METRICS, key) ? (CURVE_METRICS as Record<string, CurveMetricEntry>)[key] : undefined;
}

export function isCurveMetric(key: string): key is CurveMetricKey {
  return Object.hasOwn(CURVE_METRICS, key);
}

/** The metrics a curve of this kind carries, in catalogue order. metricsOfKind('hold') → ['degradationRate', 'breakInHours', 'holdDecay', 'holdLoss'] */
export function metricsOfKind(kind: MetricCurveKind): CurveMetricKey[] {
  return CURVE_METRIC_KEYS.filter((key) => (CURVE_METRICS[key].kinds as readonly string[]).includes(kind));
}

/** The metrics the computation already returns for this kind, in catalogue order. */
export function computedMetricsOfKind(kind: MetricCurveKind): CurveMetricKey[] {
  return CURVE_METRIC_KEYS.filter((key) => (CURVE_METRICS[key].computedOn as readonly string[]).includes(kind));
}

/** A metrics object with every key of the given kinds set to null, to be filled by a computation. */
export function nullMetrics<K extends CurveMetricKey>(keys: readonly K[]): Record<K, null> {
  return Object.fromEntries(keys.map((key) => [key, null])) as Record<K, null>;
}

/** The curve metrics offered as responses: those some stored curve kind already computes. */
export function curveResponses(): ResponseInfo[] {
  return CURVE_METRIC_KEYS.filter((key) => (CURVE_METRICS[key].computedOn as readonly MetricCurveKind[]).some((kind) => kind !== 'impedance')).map((key) => {
    const { label, unit, goal } = CURVE_METRICS[key];
    return { key, label, unit, goal, target: null, source: 'curve' as const };
  });
}

/**
 * The response a key names: a curve metric first (hand-entered responses may not reuse its key),
 * else one of the project's hand-entered responses; null when neither.
 * @example findResponse('vAtRef', []).unit // 'V'
 */
export function findResponse(key: string, handEntered: readonly { key: string; label: string; unit: string; goal: ResponseInfo['goal']; target: number | null }[]): ResponseInfo | null {
  const metric = curveResponses().find((r) => r.key === key);
  if (metric) return metric;
  const def = handEntered.find((d) => d.key === key);
  return def ? { key, label: def.label, unit: def.unit, goal: def.goal, target: def.target ?? null, source: 'hand-entered' } : null;
}

/** Every key a project's responses may be asked by, for the message that refuses an unknown one. */
export function knownResponseKeys(handEntered: readonly { key: string }[]): string[] {
  return [...curveResponses().map((r) => r.key), ...handEntered.map((d) => d.key)];
}

/** How a request field that names a response is described in the API document. */
export function responseFieldDescription(): string {
  return `a curve metric (${curveResponses().map((r) => r.key).join(', ')}) or the key of one of the project's hand-entered responses`;
}

/** The physical limit of a metric's predicted values, or null for a key with none (hand-entered responses). */
export function metricLimit(key: string): 'cell-voltage' | 'non-negative' | null {
  return metricEntry(key)?.limit ?? null;
}

/**
 * The reference-point conditions a metric is read at, as phrases for a subtitle:
 * referenceConditions('massActivity', { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'metal' }, (v, d) => v.toFixed(d))
 * → ['at V_ref = 0.60 V, iR-free', 'per g of metal']. Empty for a metric not read at the reference point.
 */
export function referenceConditions(
  key: string,
  settings: { refCurrentDensity: number; refVoltage: number; irFree: boolean; loadingBasis: 'catalyst' | 'metal' },
  formatNumber: (value: number, digits: number) => string,
): string[] {
  const entry = metricEntry(key);
  if (!entry?.readAt) return [];
  const irFree = entry.irFree === 'always' || (entry.irFree === 'setting' && settings.irFree) ? ', iR-free' : '';
  const point = entry.readAt === 'j_ref' ? `at j_ref = ${formatNumber(settings.refCurrentDensity, 2)} A/cm²` : `at V_ref = ${formatNumber(settings.refVoltage, 2)} V`;
  const parts = [`${point}${irFree}`];
  if (entry.perLoading) parts.push(`per g of ${settings.loadingBasis === 'metal' ? 'metal' : 'catalyst'}`);
  return parts;
}
