// How a response is shown: curve metrics in their display units (mV, mA/cm², …), hand-entered
// responses in their own unit. The API works in internal units (V, A/cm²); we scale at the edge.
import { formatNumber, responseDisplay, type ResponseDisplay } from '@/lib/format';

export type Display = ResponseDisplay;

/** A response's display: the one rule of the format table (responseDisplay). */
export const displayOf = responseDisplay;

/** A value in display units with its unit. */
export function show(value: number | null | undefined, d: Display, extraDigits = 0): string {
  if (value == null || !Number.isFinite(value)) return '—';
  return `${formatNumber(value * d.scale, d.digits + extraDigits)}${d.unit ? ` ${d.unit}` : ''}`;
}

/** A number with a sensible count of significant digits (coefficients, SS). */
export function sig(value: number | null | undefined, digits = 4): string {
  if (value == null || !Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  const abs = Math.abs(value);
  if (abs >= 1e5 || abs < 1e-4) return value.toExponential(digits - 1);
  return String(Number(value.toPrecision(digits)));
}

export function pValue(p: number | null | undefined): string {
  if (p == null || !Number.isFinite(p)) return '—';
  return p < 0.0001 ? '< 0.0001' : p.toFixed(4);
}

/** Digits for a spread or difference: two significant digits, never more than three decimals. */
function spreadDigits(scaled: number): number {
  if (!Number.isFinite(scaled) || scaled === 0) return 0;
  return Math.min(3, Math.max(0, 1 - Math.floor(Math.log10(Math.abs(scaled)))));
}

/** A spread (±, SD, interval half-width) in display units with its unit, two significant digits. */
export function showSpread(value: number | null | undefined, d: Display): string {
  if (value == null || !Number.isFinite(value)) return '—';
  const scaled = value * d.scale;
  return `${formatNumber(scaled, spreadDigits(scaled))}${d.unit ? ` ${d.unit}` : ''}`;
}

/** A signed difference ("+59 mV", "−7.1 mV") in display units, two significant digits. */
export function showSigned(value: number, d: Display, digitsFrom?: number): string {
  const scaled = value * d.scale;
  const digits = spreadDigits(digitsFrom !== undefined ? digitsFrom * d.scale : scaled);
  const text = formatNumber(Math.abs(scaled), digits);
  const sign = Number(text.replace(/,/g, '')) === 0 ? '±' : scaled > 0 ? '+' : '−';
  return `${sign}${text}${d.unit ? ` ${d.unit}` : ''}`;
}

/** A factor setting for people: a level as it is, a number rounded to 4 significant digits with its unit. */
export function showSetting(value: number | string | undefined, unit?: string | null): string {
  if (value === undefined || value === null || value === '') return '—';
  if (typeof value === 'string') return value;
  return `${Number(value.toPrecision(4)).toLocaleString('en-GB', { maximumFractionDigits: 3 })}${unit ? ` ${unit}` : ''}`;
}
