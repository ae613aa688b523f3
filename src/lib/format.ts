// Numbers with their units, consistently: metric keys know their display unit and scale.
export interface MetricInfo {
  key: string;
  label: string;
  unit: string;
  /** multiply the stored value (internal units) by this for display */
  scale: number;
  digits: number;
  higherIsBetter: boolean;
  description: string;
}

export const METRICS: Record<string, MetricInfo> = {
  vAtRef: { key: 'vAtRef', label: 'V at j_ref', unit: 'mV', scale: 1000, digits: 0, higherIsBetter: true, description: 'cell voltage interpolated at the reference current density' },
  vAtRefIrFree: { key: 'vAtRefIrFree', label: 'iR-free V at j_ref', unit: 'mV', scale: 1000, digits: 0, higherIsBetter: true, description: 'V + j·HFR at the reference current density' },
  jAtRef: { key: 'jAtRef', label: 'j at V_ref', unit: 'mA/cm²', scale: 1000, digits: 1, higherIsBetter: true, description: 'current density where the curve crosses the reference voltage' },
  jAtRefIrFree: { key: 'jAtRefIrFree', label: 'iR-free j at V_ref', unit: 'mA/cm²', scale: 1000, digits: 1, higherIsBetter: true, description: 'current density where the iR-free curve crosses the reference voltage' },
  massActivity: { key: 'massActivity', label: 'Mass activity', unit: 'A/g', scale: 1, digits: 2, higherIsBetter: true, description: 'j at V_ref divided by catalyst (or metal) loading' },
  peakPower: { key: 'peakPower', label: 'Peak power', unit: 'mW/cm²', scale: 1000, digits: 0, higherIsBetter: true, description: 'highest j·V measured' },
  ocv: { key: 'ocv', label: 'OCV', unit: 'mV', scale: 1000, digits: 0, higherIsBetter: true, description: 'voltage at open circuit' },
  tafelSlope: { key: 'tafelSlope', label: 'Tafel slope', unit: 'mV/dec', scale: 1, digits: 1, higherIsBetter: false, description: 'dV/dlog10(j) on iR-free data in the kinetic window' },
  hfr: { key: 'hfr', label: 'HFR', unit: 'mΩ·cm²', scale: 1000, digits: 0, higherIsBetter: false, description: 'median high-frequency resistance' },
  degradationRate: { key: 'degradationRate', label: 'Degradation', unit: 'µV/h', scale: 1, digits: 1, higherIsBetter: false, description: 'voltage loss rate after break-in (positive = losing voltage)' },
  breakInHours: { key: 'breakInHours', label: 'Break-in', unit: 'h', scale: 1, digits: 0, higherIsBetter: false, description: 'period excluded from the degradation fit' },
};

export function formatNumber(value: number | null | undefined, digits = 2): string {
  if (value == null || !Number.isFinite(value)) return '—';
  return value.toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits });
}

export function formatMetric(key: string, value: number | null | undefined): string {
  const info = METRICS[key];
  if (!info) return formatNumber(value, 3);
  if (value == null) return '—';
  return `${formatNumber(value * info.scale, info.digits)} ${info.unit}`;
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
