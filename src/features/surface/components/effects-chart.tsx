// "What matters": every term of the fitted model as the change it makes in the response's own
// unit over its factor's range, largest first, with 95 % intervals — a chart and, for reading
// and screen readers, the same effects as sentences.
import { useRef } from 'react';
import type { Effect } from '@shared/doe/model/index';
import { LazyPlot, OKABE_ITO, exportPlot } from '@/components/plot/lazy-plot';
import { Button } from '@/components/ui/button';
import type { SurfaceResult } from '../api/surface';
import { displayOf, showSigned, showSpread } from './display';

const CLEAR_UP = OKABE_ITO[0]!;
const CLEAR_DOWN = OKABE_ITO[3]!;
const UNCLEAR = '#8a94ab';

function tone(e: Effect) {
  if (!e.clear) return { color: UNCLEAR, word: 'within noise', symbol: 'circle-open' };
  return e.effect > 0 ? { color: CLEAR_UP, word: 'raises it', symbol: 'circle' } : { color: CLEAR_DOWN, word: 'lowers it', symbol: 'diamond' };
}

export function EffectsChart({ result, subtitle }: { result: SurfaceResult; subtitle: string }) {
  const box = useRef<HTMLDivElement>(null);
  const d = displayOf(result.response);
  const effects = result.effects;
  if (effects.length === 0) return <p className="text-sm text-ink-500">The model has no terms besides the constant, so no factor shows an effect yet.</p>;
  // plotly draws the first category at the bottom: reverse so the largest sits on top
  const shown = [...effects].reverse();
  const labels = shown.map((e) => e.label);
  const x = shown.map((e) => e.effect * d.scale);
  const plus = shown.map((e) => (e.high - e.effect) * d.scale);
  const minus = shown.map((e) => (e.effect - e.low) * d.scale);
  const hover = shown.map((e) => `${e.label}: ${showSigned(e.effect, d, e.high - e.effect)} ± ${showSpread(e.high - e.effect, d)}<br>${e.meaning}`);
  const height = Math.max(220, 70 + 34 * effects.length);
  return (
    <div ref={box} className="flex flex-col gap-3">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="text-sm text-ink-700">
          Each bar is what a term does to {d.label} over its factor's range, in {d.unit || 'the response unit'}; the line is its 95 % interval.
          <span className="ml-1 text-ink-500">● raises it · ◆ lowers it · ○ within noise (the interval crosses zero).</span>
        </p>
        <span className="flex gap-1.5">
          <Button onClick={() => exportPlot(box.current, 'png', `effects-${result.response.key}`)}>PNG</Button>
          <Button onClick={() => exportPlot(box.current, 'svg', `effects-${result.response.key}`)}>SVG</Button>
        </span>
      </div>
      <LazyPlot
        fileName={`effects-${result.response.key}`}
        style={{ height }}
        data={[
          {
            type: 'scatter',
            mode: 'markers',
            orientation: 'h',
            x,
            y: labels,
            error_x: { type: 'data', symmetric: false, array: plus, arrayminus: minus, color: '#56668c', thickness: 1.5, width: 5 },
            marker: { size: 11, color: shown.map((e) => tone(e).color), symbol: shown.map((e) => tone(e).symbol), line: { width: 1.5, color: shown.map((e) => tone(e).color) } },
            text: hover,
            hovertemplate: '%{text}<extra></extra>',
            name: 'effect',
          },
        ]}
        layout={{
          title: { text: `What moves ${d.label}<br><span style="font-size:11px;color:#56668c">${subtitle}</span>` },
          xaxis: { title: { text: `Effect (${d.unit})` }, zeroline: true, zerolinecolor: '#18233d', zerolinewidth: 1.5, gridcolor: '#eeeae2' },
          yaxis: { automargin: true, tickfont: { size: 12 } },
          showlegend: false,
          margin: { l: 16, r: 24, t: 56, b: 52 },
        }}
        config={{ displayModeBar: false }}
      />
      <ol aria-label="Effects, largest first" className="grid gap-1 text-sm sm:grid-cols-2">
        {effects.map((e) => (
          <li key={e.term} className="flex gap-2">
            <span aria-hidden style={{ color: tone(e).color }}>{e.clear ? (e.effect > 0 ? '●' : '◆') : '○'}</span>
            <span>
              <span className="font-medium text-ink-900">{e.label}:</span>{' '}
              <span className="num">{showSigned(e.effect, d, e.high - e.effect)} ± {showSpread(e.high - e.effect, d)}</span>
              <span className="text-ink-500"> — {e.meaning}; {tone(e).word}.</span>
            </span>
          </li>
        ))}
      </ol>
    </div>
  );
}
