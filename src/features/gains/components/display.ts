// How a response is shown: METRICS' display unit and scale for curve metrics, the defined unit
// (scale 1) for hand-entered responses.
import { formatNumber, responseDisplay } from '@/lib/format';

export interface Display {
  unit: string;
  scale: number;
  /** digits for values; gains get one more when values have none */
  digits: number;
  gainDigits: number;
  label: string;
}

export function displayOf(response: { key: string; label: string; unit: string }): Display {
  const d = responseDisplay(response);
  return { ...d, gainDigits: Math.max(1, d.digits) };
}

export const showValue = (d: Display, value: number | null | undefined) => (value == null ? '—' : `${formatNumber(value * d.scale, d.digits)} ${d.unit}`.trim());
export const showGain = (d: Display, value: number | null | undefined) =>
  value == null ? '—' : `${value > 0 ? '+' : value < 0 ? '−' : '±'}${formatNumber(Math.abs(value) * d.scale, d.gainDigits)} ${d.unit}`.trim();
