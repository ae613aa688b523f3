// Open-circuit holds compared across builds (decay rate with its interval, loss over the hold),
// and a survival-style comparison of accelerated tests: how many builds reached N hours before
// the onset of rapid failure, with the Kaplan–Meier step chart.
import { useRef } from 'react';
import { Link } from 'react-router-dom';
import type { DurabilityComparison, DurabilityRow } from '@shared/api-types';
import { LazyPlot } from '@/components/plot/lazy-plot';
import { PlotActions } from '@/components/plot/plot-actions';
import { OKABE_ITO, PLOT_FONT } from '@/components/plot/theme';
import { formatNumber } from '@/lib/format';

const fmt = (value: number | null, digits: number, unit: string) => (value == null ? '—' : `${formatNumber(value, digits)} ${unit}`);

function ruleWords(text: string | null): string {
  if (!text) return 'the default settling rule';
  try {
    const rule = JSON.parse(text) as { settleMinutes?: number; edgeMinutes?: number };
    return `first ${rule.settleMinutes ?? '?'} min skipped (settling); loss from the first and last ${rule.edgeMinutes ?? '?'} min of the rest`;
  } catch {
    return 'the stated settling rule';
  }
}

export function HoldComparison({ rows, projectId, title }: { rows: DurabilityRow[]; projectId: number; title: string }) {
  const box = useRef<HTMLDivElement>(null);
  const holds = rows.filter((r) => r.kind === 'hold');
  const shown = holds.filter((r) => r.holdDecay != null);
  const labels = shown.map((r) => `${r.code} · ${r.label.length > 22 ? `${r.label.slice(0, 21)}…` : r.label}`);
  const temperatures = [...new Set(shown.map((r) => fmt(r.temperatureC, 0, '°C')))].join(', ');
  return (
    <div>
      {shown.length > 0 && (
        <div ref={box}>
          <div className="mb-2 flex justify-end"><PlotActions target={box} fileName={`${title}-holds`} label="hold chart" /></div>
          <LazyPlot
            fileName={`${title}-holds`}
            title={`${title} · open-circuit holds`}
            subtitle={`voltage decay after settling, ± 95 % interval · ${temperatures || 'temperature not logged'}`}
            style={{ height: Math.max(240, 120 + 36 * shown.length) }}
            data={[{
              type: 'bar', orientation: 'h', x: shown.map((r) => r.holdDecay!), y: labels, name: 'decay',
              marker: { color: OKABE_ITO[4], line: { color: OKABE_ITO[0], width: 1 } },
              error_x: { type: 'data', symmetric: false, array: shown.map((r) => (r.holdDecayHigh ?? r.holdDecay!) - r.holdDecay!), arrayminus: shown.map((r) => r.holdDecay! - (r.holdDecayLow ?? r.holdDecay!)), color: OKABE_ITO[7], thickness: 1.4, width: 4 },
              hovertemplate: '%{y}<br>%{x:.2f} mV/h<extra></extra>',
            }] as never}
            layout={{ xaxis: { title: { text: 'Open-circuit voltage decay (mV/h)' }, rangemode: 'tozero' }, yaxis: { autorange: 'reversed', tickfont: { family: PLOT_FONT, size: 11 }, showgrid: false }, height: Math.max(240, 120 + 36 * shown.length), showlegend: false } as never}
          />
        </div>
      )}
      <table className="mt-3 w-full text-sm">
        <caption className="sr-only">Open-circuit holds of the project’s builds</caption>
        <thead>
          <tr className="border-b border-line text-left text-xs text-ink-500">
            <th className="px-3 py-2">Build</th><th className="px-3 py-2">Hold</th><th className="px-3 py-2 text-right">Decay (mV/h)</th><th className="px-3 py-2 text-right">95 % interval (mV/h)</th>
            <th className="px-3 py-2 text-right">Loss (mV)</th><th className="px-3 py-2 text-right">Hours</th><th className="px-3 py-2 text-right">T</th><th className="px-3 py-2">Settling rule</th>
          </tr>
        </thead>
        <tbody>
          {holds.map((r) => (
            <tr key={r.curveId} className="border-b border-line/60">
              <td className="px-3 py-1.5"><Link className="font-medium text-copper-700 hover:underline" to={`/projects/${projectId}/builds/${r.buildId}`}>{r.code}</Link></td>
              <td className="px-3 py-1.5 text-xs">{r.label}</td>
              <td className="num px-3 py-1.5 text-right">{r.holdDecay == null ? '—' : formatNumber(r.holdDecay, 2)}</td>
              <td className="num whitespace-nowrap px-3 py-1.5 text-right text-xs">{r.holdDecayLow == null || r.holdDecayHigh == null ? '—' : `${formatNumber(r.holdDecayLow, 3)} – ${formatNumber(r.holdDecayHigh, 3)}`}</td>
              <td className="num px-3 py-1.5 text-right">{r.holdLoss == null ? '—' : formatNumber(r.holdLoss, 1)}</td>
              <td className="num px-3 py-1.5 text-right">{fmt(r.hoursRun, 0, 'h')}</td>
              <td className="num px-3 py-1.5 text-right">{fmt(r.temperatureC, 0, '°C')}</td>
              <td className="px-3 py-1.5 text-xs text-ink-500">{ruleWords(r.holdRule)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function onsetRuleWords(rule: DurabilityComparison['onsetRule']): string {
  return `two-piece line fit of voltage against time after break-in (${rule.blockHours} h blocks); onset where the loss rate after the break is at least ${rule.minRateRatio}× the stable rate and ${rule.minRateIncreaseUvPerH} µV/h above it, significant at p < ${rule.alpha}, with at least ${rule.minStableHours} h before and ${rule.minTailHours} h after`;
}

export function SurvivalPanel({ data, title }: { data: DurabilityComparison; title: string }) {
  const box = useRef<HTMLDivElement>(null);
  const survival = data.survival;
  if (!survival) return <p className="text-sm text-ink-500">Upload constant-current logs to compare how long builds last before rapid failure.</p>;
  const longest = Math.max(...survival.units.map((u) => u.hours));
  // step chart: start at 1, drop at each failure time, end at the longest log
  const x = [0];
  const y = [1];
  for (const step of survival.steps) { x.push(step.hours); y.push(step.survival); }
  x.push(longest);
  y.push(y[y.length - 1]!);
  const censored = survival.units.filter((u) => !u.failed);
  const failures = survival.units.filter((u) => u.failed).length;
  return (
    <div>
      <div ref={box}>
        <div className="mb-2 flex justify-end"><PlotActions target={box} fileName={`${title}-survival`} label="survival chart" /></div>
        <LazyPlot
          fileName={`${title}-survival`}
          title={`${title} · time to failure onset`}
          subtitle={`Kaplan–Meier estimate over ${survival.units.length} build${survival.units.length === 1 ? '' : 's'} · ${failures} with an onset · logs that ended without one counted as still running (+)`}
          style={{ height: 320 }}
          data={[
            { type: 'scatter', mode: 'lines', line: { shape: 'hv', color: OKABE_ITO[0], width: 2 }, x, y, name: 'share of builds without onset', hovertemplate: '%{x:.0f} h: %{y:.0%}<extra></extra>' },
            { type: 'scatter', mode: 'markers', x: censored.map((u) => u.hours), y: censored.map((u) => { let s = 1; for (const step of survival.steps) if (step.hours <= u.hours) s = step.survival; return s; }), marker: { symbol: 'cross-thin-open', size: 10, color: OKABE_ITO[7], line: { width: 2 } }, name: 'log ended without onset', text: censored.map((u) => u.code), hovertemplate: '%{text}: log ended at %{x:.0f} h<extra></extra>' },
          ] as never}
          layout={{ xaxis: { title: { text: 'Hours under test' }, rangemode: 'tozero' }, yaxis: { title: { text: 'Builds without onset' }, range: [0, 1.05], tickformat: '.0%' }, height: 320, legend: { orientation: 'h', y: -0.3 } } as never}
        />
      </div>
      <ul className="mt-2 space-y-0.5 text-sm text-ink-800" aria-label="Builds that reached each milestone">
        {survival.reached.map((r) => <li key={r.hours}>{r.summary}</li>)}
      </ul>
      <p className="mt-2 text-xs text-ink-500">Onset rule: {onsetRuleWords(data.onsetRule)}. A project setting or a curve’s own option changes it; the rule used is stored with each log’s result. {survival.method}</p>
    </div>
  );
}
