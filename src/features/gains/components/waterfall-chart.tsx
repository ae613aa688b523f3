// The gains waterfall: baseline bar, one floating bar per step (up and down told apart by colour,
// hatching and sign), the total bar, 95 % intervals as whiskers, "within noise" steps faded and
// labelled. Exports PNG and SVG through the plot's own image export.
import { useRef } from 'react';
import { LazyPlot } from '@/components/plot/lazy-plot';
import { PlotActions } from '@/components/plot/plot-actions';
import { OKABE_ITO, PLOT_COLORS, PLOT_FONT } from '@/components/plot/theme';
import type { GainsData } from '../api/get-gains';
import { displayOf, showGain, showValue } from './display';
import { gainsCsv } from './gains-table';
import { waterfallExportLayout } from './waterfall-export';

const UP = OKABE_ITO[2]!;
const DOWN = OKABE_ITO[3]!;
const LEVEL = '#2c3c63';

/** Under the build code: what kind of change the step was, when it was not the electrode alone. */
const CLASS_TICK: Record<string, string> = { 'test-conditions': '<br><i>test conditions</i>', mixed: '<br><i>electrode + test</i>', unchanged: '<br><i>repeat</i>' };

const wrap = (text: string, width = 22): string => {
  const words = text.split(/\s+/);
  const lines: string[] = [];
  let line = '';
  for (const word of words) {
    if ((line + ' ' + word).trim().length > width && line) { lines.push(line); line = word; } else line = (line + ' ' + word).trim();
  }
  if (line) lines.push(line);
  return lines.slice(0, 3).join('<br>') + (lines.length > 3 ? '…' : '');
};

/** the target line's colour */
const TARGET_LINE = PLOT_COLORS.target;

/** A target drawn as a dashed line: its label and value in the response's own unit (data.unit). */
export interface WaterfallTarget { label: string; value: number }

/**
 * `project`: the project's name, for the title block of an exported image; `benchmark`: the
 * benchmark's value of the response (in its own unit), drawn as a grey dashed line.
 */
export function WaterfallChart({ data, subtitle, fileName, targets = [], project, benchmark }: { data: GainsData; subtitle: string; fileName: string; targets?: WaterfallTarget[]; project?: string; benchmark?: WaterfallTarget | null }) {
  const ref = useRef<HTMLElement>(null);
  const d = displayOf(data.response);
  const s = d.scale;
  const steps = data.steps;
  const x = [...steps.map((st) => st.code), 'Total'];
  const tick = [
    `${steps[0].code}<br>baseline`,
    ...steps.slice(1).map((st) => `${st.code}${CLASS_TICK[st.changeClass ?? ''] ?? ''}<br>${wrap(st.changeNote ?? st.changeText ?? '')}`),
    `Total<br>${steps[0].code} → ${steps[steps.length - 1].code}`,
  ];
  const levels: number[] = [];
  for (const st of steps) levels.push(st.value * s);
  const gains = steps.slice(1).map((st) => (st.gain ?? 0) * s);
  const floor = Math.min(...levels);
  const ceil = Math.max(...levels);
  const span = Math.max(ceil - floor, Math.abs(levels[0]) * 0.01, 1e-9);
  // Intervals can reach beyond the bars: make room for the whiskers.
  let low = floor;
  let high = ceil;
  steps.forEach((st, k) => {
    if (k === 0 || st.low == null || st.high == null) return;
    const before = levels[k - 1];
    low = Math.min(low, before + st.low * s);
    high = Math.max(high, before + st.high * s);
  });
  for (const t of [...targets, ...(benchmark ? [benchmark] : [])]) {
    low = Math.min(low, t.value * s);
    high = Math.max(high, t.value * s);
  }
  const pad = Math.max(span, high - low) * 0.22;
  const range = [low - pad, high + pad];

  const barText = [
    showValue(d, steps[0].value),
    ...steps.slice(1).map((st) => `${showGain(d, st.gain)}${st.withinNoise ? '<br>within noise' : ''}`),
    `${showGain(d, data.total.gain)}<br>${showValue(d, data.total.value)}`,
  ];
  const colours = [LEVEL, ...steps.slice(1).map((st) => ((st.gain ?? 0) >= 0 ? UP : DOWN)), LEVEL];
  // hatched: a loss; dotted: a step that changed the test conditions rather than the electrode
  const patterns = ['', ...steps.slice(1).map((st) => (st.changeClass === 'test-conditions' || st.changeClass === 'mixed' ? '.' : (st.gain ?? 0) >= 0 ? '' : '/')), ''];
  const opacity = [1, ...steps.slice(1).map((st) => (st.withinNoise ? 0.45 : 1)), 1];
  // Level bars rise from below the visible range so the axis can start near the baseline.
  const bottom = range[0] - Math.abs(range[1] - range[0]);
  const base = [bottom, ...steps.slice(1).map((_st, k) => levels[k]), bottom];
  const y = [levels[0] - bottom, ...gains, levels[levels.length - 1] - bottom];

  const whiskerX: string[] = [];
  const whiskerY: number[] = [];
  const plus: number[] = [];
  const minus: number[] = [];
  steps.forEach((st, k) => {
    if (k === 0 || st.low == null || st.high == null || st.gain == null) return;
    whiskerX.push(st.code);
    whiskerY.push(levels[k]);
    plus.push((st.high - st.gain) * s);
    minus.push((st.gain - st.low) * s);
  });
  if (data.total.low != null && data.total.high != null) {
    whiskerX.push('Total');
    whiskerY.push(levels[levels.length - 1]);
    plus.push((data.total.high - data.total.gain) * s);
    minus.push((data.total.gain - data.total.low) * s);
  }
  // Each label sits above the higher of its bar's top and its whisker's top, so none covers a whisker.
  const whiskerTop = new Map(whiskerX.map((code, k) => [code, whiskerY[k]! + plus[k]!]));
  const labelY = x.map((code, k) => {
    const barTop = k === 0 ? levels[0]! : k === x.length - 1 ? levels[levels.length - 1]! : Math.max(levels[k - 1]!, levels[k]!);
    return Math.max(barTop, whiskerTop.get(code) ?? -Infinity);
  });
  const labels = x.map((code, k) => ({ xref: 'x', yref: 'y', x: code, y: labelY[k], yanchor: 'bottom', yshift: 3, text: barText[k], showarrow: false, font: { family: PLOT_FONT, size: 11, color: PLOT_COLORS.ink } }));
  const connectors = levels.map((level, k) => ({ type: 'line', xref: 'x', yref: 'y', x0: k + 0.4, x1: k + 0.6, y0: level, y1: level, line: { color: PLOT_COLORS.axis, width: 1, dash: 'dot' } }));

  return (
    <div>
      <figure ref={ref} aria-label={`Gains waterfall of ${d.label} from ${steps[0].code} to ${steps[steps.length - 1].code}`}>
        <LazyPlot
          fileName={fileName}
          title={`${d.label} from ${steps[0].code} to ${steps[steps.length - 1].code}`}
          subtitle={subtitle}
          data={[
            {
              type: 'bar',
              x,
              y,
              base,
              text: barText,
              textposition: 'none',
              cliponaxis: false,
              marker: { color: colours, opacity, line: { color: colours, width: 1.5 }, pattern: { shape: patterns, fgcolor: '#ffffff', size: 6, solidity: 0.3 } },
              hovertemplate: '%{text}<extra></extra>',
              name: 'steps',
              showlegend: false,
            },
            {
              type: 'scatter',
              mode: 'markers',
              x: whiskerX,
              y: whiskerY,
              marker: { size: 1, color: PLOT_COLORS.ink },
              error_y: { type: 'data', symmetric: false, array: plus, arrayminus: minus, color: PLOT_COLORS.ink, thickness: 1.4, width: 6 },
              name: `${Math.round(data.confidence * 100)} % interval`,
              showlegend: false,
              hoverinfo: 'skip',
            },
          ] as never}
          layout={{
            barmode: 'overlay',
            xaxis: { tickmode: 'array', tickvals: x, ticktext: tick, tickfont: { family: PLOT_FONT, size: 11 }, showgrid: false },
            yaxis: { title: { text: `${d.label} (${d.unit})` }, range, zeroline: false },
            shapes: [
              ...connectors,
              ...targets.map((t) => ({ type: 'line', xref: 'paper', yref: 'y', x0: 0, x1: 1, y0: t.value * s, y1: t.value * s, line: { color: TARGET_LINE, width: 1.5, dash: 'dash' } })),
              ...(benchmark ? [{ type: 'line', xref: 'paper', yref: 'y', x0: 0, x1: 1, y0: benchmark.value * s, y1: benchmark.value * s, line: { color: PLOT_COLORS.benchmark, width: 1.5, dash: 'dash' } }] : []),
            ],
            annotations: [
              ...labels,
              ...targets.map((t) => ({ xref: 'paper', yref: 'y', x: 0, y: t.value * s, xanchor: 'left', yanchor: 'bottom', text: `target: ${t.label}`, showarrow: false, font: { size: 11, color: TARGET_LINE } })),
              ...(benchmark ? [{ xref: 'paper', yref: 'y', x: 1, y: benchmark.value * s, xanchor: 'right', yanchor: 'top', text: `benchmark ${benchmark.label}: ${showValue(d, benchmark.value)}`, showarrow: false, bgcolor: 'rgba(255,255,255,0.85)', borderpad: 2, font: { size: 11, color: PLOT_COLORS.benchmark } }] : []),
            ],
            height: 470,
          } as never}
          style={{ height: 470 }}
        />
      </figure>
      {data.byClass && (
        <p className="mt-2 text-sm text-ink-700">
          Total {showGain(d, data.total.gain)}: electrode changes {showGain(d, data.byClass.recipeOnlyTotal)}
          {data.byClass.testConditionTotal !== 0 && <>, test-condition changes {showGain(d, data.byClass.testConditionTotal)}</>}
          {data.byClass.mixedTotal !== 0 && <>, steps that changed both {showGain(d, data.byClass.mixedTotal)}</>}.
        </p>
      )}
      <div className="mt-2 flex flex-wrap items-center gap-3 text-xs text-ink-500">
        <span className="flex items-center gap-1"><svg aria-hidden width="12" height="12"><rect width="12" height="12" fill={UP} /></svg> gain (up)</span>
        <span className="flex items-center gap-1"><svg aria-hidden width="12" height="12"><rect width="12" height="12" fill={DOWN} /><path d="M0 12 12 0" stroke="#fff" strokeWidth="2" /></svg> loss (down, hatched)</span>
        <span className="flex items-center gap-1"><svg aria-hidden width="12" height="12"><rect width="12" height="12" fill={UP} opacity="0.45" /></svg> faded = within noise (interval contains zero)</span>
        <span className="flex items-center gap-1"><svg aria-hidden width="12" height="12"><rect width="12" height="12" fill={UP} /><circle cx="4" cy="4" r="1.4" fill="#fff" /><circle cx="9" cy="9" r="1.4" fill="#fff" /></svg> dotted = the step changed test conditions</span>
        <span>whiskers: {Math.round(data.confidence * 100)} % interval of each step · the axis does not start at zero</span>
        {benchmark && <span className="flex items-center gap-1"><svg aria-hidden width="16" height="12"><path d="M0 6h16" stroke={PLOT_COLORS.benchmark} strokeWidth="1.5" strokeDasharray="4 2" /></svg> benchmark {benchmark.label}</span>}
        <span className="ml-auto">
          <PlotActions
            target={ref}
            fileName={fileName}
            csv={() => gainsCsv(data)}
            label="waterfall"
            exportLayout={() => waterfallExportLayout({ project: project ?? '', label: d.label, unit: d.unit, from: steps[0].code, to: steps[steps.length - 1].code, conditions: subtitle, date: new Date().toISOString().slice(0, 10), confidencePercent: Math.round(data.confidence * 100), targets, benchmark: benchmark?.label ?? null, width: ref.current?.getBoundingClientRect().width })}
          />
        </span>
      </div>
    </div>
  );
}
