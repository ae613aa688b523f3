// Small pieces shared by the upload result and the build page's curve list: the "curve of
// record" mark, the metrics each kind compares, differences in display units, and the mount
// point for notes about how a curve's file was read.
import type { CurveSummary, ProjectSettings } from '@shared/api-types';
import type { CurveKind } from '@shared/curves/types';
import { METRICS, formatDateTime, formatNumber } from '@/lib/format';

export const KIND_LABEL: Record<CurveKind, string> = { polarization: 'Polarization', durability: 'Durability', hold: 'Open-circuit hold', impedance: 'Impedance spectrum' };
export const KIND_WORD: Record<CurveKind, string> = { polarization: 'polarization curve', durability: 'durability log', hold: 'open-circuit hold', impedance: 'impedance spectrum' };

/** The metrics shown side by side when two curves of one kind are compared. */
export const COMPARED: Record<CurveKind, string[]> = {
  polarization: ['vAtRef', 'vAtRefIrFree', 'jAtRef', 'massActivity', 'peakPower', 'ocv', 'tafelSlope', 'hfr'],
  durability: ['degradationRate', 'breakInHours', 'onsetHours'],
  hold: ['holdDecay', 'holdLoss', 'degradationRate'],
  impedance: ['hfr', 'rct', 'cpeQ', 'cpeN'],
};

/** The one metric a curve is known by in a list. */
export const HEADLINE: Record<CurveKind, string> = { polarization: 'vAtRef', durability: 'degradationRate', hold: 'holdDecay', impedance: 'rct' };

/** new − record in the metric's display unit, signed: "+38 mV"; "—" when either is missing. */
export function formatDifference(key: string, value: number | null | undefined, reference: number | null | undefined): string {
  const info = METRICS[key];
  if (!info || value == null || reference == null) return '—';
  const d = (value - reference) * info.scale;
  const shown = formatNumber(Math.abs(d), info.digits);
  if (Number(shown.replace(/,/g, '')) === 0) return `±${shown} ${info.unit}`;
  return `${d > 0 ? '+' : '−'}${shown} ${info.unit}`;
}

export function referenceLine(settings: ProjectSettings): string {
  return `j_ref ${settings.refCurrentDensity} A/cm², V_ref ${settings.refVoltage} V${settings.irFree ? ', iR-free activity' : ''}, ${settings.loadingBasis} loading basis`;
}

export function uploadedOn(curve: CurveSummary): string {
  return `uploaded ${formatDateTime(curve.createdAt)}`;
}

/** The "curve of record" mark: a star and words, never colour alone. */
export function RecordMark({ className = '' }: { className?: string }) {
  return (
    <span className={`inline-flex shrink-0 items-center gap-1 rounded-full bg-moss-100 px-2 py-0.5 text-[11px] font-medium text-moss-700 ${className}`}>
      <svg aria-hidden width="10" height="10" viewBox="0 0 10 10"><path d="M5 .8 6.3 3.6l3 .3-2.3 2 .7 3L5 7.4 2.3 8.9l.7-3-2.3-2 3-.3z" fill="currentColor" /></svg>
      curve of record
    </span>
  );
}

