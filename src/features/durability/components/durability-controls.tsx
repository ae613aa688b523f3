// Durability options of one log: break-in (typed, or the detected one), rate windows, the loss that
// counts as end of life, with the results beside them and the typical band for comparison.
import { useState } from 'react';
import type { CurveSummary } from '@shared/api-types';
import type { CurvePatch } from '@shared/schemas/curves';
import { TYPICAL_DEGRADATION_BAND } from '@shared/durability/typical-band';
import { Button } from '@/components/ui/button';
import { Input } from '@/components/ui/field';
import { ErrorNote } from '@/components/ui/panel';
import { formatNumber } from '@/lib/format';

export interface Interruption { kind: string; startHours: number; endHours: number; detail: string }
interface Window { fromHours: number; toHours: number; rate: number | null; low: number | null; high: number | null; n: number }

export function parseList<T>(value: unknown): T[] {
  try {
    const list = JSON.parse(String(value ?? '[]')) as T[];
    return Array.isArray(list) ? list : [];
  } catch {
    return [];
  }
}

const n = (value: unknown): number | null => (typeof value === 'number' && Number.isFinite(value) ? value : null);
const rateText = (rate: number | null, low: number | null, high: number | null) =>
  rate == null ? '—' : `${formatNumber(rate, digitsFor(low, high))} µV/h${low != null && high != null ? ` (95 % ${formatNumber(low, digitsFor(low, high))} – ${formatNumber(high, digitsFor(low, high))})` : ''}`;

/** Enough decimals that a narrow interval does not print as "8.0 – 8.0". */
function digitsFor(low: number | null, high: number | null): number {
  if (low == null || high == null) return 1;
  const width = Math.abs(high - low);
  return width >= 1 ? 1 : width >= 0.1 ? 2 : 3;
}

/** Where a rate sits against the typical band, in words (not colour alone). */
export function bandWord(rate: number | null): string {
  if (rate == null) return '';
  const [low, high] = TYPICAL_DEGRADATION_BAND.standard;
  if (rate <= TYPICAL_DEGRADATION_BAND.improved) return 'at or below the improved ≈5 µV/h';
  if (rate < low) return 'between improved and standard';
  if (rate <= high) return 'within the standard 10–15 µV/h';
  return 'above the standard band';
}

/** A change of a log's durability options (the body of PATCH /api/curves/:id, with the curve). */
export type DurabilityOptionsChange = Omit<CurvePatch, 'label'> & { curveId: number };

/** How the page saves a change: the curves feature's update mutation, handed in by the page. */
export interface DurabilityOptionsUpdate {
  mutate(change: DurabilityOptionsChange, options?: { onSuccess?: (answer: { curve: CurveSummary }) => void }): void;
  error: unknown;
}

export function DurabilityControls({ curve, update, canEdit }: { curve: CurveSummary; update: DurabilityOptionsUpdate; canEdit: boolean }) {
  const s = curve.summary;
  const options = (curve.options ?? {}) as { breakInHours?: number; windows?: { fromHours: number; toHours: number }[]; lossFraction?: number };
  const [breakIn, setBreakIn] = useState(String(curve.metrics.breakInHours ?? ''));
  const [from, setFrom] = useState('');
  const [to, setTo] = useState('');
  const [loss, setLoss] = useState(String(Math.round((n(s.lossFraction) ?? options.lossFraction ?? 0.1) * 1000) / 10));
  const windows = parseList<Window>(s.windows);
  const interruptions = parseList<Interruption>(s.interruptions);
  const rate = curve.metrics.degradationRate ?? null;
  const lossFraction = n(s.lossFraction) ?? 0.1;
  const hoursToLoss = n(s.hoursToLoss);
  const projected = n(s.projectedHoursToLoss);
  const source = String(s.breakInSource ?? 'detected');
  const isHold = curve.kind === 'hold';
  const onsetRule = (() => { try { return JSON.parse(String(s.onsetRule ?? '{}')) as { minRateRatio?: number; minRateIncreaseUvPerH?: number; alpha?: number; startHours?: number }; } catch { return {}; } })();
  const [ratio, setRatio] = useState(String(onsetRule.minRateRatio ?? 3));
  const [rise, setRise] = useState(String(onsetRule.minRateIncreaseUvPerH ?? 20));
  const ownOnsetRule = Boolean((curve.options as { onsetRule?: unknown } | null)?.onsetRule);

  return (
    <div className="space-y-4 text-sm">
      <dl className="grid grid-cols-2 gap-x-6 gap-y-2">
        <div className="col-span-2" title={curve.method.degradationRate?.method}>
          <dt className="text-xs text-ink-500">{isHold ? 'Voltage loss rate (open-circuit hold)' : 'Degradation rate'} (positive = losing voltage)</dt>
          <dd className="num text-[15px]">{rateText(rate, n(s.degradationLow), n(s.degradationHigh))}</dd>
          {!isHold && rate != null && <dd className="text-[11px] text-ink-500">Typical HT-PEM: {TYPICAL_DEGRADATION_BAND.standard[0]}–{TYPICAL_DEGRADATION_BAND.standard[1]} µV/h standard, ≈{TYPICAL_DEGRADATION_BAND.improved} µV/h improved — this log is {bandWord(rate)}.</dd>}
          {n(s.fitFromHours) != null && <dd className="num text-[11px] text-ink-500">fitted {formatNumber(n(s.fitFromHours)!, 0)} – {formatNumber(n(s.fitToHours)!, 0)} h</dd>}
        </div>
        <div><dt className="text-xs text-ink-500">Hours run</dt><dd className="num">{n(s.hoursRun) == null ? '—' : `${formatNumber(n(s.hoursRun)!, 0)} h`}</dd></div>
        <div><dt className="text-xs text-ink-500">Voltage loss over the fit</dt><dd className="num">{n(s.voltageLossMv) == null ? '—' : `${formatNumber(n(s.voltageLossMv)!, 1)} mV`}</dd></div>
        <div>
          <dt className="text-xs text-ink-500">Hours to {formatNumber(lossFraction * 100, 1)} % loss</dt>
          <dd className="num">{hoursToLoss != null ? `${formatNumber(hoursToLoss, 0)} h` : 'not reached'}</dd>
          {hoursToLoss == null && projected != null && <dd className="num text-[11px] text-amber-700">projection: ≈{formatNumber(projected, 0)} h if the line holds (extrapolated past the data)</dd>}
        </div>
        {!isHold && (
          <div className="col-span-2" title={curve.method.onsetHours?.method}>
            <dt className="text-xs text-ink-500">Onset of rapid failure</dt>
            <dd className="num">{curve.metrics.onsetHours == null ? 'none found' : `${formatNumber(curve.metrics.onsetHours, 0)} h`}{n(s.onsetLowHours) != null && n(s.onsetHighHours) != null && curve.metrics.onsetHours != null ? <span className="text-[11px] text-ink-500"> (range {formatNumber(n(s.onsetLowHours)!, 0)} – {formatNumber(n(s.onsetHighHours)!, 0)} h)</span> : null}</dd>
            <dd className="text-[11px] text-ink-500">Rule{ownOnsetRule ? ' (set for this log)' : ''}: after break-in, the loss rate after the break at least {onsetRule.minRateRatio ?? 3}× the stable rate and {onsetRule.minRateIncreaseUvPerH ?? 20} µV/h above it, significant at p &lt; {onsetRule.alpha ?? 0.001}.{curve.metricNotes.onsetHours ? ` ${curve.metricNotes.onsetHours}` : ''}</dd>
          </div>
        )}
        {isHold && (
          <>
            <div title={curve.method.holdDecay?.method}><dt className="text-xs text-ink-500">Hold decay</dt><dd className="num">{curve.metrics.holdDecay == null ? '—' : `${formatNumber(curve.metrics.holdDecay, 2)} mV/h`}</dd></div>
            <div title={curve.method.holdLoss?.method}><dt className="text-xs text-ink-500">Loss over the hold</dt><dd className="num">{curve.metrics.holdLoss == null ? '—' : `${formatNumber(curve.metrics.holdLoss, 1)} mV`}</dd></div>
            <div className="col-span-2"><dt className="sr-only">Settling rule</dt><dd className="text-[11px] text-ink-500">Settling rule: the first minutes after the load is removed are skipped ({(() => { try { const r = JSON.parse(String(s.holdRule ?? '{}')) as { settleMinutes?: number; edgeMinutes?: number }; return `${r.settleMinutes ?? 15} min; loss from the first and last ${r.edgeMinutes ?? 10} min of the rest`; } catch { return '15 min'; } })()}).</dd></div>
          </>
        )}
        <div><dt className="text-xs text-ink-500">Break-in</dt><dd className="num">{curve.metrics.breakInHours == null ? '—' : `${formatNumber(curve.metrics.breakInHours, 0)} h`} <span className="text-[11px] text-ink-500">({source === 'user' ? 'set by hand' : source})</span></dd></div>
      </dl>
      {curve.metricNotes.degradationRate && <p className="text-xs text-amber-700">{curve.metricNotes.degradationRate}</p>}
      <p className="text-[11px] text-ink-500">Break-in rule: {String(s.breakInRule ?? curve.method.breakInHours?.method ?? 'the early period before the voltage settles')}. It is left out of the rate.</p>

      <div>
        <h4 className="text-xs font-semibold text-ink-700">Interruptions ({interruptions.length})</h4>
        {interruptions.length === 0 ? <p className="text-xs text-ink-500">None found: no gaps, current changes or restarts.</p> : (
          <ul className="mt-1 space-y-0.5 text-xs" aria-label="Interruptions">
            {interruptions.map((i, k) => <li key={k}><span className="font-medium">{i.kind}</span> at <span className="num">{formatNumber(i.startHours, 1)} h</span> — {i.detail}</li>)}
          </ul>
        )}
        <p className="mt-1 text-[11px] text-ink-500">Restarts and current changes split the fit into segments; it is never drawn through them.</p>
      </div>

      <div>
        <h4 className="text-xs font-semibold text-ink-700">Rates over chosen windows</h4>
        {windows.length === 0 ? <p className="text-xs text-ink-500">No windows yet.</p> : (
          <table className="mt-1 text-xs">
            <thead><tr className="text-left text-ink-500"><th className="pr-3">from (h)</th><th className="pr-3">to (h)</th><th className="pr-3">rate</th><th /></tr></thead>
            <tbody>
              {windows.map((w, k) => (
                <tr key={k}>
                  <td className="num pr-3">{formatNumber(w.fromHours, 0)}</td>
                  <td className="num pr-3">{formatNumber(w.toHours, 0)}</td>
                  <td className="num pr-3">{rateText(w.rate, w.low, w.high)}</td>
                  <td>{canEdit && <Button variant="ghost" onClick={() => update.mutate({ curveId: curve.id, windows: (options.windows ?? []).filter((_, i) => i !== k) })}>Remove</Button>}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </div>

      {canEdit && (
        <div className="space-y-3 rounded-md border border-line bg-paper/40 p-3">
          <div className="flex flex-wrap items-end gap-2">
            <label className="text-xs text-ink-700">Break-in ends at (h)
              <Input type="number" min={0} step="any" className="w-28" value={breakIn} onChange={(e) => setBreakIn(e.target.value)} aria-label="Break-in ends at (h)" />
            </label>
            <Button disabled={breakIn === '' || !(Number(breakIn) >= 0)} onClick={() => update.mutate({ curveId: curve.id, breakInHours: Number(breakIn) })}>Set break-in</Button>
            <Button variant="ghost" disabled={source !== 'user'} onClick={() => update.mutate({ curveId: curve.id, breakInHours: null }, { onSuccess: (r) => setBreakIn(String(r.curve.metrics.breakInHours ?? '')) })}>Use detected</Button>
          </div>
          <div className="flex flex-wrap items-end gap-2">
            <label className="text-xs text-ink-700">Window from (h)<Input type="number" min={0} step="any" className="w-24" value={from} onChange={(e) => setFrom(e.target.value)} aria-label="Window from (h)" /></label>
            <label className="text-xs text-ink-700">to (h)<Input type="number" min={0} step="any" className="w-24" value={to} onChange={(e) => setTo(e.target.value)} aria-label="Window to (h)" /></label>
            <Button disabled={from === '' || to === '' || !(Number(to) > Number(from))} onClick={() => update.mutate({ curveId: curve.id, windows: [...(options.windows ?? []), { fromHours: Number(from), toHours: Number(to) }] }, { onSuccess: () => { setFrom(''); setTo(''); } })}>Add window</Button>
          </div>
          {!isHold && (
            <div className="flex flex-wrap items-end gap-2">
              <label className="text-xs text-ink-700">Onset: rate after ≥ × stable
                <Input type="number" min={1} max={100} step="any" className="w-24" value={ratio} onChange={(e) => setRatio(e.target.value)} aria-label="Onset rate ratio" />
              </label>
              <label className="text-xs text-ink-700">and rise ≥ (µV/h)
                <Input type="number" min={0} step="any" className="w-24" value={rise} onChange={(e) => setRise(e.target.value)} aria-label="Onset rate rise (µV/h)" />
              </label>
              <Button disabled={!(Number(ratio) >= 1) || !(Number(rise) >= 0)} onClick={() => update.mutate({ curveId: curve.id, onsetRule: { minRateRatio: Number(ratio), minRateIncreaseUvPerH: Number(rise) } })}>Set onset rule</Button>
              <Button variant="ghost" disabled={!ownOnsetRule} onClick={() => update.mutate({ curveId: curve.id, onsetRule: null })}>Use project rule</Button>
            </div>
          )}
          <div className="flex flex-wrap items-end gap-2">
            <label className="text-xs text-ink-700">End-of-life loss (% of voltage)
              <Input type="number" min={0.1} max={99} step="any" className="w-24" value={loss} onChange={(e) => setLoss(e.target.value)} aria-label="End-of-life loss (%)" />
            </label>
            <Button disabled={!(Number(loss) > 0 && Number(loss) < 100)} onClick={() => update.mutate({ curveId: curve.id, lossFraction: Number(loss) / 100 })}>Set loss</Button>
          </div>
          <ErrorNote error={update.error} />
        </div>
      )}
    </div>
  );
}
