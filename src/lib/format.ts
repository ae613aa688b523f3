// Numbers with their units, consistently: metric keys and method inputs know their label, display
// unit, scale and digits, so no key, raw float or "undefined" reaches the screen. One formatter
// (formatQuantity) serves metric values, method inputs and responses everywhere.
import { CURVE_METRICS, CURVE_METRIC_KEYS } from '@shared/curves/metric-catalogue';
import { roundSignificantText, SETTING_DIGITS } from '@shared/units/significant';
export interface MetricInfo {
  key: string;
  label: string;
  /** display unit */
  unit: string;
  /** multiply the stored value (internal units) by this for display */
  scale: number;
  digits: number;
  higherIsBetter: boolean;
  description: string;
}

/** The client's format table, one row per catalogue metric (shared/curves/metric-catalogue.ts). */
export const METRICS: Record<string, MetricInfo> = Object.fromEntries(
  CURVE_METRIC_KEYS.map((key) => {
    const m = CURVE_METRICS[key];
    return [key, { key, label: m.label, unit: m.displayUnit, scale: m.scale, digits: m.digits, higherIsBetter: m.goal === 'maximize', description: m.description }];
  }),
);

/** Method inputs and other named quantities that are not metrics (internal units as stored). */
const INPUTS: Record<string, { label: string; unit?: string; scale?: number; digits?: number; kind?: 'yes-no' | 'count' | 'text' }> = {
  jRef: { label: 'j_ref', unit: 'A/cm²', digits: 3 },
  vRef: { label: 'V_ref', unit: 'V', digits: 3 },
  jAtVRef: { label: 'j at V_ref', unit: 'A/cm²', digits: 3 },
  jAtPeak: { label: 'j at peak power', unit: 'A/cm²', digits: 3 },
  vAtPeak: { label: 'V at peak power', unit: 'V', digits: 3 },
  loadingMgCm2: { label: 'loading', unit: 'mg/cm²', digits: 2 },
  metalLoadingMgCm2: { label: 'metal loading', unit: 'mg/cm²', digits: 3 },
  areaCm2: { label: 'active area', unit: 'cm²', digits: 1 },
  refCurrentDensity: { label: 'j_ref', unit: 'A/cm²', digits: 3 },
  refVoltage: { label: 'V_ref', unit: 'V', digits: 3 },
  hfrAvailable: { label: 'HFR in the file', kind: 'yes-no' },
  irFree: { label: 'iR-free', kind: 'yes-no' },
  basis: { label: 'loading basis', kind: 'text' },
  loadingBasis: { label: 'loading basis', kind: 'text' },
  readings: { label: 'readings', kind: 'count' },
  points: { label: 'points', kind: 'count' },
  window: { label: 'window', kind: 'text' },
  currentDensity: { label: 'current density', unit: 'A/cm²', digits: 2 },
  temperatureC: { label: 'cell temperature', unit: '°C', digits: 0 },
  backPressureKPa: { label: 'back-pressure', unit: 'kPa(g)', digits: 0 },
};

/** "loadingMgCm2" → "loading mg cm2": a readable fallback for a key no table knows. */
export function humanKey(key: string): string {
  return key
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/([A-Z]+)([A-Z][a-z])/g, '$1 $2')
    .replace(/_/g, ' ')
    .toLowerCase()
    .trim();
}

/** A number with `significant` significant digits, without a trailing exponent for ordinary sizes. */
export function formatSignificant(value: number | null | undefined, significant = 3): string {
  if (value == null || !Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  const abs = Math.abs(value);
  if (abs >= 1e6 || abs < 1e-4) {
    const [mantissa, exponent] = value.toExponential(significant - 1).split('e');
    const superscript = String(Number(exponent)).replace(/[-0-9]/g, (c) => '⁻⁰¹²³⁴⁵⁶⁷⁸⁹'['-0123456789'.indexOf(c)]!);
    return `${mantissa} × 10${superscript}`;
  }
  const digits = Math.max(0, significant - 1 - Math.floor(Math.log10(abs)));
  return formatNumber(value, Math.min(digits, 6));
}

/**
 * One named quantity for people: its label and its value in display units with sensible digits.
 * Metric keys use METRICS, method inputs their own table; an unknown key gets a readable label
 * and three significant digits. formatQuantity('jAtVRef', 0.1850336) → "j at V_ref 0.185 A/cm²".
 */
export function describeQuantity(key: string, value: unknown): { label: string; text: string } {
  const metric = METRICS[key];
  if (metric) return { label: metric.label, text: typeof value === 'number' ? formatMetric(key, value) : value == null ? 'not available' : String(value) };
  const info = INPUTS[key];
  const label = info?.label ?? humanKey(key);
  if (value == null || (typeof value === 'number' && !Number.isFinite(value))) return { label, text: 'not available' };
  if (typeof value === 'boolean' || info?.kind === 'yes-no') return { label, text: value ? 'yes' : 'no' };
  if (typeof value !== 'number') return { label, text: String(value) };
  if (info?.kind === 'count') return { label, text: value.toLocaleString('en-GB') };
  const shown = info?.digits != null ? formatNumber(value * (info.scale ?? 1), info.digits) : formatSignificant(value * (info?.scale ?? 1), 3);
  return { label, text: info?.unit ? `${shown} ${info.unit}` : shown };
}

export function formatQuantity(key: string, value: unknown): string {
  const { label, text } = describeQuantity(key, value);
  return `${label} ${text}`;
}

/** How a response is shown: a curve metric in its display unit, a hand-entered one in its own. */
export interface ResponseDisplay {
  label: string;
  unit: string;
  scale: number;
  digits: number;
}

export function responseDisplay(response: { key: string; label: string; unit: string }): ResponseDisplay {
  const metric = METRICS[response.key];
  if (metric) return { label: metric.label, unit: metric.unit, scale: metric.scale, digits: metric.digits };
  return { label: response.label, unit: response.unit, scale: 1, digits: 3 };
}

export function formatNumber(value: number | null | undefined, digits = 2): string {
  if (value == null || !Number.isFinite(value)) return '—';
  return value.toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits });
}

export function formatMetric(key: string, value: number | null | undefined): string {
  const info = METRICS[key];
  if (!info) return formatSignificant(value, 3);
  if (value == null || !Number.isFinite(value)) return '—';
  const shown = formatNumber(value * info.scale, info.digits);
  return info.unit ? `${shown} ${info.unit}` : shown;
}

export function formatDate(iso: string | null | undefined): string {
  if (!iso) return '—';
  const d = new Date(iso.length === 10 ? `${iso}T00:00:00Z` : iso);
  if (Number.isNaN(d.getTime())) return iso;
  return d.toLocaleDateString('en-GB', { day: '2-digit', month: 'short', year: 'numeric', timeZone: 'UTC' });
}

export function formatDateTime(iso: string | null | undefined): string {
  if (!iso) return '—';
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return d.toLocaleString('en-GB', { day: '2-digit', month: 'short', hour: '2-digit', minute: '2-digit' });
}

export function withUnit(value: number | string | null | undefined, unit: string): string {
  if (value == null || value === '') return '—';
  return unit ? `${value} ${unit}` : String(value);
}

/** Labels of stored fields, for histories and the audit log (anything else: humanKey). */
const FIELD_LABELS: Record<string, string> = {
  code: 'code', status: 'status', parentId: 'parent build', parentCode: 'parent build', changeNote: 'change note', notes: 'notes',
  factors: 'recipe', responses: 'hand-entered responses', testConditions: 'test conditions', loadingMgCm2: 'catalyst loading (mg/cm²)',
  metalLoadingMgCm2: 'metal loading (mg/cm²)', areaCm2: 'active area (cm²)', labId: 'lab', labName: 'lab', operatorId: 'operator',
  operatorName: 'operator', catalystLot: 'catalyst lot', builtOn: 'built on', testedOn: 'tested on', plannedOn: 'planned on',
  buildId: 'build', curveId: 'curve', designId: 'design', kind: 'kind', file: 'file', sha256: 'SHA-256', points: 'points',
  options: 'curve options', metrics: 'metrics', settings: 'settings', refCurrentDensity: 'j_ref (A/cm²)', refVoltage: 'V_ref (V)',
  irFree: 'iR-free', loadingBasis: 'loading basis', codePrefix: 'code prefix', name: 'name', description: 'description',
  email: 'e-mail', role: 'role', isAdmin: 'site administrator', disabledAt: 'disabled on', userId: 'person', verdict: 'verdict',
  body: 'text', label: 'label', unit: 'unit', low: 'low', high: 'high', levels: 'levels', goal: 'goal', key: 'API key',
  notify: 'e-mail notices', digest: 'daily digest', anodeGas: 'anode gas', cathodeGas: 'cathode gas', anodeStoich: 'anode stoichiometry',
  cathodeStoich: 'cathode stoichiometry', temperatureC: 'cell temperature (°C)', backPressureKPa: 'back-pressure (kPa(g))',
  breakInHours: 'break-in (h)', revoked: 'revoked', sent: 'sent', city: 'city', runs: 'runs', count: 'count',
};

/** A stored field's name for people; `labels` (e.g. factor key → label) take precedence. */
export function fieldLabel(key: string, labels?: Record<string, string>): string {
  return labels?.[key] ?? METRICS[key]?.label ?? FIELD_LABELS[key] ?? humanKey(key);
}

/** A stored value for people: numbers without float noise, objects as "label value" pairs. */
export function formatFieldValue(value: unknown, labels?: Record<string, string>, depth = 0): string {
  if (value === null || value === undefined || value === '') return '—';
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'number') return Number.isFinite(value) ? roundSignificantText(value, SETTING_DIGITS) : '—';
  if (Array.isArray(value)) return value.map((v) => formatFieldValue(v, labels, depth + 1)).join(', ');
  if (typeof value === 'object') {
    if (depth > 1) return '…';
    const entries = Object.entries(value as Record<string, unknown>).filter(([, v]) => v !== null && v !== undefined && v !== '');
    if (entries.length === 0) return '—';
    return entries.map(([k, v]) => `${fieldLabel(k, labels)} ${formatFieldValue(v, labels, depth + 1)}`).join('; ');
  }
  return String(value);
}

/** Mass activity named by its potential and basis: "Mass activity at 0.6 V iR-free, per g metal". */
export function massActivityLabel(settings: { refVoltage: number; irFree: boolean; loadingBasis: 'catalyst' | 'metal' }): string {
  return `Mass activity at ${formatNumber(settings.refVoltage, 2)} V${settings.irFree ? ' iR-free' : ''}, per g ${settings.loadingBasis}`;
}
