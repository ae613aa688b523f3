// "What if": type a recipe and read the predicted response with its interval, whether the
// builds support the model there, and whether physics allows the number; below, a map of two
// chosen factors with the others at the typed values, the edge of the builds' support drawn on
// it, and a 3-D view only when asked for. Everything is computed in the browser from the fit.
import { useMemo, useRef, useState } from 'react';
import type { FactorDef } from '@shared/api-types';
import { checkSupport, predict } from '@shared/doe/model/index';
import { boundPrediction, limitsAt } from '@shared/doe/limits/index';
import { LazyPlot, OKABE_ITO, exportPlot } from '@/components/plot/lazy-plot';
import { Button } from '@/components/ui/button';
import { Field, Input, Select } from '@/components/ui/field';
import type { SurfaceResult } from '../api/surface';
import { displayOf, show, showSetting, showSpread } from './display';

export type Recipe = Record<string, number | string>;

/** The best build in the fit by the response's goal: the natural place to start asking "what if". */
export function startingRecipe(result: SurfaceResult): Recipe {
  const goal = result.response.goal;
  const target = result.response.target;
  let best = result.runs[0];
  for (const run of result.runs) {
    const score = (v: number) => (goal === 'minimize' ? -v : goal === 'target' && target != null ? -Math.abs(v - target) : v);
    if (best && score(run.observed) > score(best.observed)) best = run;
  }
  const recipe: Recipe = {};
  for (const f of result.factors) recipe[f.key] = best?.factors[f.key] ?? (f.kind === 'continuous' ? ((f.low ?? 0) + (f.high ?? 1)) / 2 : (f.levels ?? [''])[0]!);
  return recipe;
}

/** The two continuous factors with the largest main effects, for the map's axes. */
export function defaultAxes(result: SurfaceResult): [string, string] {
  const continuous = result.factors.filter((f) => f.kind === 'continuous').map((f) => f.key);
  const size = (key: string) => Math.abs(result.effects.find((e) => e.term === key)?.effect ?? 0);
  const sorted = [...continuous].sort((a, b) => size(b) - size(a));
  return [sorted[0] ?? '', sorted[1] ?? sorted[0] ?? ''];
}

function usePrediction(result: SurfaceResult, recipe: Recipe, format: (v: number) => string) {
  return useMemo(() => {
    try {
      const p = predict(result.fit, recipe);
      const limit = boundPrediction(limitsAt(result.limits, recipe), p.value, p.piLow, p.piHigh, format);
      const support = checkSupport(result.fit, recipe);
      return { p, limit, support, error: null as string | null };
    } catch (e) {
      return { p: null, limit: null, support: null, error: e instanceof Error ? e.message : String(e) };
    }
  }, [result, recipe, format]);
}

export function WhatIfPanel({ result, recipe, onRecipe }: { result: SurfaceResult; recipe: Recipe; onRecipe: (r: Recipe) => void }) {
  const d = displayOf(result.response);
  const [texts, setTexts] = useState<Record<string, string>>({});
  // eslint-disable-next-line react-hooks/exhaustive-deps
  const format = useMemo(() => (v: number) => show(v, d), [d.unit, d.scale, d.digits]);
  const { p, limit, support, error } = usePrediction(result, recipe, format);
  const setNumber = (f: FactorDef, text: string) => {
    setTexts((s) => ({ ...s, [f.key]: text }));
    const value = Number(text.replace(',', '.'));
    if (text.trim() !== '' && Number.isFinite(value)) onRecipe({ ...recipe, [f.key]: value });
  };
  return (
    <div className="grid gap-4 md:grid-cols-[minmax(0,20rem)_1fr]">
      <form aria-label="What-if recipe" className="grid grid-cols-2 gap-3" onSubmit={(e) => e.preventDefault()}>
        {result.factors.map((f) =>
          f.kind === 'continuous' ? (
            <Field key={f.key} label={`${f.label}${f.unit ? ` (${f.unit})` : ''}`} hint={`range ${showSetting(f.low ?? undefined)}–${showSetting(f.high ?? undefined, f.unit)}`}>
              {(props) => <Input {...props} inputMode="decimal" value={texts[f.key] ?? showSetting(recipe[f.key]).replace(/,/g, '')} onChange={(e) => setNumber(f, e.target.value)} onBlur={() => setTexts((s) => { const n = { ...s }; delete n[f.key]; return n; })} />}
            </Field>
          ) : (
            <Field key={f.key} label={f.label}>
              {(props) => <Select {...props} value={String(recipe[f.key])} onChange={(e) => onRecipe({ ...recipe, [f.key]: e.target.value })}>{(f.levels ?? []).map((l) => <option key={l} value={l}>{l}</option>)}</Select>}
            </Field>
          ),
        )}
      </form>
      <div role="status" aria-live="polite" className="flex flex-col gap-2 rounded-md border border-line bg-white p-3 text-sm">
        {error || !p || !limit || !support ? (
          <p className="text-rust-700">{error ?? 'Enter a value for every factor.'}</p>
        ) : (
          <>
            <p className="text-ink-700">Predicted {d.label}</p>
            {limit.hitsLimit ? (
              <p className="text-lg font-semibold text-rust-700">▲ not a number to trust</p>
            ) : (
              <p className="num text-2xl font-semibold text-ink-950">{show(limit.value, d)}</p>
            )}
            {limit.note && <p className="text-xs text-rust-700">{limit.note}</p>}
            {!limit.hitsLimit && (
              <p className="text-ink-700">
                One new build here would land between <span className="num">{show(limit.low, d)}</span> and <span className="num">{show(limit.high, d)}</span> (95 %);
                the average of many, within <span className="num">±{showSpread(p.ciHigh - p.value, d)}</span>.
              </p>
            )}
            {support.inside ? (
              <p className="text-moss-700"><span aria-hidden>● </span>Inside the builds' support (no further from them than the most remote build made).</p>
            ) : (
              <div className="text-amber-700"><span aria-hidden>▲ </span>Outside the builds' support — an extrapolation: {support.reasons.join(' ')}</div>
            )}
          </>
        )}
      </div>
    </div>
  );
}

const STEPS = 41;

function axisValues(f: FactorDef): number[] {
  const low = f.low ?? 0;
  const high = f.high ?? 1;
  return Array.from({ length: STEPS }, (_, i) => low + ((high - low) * i) / (STEPS - 1));
}

export function TwoFactorMap({ result, recipe, onRecipe, subtitle }: { result: SurfaceResult; recipe: Recipe; onRecipe: (r: Recipe) => void; subtitle: string }) {
  const d = displayOf(result.response);
  const box = useRef<HTMLDivElement>(null);
  const continuous = result.factors.filter((f) => f.kind === 'continuous');
  const [axes, setAxes] = useState<[string, string]>(() => defaultAxes(result));
  const [show3d, setShow3d] = useState(false);
  const [xKey, yKey] = axes;
  const fx = continuous.find((f) => f.key === xKey);
  const fy = continuous.find((f) => f.key === yKey);
  const grid = useMemo(() => {
    if (!fx || !fy || fx.key === fy.key) return null;
    const xs = axisValues(fx);
    const ys = axisValues(fy);
    const z: number[][] = [];
    const edge: number[][] = [];
    const limit = result.trustRegion.leverageLimit;
    for (const yv of ys) {
      const row: number[] = [];
      const edgeRow: number[] = [];
      for (const xv of xs) {
        const point = { ...recipe, [fx.key]: xv, [fy.key]: yv };
        const p = predict(result.fit, point);
        const bounded = boundPrediction(limitsAt(result.limits, point), p.value, p.piLow, p.piHigh);
        row.push(bounded.value * d.scale);
        edgeRow.push(limit > 0 ? p.leverage / limit : 10);
      }
      z.push(row);
      edge.push(edgeRow);
    }
    // every other grid node outside the support gets a stipple dot
    const stipple = { x: [] as number[], y: [] as number[] };
    ys.forEach((yv, j) => xs.forEach((xv, i) => {
      if (i % 2 === 0 && j % 2 === 0 && edge[j]![i]! > 1) { stipple.x.push(xv); stipple.y.push(yv); }
    }));
    return { xs, ys, z, edge, stipple };
  }, [fx, fy, recipe, result, d.scale]);
  if (continuous.length < 2) return <p className="text-sm text-ink-500">A map needs two continuous factors in the fit.</p>;
  const held = result.factors.filter((f) => f.key !== xKey && f.key !== yKey).map((f) => `${f.label} ${showSetting(recipe[f.key], f.kind === 'continuous' ? f.unit : null)}`).join(' · ');
  const range = (key: string) => result.trustRegion.ranges.find((r) => r.key === key);
  const rx = range(xKey);
  const ry = range(yKey);
  const xTitle = `${fx?.label ?? ''}${fx?.unit ? ` (${fx.unit})` : ''}`;
  const yTitle = `${fy?.label ?? ''}${fy?.unit ? ` (${fy.unit})` : ''}`;
  const runs = result.runs;
  const hover = runs.map((r) => `${r.code}: measured ${show(r.observed, d)}, fitted ${show(r.predicted, d)}`);
  const title = `Predicted ${d.label} (${d.unit})<br><span style="font-size:11px;color:#56668c">${held ? `${held}<br>` : ''}${subtitle}</span>`;
  return (
    <div ref={box} className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <div className="w-48"><Field label="Across">{(p) => <Select {...p} value={xKey} onChange={(e) => setAxes([e.target.value, yKey])}>{continuous.map((f) => <option key={f.key} value={f.key}>{f.label}</option>)}</Select>}</Field></div>
        <div className="w-48"><Field label="Up">{(p) => <Select {...p} value={yKey} onChange={(e) => setAxes([xKey, e.target.value])}>{continuous.map((f) => <option key={f.key} value={f.key}>{f.label}</option>)}</Select>}</Field></div>
        <span className="ml-auto flex gap-1.5">
          <Button onClick={() => exportPlot(box.current, 'png', `map-${result.response.key}`)}>PNG</Button>
          <Button onClick={() => exportPlot(box.current, 'svg', `map-${result.response.key}`)}>SVG</Button>
        </span>
      </div>
      {!grid ? (
        <p className="text-sm text-ink-500">Choose two different factors.</p>
      ) : (
        <>
          <LazyPlot
            fileName={`map-${result.response.key}`}
            style={{ height: 460 }}
            onClick={(event: { points?: { x?: unknown; y?: unknown }[] }) => {
              const hit = event.points?.[0];
              if (hit && typeof hit.x === 'number' && typeof hit.y === 'number') onRecipe({ ...recipe, [xKey]: Number(hit.x.toPrecision(4)), [yKey]: Number(hit.y.toPrecision(4)) });
            }}
            data={[
              { x: grid.xs, y: grid.ys, z: grid.z, type: 'contour', colorscale: 'Cividis', contours: { coloring: 'heatmap', showlabels: true, labelfont: { size: 10, color: '#ffffff' } }, colorbar: { title: { text: d.unit } }, hovertemplate: `${fx!.label} %{x:.4g}<br>${fy!.label} %{y:.4g}<br>${d.label} %{z:.4g} ${d.unit}<extra></extra>`, name: 'predicted' },
              // outside the builds' support (leverage above the limit): stippled, its edge dashed
              { x: grid.stipple.x, y: grid.stipple.y, type: 'scatter', mode: 'markers', marker: { size: 3, color: 'rgba(17,26,46,0.45)' }, hoverinfo: 'skip', name: 'outside the builds’ support (stippled)' },
              { x: grid.xs, y: grid.ys, z: grid.edge, type: 'contour', showscale: false, contours: { start: 1, end: 1, size: 1, coloring: 'none', showlabels: false }, line: { color: '#111a2e', width: 1.5, dash: 'dash' }, hoverinfo: 'skip', name: 'edge of the builds’ support' },
              { x: runs.map((r) => r.factors[xKey] as number), y: runs.map((r) => r.factors[yKey] as number), text: hover, type: 'scatter', mode: 'markers', name: 'builds (at their own settings)', marker: { color: '#ffffff', size: 8, line: { color: '#111a2e', width: 1.5 }, symbol: 'circle' }, hovertemplate: '%{text}<extra></extra>' },
              { x: [recipe[xKey] as number], y: [recipe[yKey] as number], type: 'scatter', mode: 'markers', name: 'what-if recipe', marker: { color: OKABE_ITO[1], size: 15, symbol: 'star', line: { color: '#111a2e', width: 1 } }, hovertemplate: 'what-if recipe<extra></extra>' },
            ]}
            layout={{
              title: { text: title },
              xaxis: { title: { text: xTitle } },
              yaxis: { title: { text: yTitle } },
              legend: { orientation: 'h', y: -0.22 },
              margin: { l: 70, r: 40, t: 84, b: 96 },
              shapes: rx && ry ? [{ type: 'rect', x0: rx.low, x1: rx.high, y0: ry.low, y1: ry.high, line: { color: '#E69F00', width: 1.5, dash: 'dot' } }] : [],
            }}
            config={{ displayModeBar: false }}
          />
          <p className="text-xs text-ink-500">
            Stippled area and dashed line: outside the builds' support at these held values (there a point is further from the builds than the most remote build made, so the colours are extrapolation);
            orange dots: the ranges built so far. Click the map to move the what-if recipe. Builds are drawn at their own settings, which may differ from the held values.
          </p>
          <div>
            <Button onClick={() => setShow3d((s) => !s)} aria-expanded={show3d}>{show3d ? 'Hide the 3-D view' : 'Show as a 3-D surface'}</Button>
          </div>
          {show3d && (
            <LazyPlot
              fileName={`surface3d-${result.response.key}`}
              style={{ height: 520 }}
              data={[
                { x: grid.xs, y: grid.ys, z: grid.z, type: 'surface', colorscale: 'Cividis', opacity: 0.92, colorbar: { title: { text: d.unit } }, name: 'predicted' },
                { x: runs.map((r) => r.factors[xKey] as number), y: runs.map((r) => r.factors[yKey] as number), z: runs.map((r) => r.observed * d.scale), text: hover, type: 'scatter3d', mode: 'markers', name: 'builds', marker: { color: OKABE_ITO[1], size: 4, line: { color: '#111a2e', width: 1 } }, hovertemplate: '%{text}<extra></extra>' },
              ]}
              layout={{ title: { text: title }, scene: { xaxis: { title: { text: xTitle } }, yaxis: { title: { text: yTitle } }, zaxis: { title: { text: `${d.label} (${d.unit})` } } } }}
              config={{ displayModeBar: false }}
            />
          )}
        </>
      )}
    </div>
  );
}
