// Several responses at once: Derringer–Suich desirability (e.g. voltage against loading or cost)
// on the fitted surfaces, drawn over the same two factors, and the Pareto set of observed builds.
import { useMemo, useState } from 'react';
import { useQueries } from '@tanstack/react-query';
import type { ResponseDef } from '@shared/api-types';
import { individualDesirability, overallDesirability, paretoSet, predict, type DesirabilityGoal } from '@shared/doe/model/index';
import { LazyPlot } from '@/components/plot/lazy-plot';
import { Field, Input, Select } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { ErrorNote } from '@/components/ui/panel';
import { METRICS } from '@/lib/format';
import { surfaceQueryOptions, type SurfaceRequest, type SurfaceResult } from '../api/surface';
import { gridOf, heldLine, type View } from './map-grid';
import { displayOf, show } from './display';

interface Goal {
  response: string;
  goal: 'maximize' | 'minimize' | 'target';
  low: string;
  target: string;
  high: string;
}

function toGoal(g: Goal, scale: number): DesirabilityGoal {
  const n = (s: string) => Number(s) / scale;
  if (g.goal === 'maximize') return { goal: 'maximize', low: n(g.low), target: n(g.target) };
  if (g.goal === 'minimize') return { goal: 'minimize', target: n(g.target), high: n(g.high) };
  return { goal: 'target', low: n(g.low), target: n(g.target), high: n(g.high) };
}

export function DesirabilityPanel({ projectId, request, base, responses, view }: { projectId: number; request: SurfaceRequest; base: SurfaceResult; responses: ResponseDef[]; view: View }) {
  const [goals, setGoals] = useState<Goal[]>([]);
  const [applied, setApplied] = useState<Goal[]>([]);
  const keys = [...Object.keys(METRICS), ...responses.map((r) => r.key)];
  const labelOf = (key: string) => {
    if (METRICS[key]) return `${METRICS[key]!.label} (${METRICS[key]!.unit})`;
    const r = responses.find((entry) => entry.key === key);
    return r ? `${r.label}${r.unit ? ` (${r.unit})` : ''}` : 'a response of this project';
  };
  const fits = useQueries({ queries: applied.map((g) => surfaceQueryOptions(projectId, { ...request, response: g.response })) });
  const results = fits.map((f) => f.data).filter((r): r is SurfaceResult => !!r);
  const error = fits.find((f) => f.error)?.error;
  const ready = applied.length > 0 && results.length === applied.length;

  const computed = useMemo(() => {
    if (!ready) return null;
    try {
      const scaled = applied.map((g, i) => toGoal(g, displayOf(results[i]!.response).scale));
      const D = (point: Record<string, number | string>) => overallDesirability(results.map((r, i) => individualDesirability(predict(r.fit, point).value, scaled[i]!)));
      const grid = view.x && view.y && view.x !== view.y ? gridOf(base.factors, view, D) : null;
      // observed builds that have every response
      const byBuild = new Map<number, { code: string; values: Record<string, number> }>();
      results.forEach((r) => {
        for (const run of r.runs) {
          const entry = byBuild.get(run.buildId) ?? { code: run.code, values: {} };
          entry.values[r.response.key] = run.observed;
          byBuild.set(run.buildId, entry);
        }
      });
      const complete = [...byBuild.entries()].filter(([, e]) => applied.every((g) => e.values[g.response] !== undefined)).map(([id, e]) => ({ id, ...e }));
      const pareto = new Set(paretoSet(complete, Object.fromEntries(applied.map((g) => [g.response, g.goal === 'target' ? { target: Number(g.target) / displayOf(results[applied.indexOf(g)]!.response).scale } : g.goal]))).map((b) => b.id));
      const rows = complete.map((b) => {
        const ds = applied.map((_, i) => individualDesirability(b.values[applied[i]!.response]!, scaled[i]!));
        return { ...b, ds, D: overallDesirability(ds), pareto: pareto.has(b.id) };
      }).sort((a, b) => b.D - a.D);
      return { grid, rows, problem: null as string | null };
    } catch (e) {
      return { grid: null, rows: [], problem: e instanceof Error ? e.message : String(e) };
    }
  }, [ready, applied, results, base.factors, view]);

  const update = (i: number, patch: Partial<Goal>) => setGoals((s) => s.map((g, k) => (k === i ? { ...g, ...patch } : g)));
  return (
    <div className="flex flex-col gap-3">
      <p className="text-sm text-ink-500">Each response gets a desirability from 0 (unacceptable) to 1 (as good as it needs to be) between the limits you set; the overall desirability is their geometric mean. Limits are in the units shown.</p>
      {goals.map((g, i) => (
        <div key={i} className="grid grid-cols-2 items-end gap-2 md:grid-cols-6">
          <div className="col-span-2">
            <Field label={`Response ${i + 1}`}>{(p) => <Select {...p} value={g.response} onChange={(e) => update(i, { response: e.target.value })}>{keys.map((k) => <option key={k} value={k}>{labelOf(k)}</option>)}</Select>}</Field>
          </div>
          <Field label="Goal">{(p) => <Select {...p} value={g.goal} onChange={(e) => update(i, { goal: e.target.value as Goal['goal'] })}><option value="maximize">maximise</option><option value="minimize">minimise</option><option value="target">target</option></Select>}</Field>
          {g.goal !== 'minimize' ? <Field label="Low (d = 0)">{(p) => <Input {...p} inputMode="decimal" value={g.low} onChange={(e) => update(i, { low: e.target.value })} />}</Field> : <span />}
          <Field label="Target (d = 1)">{(p) => <Input {...p} inputMode="decimal" value={g.target} onChange={(e) => update(i, { target: e.target.value })} />}</Field>
          {g.goal !== 'maximize' ? <Field label="High (d = 0)">{(p) => <Input {...p} inputMode="decimal" value={g.high} onChange={(e) => update(i, { high: e.target.value })} />}</Field> : <Button variant="ghost" onClick={() => setGoals((s) => s.filter((_, k) => k !== i))}>Remove</Button>}
        </div>
      ))}
      <div className="flex gap-2">
        {goals.length < 4 && <Button onClick={() => setGoals((s) => [...s, { response: s.length === 0 ? base.response.key : 'peakPower', goal: 'maximize', low: '', target: '', high: '' }])}>Add a response</Button>}
        {goals.length > 0 && <Button variant="primary" onClick={() => setApplied(goals.map((g) => ({ ...g })))}>Weigh them</Button>}
      </div>
      <ErrorNote error={error} />
      {computed?.problem && <ErrorNote error={computed.problem} />}
      {computed && !computed.problem && (
        <div className="grid gap-4 xl:grid-cols-2">
          {computed.grid && (
            <LazyPlot
              fileName="desirability"
              style={{ height: 400 }}
              data={[{ x: computed.grid.xs, y: computed.grid.ys, z: computed.grid.z, type: 'contour', zmin: 0, zmax: 1, colorscale: 'Cividis', contours: { showlabels: true, coloring: 'heatmap' }, colorbar: { title: { text: '0–1' } }, hovertemplate: 'overall desirability %{z:.2f}<extra></extra>' }]}
              config={{ displayModeBar: false }}
              layout={{
                title: { text: `Overall desirability (0–1)<br><span style="font-size:11px;color:#56668c">${heldLine(base.factors, view)}</span>` },
                xaxis: { title: { text: `${computed.grid.fx.label}${computed.grid.fx.unit ? ` (${computed.grid.fx.unit})` : ''}` } },
                yaxis: { title: { text: `${computed.grid.fy.label}${computed.grid.fy.unit ? ` (${computed.grid.fy.unit})` : ''}` } },
              }}
            />
          )}
          <div className="overflow-x-auto">
            <table className="w-full text-sm" aria-label="Observed builds by desirability">
              <thead className="text-left text-xs text-ink-700">
                <tr><th className="py-1">Build</th>{applied.map((g, i) => <th key={i} className="text-right">{labelOf(g.response)}</th>)}<th className="text-right">Overall (0–1)</th><th className="pl-2">Pareto set</th></tr>
              </thead>
              <tbody>
                {computed.rows.map((b) => (
                  <tr key={b.id} className="border-t border-line">
                    <td className="py-1 font-medium">{b.code}</td>
                    {applied.map((g, i) => <td key={i} className="num text-right">{show(b.values[g.response], displayOf(results[i]!.response))}</td>)}
                    <td className="num text-right">{b.D.toFixed(2)}</td>
                    <td className="pl-2">{b.pareto ? '◆ on the front' : <span className="text-ink-300">dominated</span>}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </div>
      )}
    </div>
  );
}
