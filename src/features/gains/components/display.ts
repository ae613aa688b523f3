// How a response is shown: METRICS' display unit and scale for curve metrics, the defined unit
// (scale 1) for hand-entered responses.
import { METRICS, formatNumber } from '@/lib/format';

export interface Display {
  unit: string;
  scale: number;
  /** digits for values; gains get one more when values have none */
  digits: number;
  gainDigits: number;
  label: string;
}

export function displayOf(response: { key: string; label: string; unit: string }): Display {
  const info = METRICS[response.key];
  if (info) return { unit: info.unit, scale: info.scale, digits: info.digits, gainDigits: Math.max(1, info.digits), label: info.label };
  return { unit: response.unit, scale: 1, digits: 3, gainDigits: 3, label: response.label };
}

export const showValue = (d: Display, value: number | null | undefined) => (value == null ? '—' : `${formatNumber(value * d.scale, d.digits)} ${d.unit}`.trim());
export const showGain = (d: Display, value: number | null | undefined) =>
  value == null ? '—' : `${value > 0 ? '+' : value < 0 ? '−' : '±'}${formatNumber(Math.abs(value) * d.scale, d.gainDigits)} ${d.unit}`.trim();
