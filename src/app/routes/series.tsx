// Series: builds that differ only in cell temperature (→ apparent activation energy) or in
// back-pressure (→ apparent reaction order), proposed by the recipe diff or picked by hand; the
// current each gives at one iR-free voltage, the plot with its fitted line, the estimate with its
// interval, and what else differs. The URL keeps the choice (?variable=…&builds=…&voltage=…).
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { useProject } from '@/features/projects/api/projects';
import { useBuilds } from '@/features/builds/api/builds';
import { useSeries, type SeriesData } from '@/features/series/api/run-series';
import { SeriesPlot } from '@/features/series/components/series-plot';
import { PageHeader, Panel, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';
import { Field, Input, Select } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { Hint } from '@/components/ui/hint';
import { formatNumber, formatSignificant } from '@/lib/format';

const VARIABLES = { temperature: 'Cell temperature → activation energy', pressure: 'Back-pressure → reaction order' } as const;

function estimateText(data: SeriesData): string {
  if (data.estimate == null) return '—';
  const digits = data.kind === 'arrhenius' ? 1 : 2;
  return `${formatNumber(data.estimate, digits)}${data.unit && data.unit !== 'dimensionless' ? ` ${data.unit}` : ''}`;
}

function intervalText(data: SeriesData): string {
  if (data.low == null || data.high == null) return 'no interval: two builds leave no degrees of freedom';
  const digits = data.kind === 'arrhenius' ? 1 : 2;
  return `${Math.round(data.confidence * 100)} % interval ${formatNumber(data.low, digits)} to ${formatNumber(data.high, digits)}${data.unit && data.unit !== 'dimensionless' ? ` ${data.unit}` : ''}`;
}

function ResultCard({ data }: { data: SeriesData }) {
  const arrhenius = data.kind === 'arrhenius';
  return (
    <div className="space-y-2" data-testid="series-result">
      <div className="text-xs font-medium uppercase tracking-wide text-ink-500">{arrhenius ? 'Apparent activation energy Eₐ' : 'Apparent reaction order (dimensionless)'}</div>
      <div className="font-mono text-2xl font-semibold tabular-nums text-ink-950">{estimateText(data)}</div>
      <div className="text-sm text-ink-700">{intervalText(data)}</div>
      {!arrhenius && data.noDependenceWithinNoise === true && (
        <p className="flex items-center gap-1.5 text-sm font-medium text-ink-800"><span aria-hidden>○</span> no dependence within noise: the interval holds zero</p>
      )}
      {!arrhenius && data.noDependenceWithinNoise === false && (
        <p className="flex items-center gap-1.5 text-sm text-ink-800"><span aria-hidden>●</span> depends on pressure: the interval excludes zero</p>
      )}
      {data.fit?.r2 != null && <div className="text-xs text-ink-500">R² {formatNumber(data.fit.r2, 3)} · {data.fit.n} builds · {data.basis === 'kinetic' ? 'kinetic current (mass-transport corrected)' : 'iR-free current'}</div>}
      {data.method && <p className="text-xs text-ink-500">{data.method}</p>}
      {data.notes.length > 0 && <ul className="list-disc space-y-0.5 pl-4 text-xs text-ink-500">{data.notes.map((n) => <li key={n}>{n}</li>)}</ul>}
    </div>
  );
}

export default function SeriesPage() {
  const projectId = Number(useParams().projectId);
  const [params, setParams] = useSearchParams();
  const variable = params.get('variable') === 'pressure' ? 'pressure' : 'temperature';
  const voltageParam = Number(params.get('voltage'));
  const voltage = Number.isFinite(voltageParam) && voltageParam > 0.3 && voltageParam < 1.2 ? voltageParam : 0.85;
  const picked = (params.get('builds') ?? '').split(',').map(Number).filter((n) => Number.isInteger(n) && n > 0);
  const project = useProject(projectId);
  const builds = useBuilds(projectId);
  const series = useSeries(projectId, { variable, atVoltageIrFree: voltage, ...(picked.length >= 2 && { builds: picked }) });

  const setQuery = (next: { variable?: string; builds?: number[] | null; voltage?: number }) => {
    const p = new URLSearchParams(params);
    if (next.variable) { p.set('variable', next.variable); p.delete('builds'); }
    if (next.voltage !== undefined) p.set('voltage', String(next.voltage));
    if (next.builds !== undefined) {
      if (!next.builds || next.builds.length === 0) p.delete('builds');
      else p.set('builds', next.builds.join(','));
    }
    setParams(p);
  };

  if (project.isLoading || builds.isLoading) return <Loading />;
  if (project.error || !project.data) return <ErrorNote error={project.error} />;
  const data = series.data;
  const withCurve = (builds.data ?? []).filter((b) => b.recordCurveIds?.polarization != null && b.status !== 'discarded');
  const members = new Set(data?.members.map((m) => m.buildId) ?? []);
  const chosen = picked.length >= 2 ? new Set(picked) : members;
  const toggle = (id: number) => {
    const next = new Set(chosen);
    if (next.has(id)) next.delete(id); else next.add(id);
    setQuery({ builds: [...next] });
  };
  const unit = variable === 'temperature' ? '°C' : 'kPa';
  const subtitle = `${variable === 'temperature' ? 'ln j against 1000/T' : 'ln j against ln p'} · j at ${formatNumber(voltage, 2)} V iR-free · ${data?.selection === 'as-given' ? 'builds picked by hand' : 'builds that differ only in the series variable'}`;
  const fileName = `series-${project.data.codePrefix}-${variable}`;

  return (
    <div className="max-w-7xl">
      <PageHeader
        eyebrow={<Link to={`/projects/${projectId}`} className="hover:underline">{project.data.name}</Link>}
        title="Series"
        subtitle="How the current at a fixed iR-free voltage changes with cell temperature (apparent activation energy) or with pressure (apparent reaction order), across builds that differ only in that."
      />
      <div className="grid gap-4 xl:grid-cols-[minmax(0,3fr)_minmax(18rem,1fr)]">
        <Panel title={variable === 'temperature' ? 'Arrhenius plot' : 'Reaction-order plot'}>
          {series.isLoading ? <Loading label="Fitting the series…" /> : series.error ? <ErrorNote error={series.error} /> : !data || data.points.length < 2 ? (
            <EmptyState title="Not enough builds for a series yet">
              {data?.notes[0] ?? 'Upload polarization curves for builds at two or more cell temperatures (or back-pressures) with the same recipe.'}
            </EmptyState>
          ) : (
            <SeriesPlot data={data} subtitle={subtitle} fileName={fileName} />
          )}
        </Panel>
        <div className="space-y-4">
          <Panel title="Choose the series">
            <div className="space-y-3">
              <Field label="Series variable">
                {(props) => (
                  <Select {...props} value={variable} onChange={(e) => setQuery({ variable: e.target.value })}>
                    {Object.entries(VARIABLES).map(([key, label]) => <option key={key} value={key}>{label}</option>)}
                  </Select>
                )}
              </Field>
              <Field label="iR-free voltage (V)" hint="The current of every build is read where its iR-free voltage falls through this value; pick one in the kinetic region that every curve reaches.">
                {(props) => <Input {...props} type="number" step="0.01" min="0.31" max="1.19" defaultValue={voltage} key={voltage} onBlur={(e) => { const v = Number(e.target.value); if (v > 0.3 && v < 1.2 && v !== voltage) setQuery({ voltage: v }); }} />}
              </Field>
            </div>
          </Panel>
          {data && (
            <Panel title="Result">
              <ResultCard data={data} />
            </Panel>
          )}
        </div>
      </div>
      {data && (
        <div className="mt-4 grid gap-4 xl:grid-cols-2">
          <Panel title="Builds in the series" actions={picked.length >= 2 ? <Button onClick={() => setQuery({ builds: null })}>Use the proposed series</Button> : undefined}>
            <table className="w-full text-sm">
              <caption className="sr-only">Builds and the current each gives at the series voltage</caption>
              <thead className="text-left text-xs text-ink-500">
                <tr><th className="py-1">Build</th><th className="py-1">{variable === 'temperature' ? 'Cell temperature (°C)' : 'Pressure (kPa, absolute)'}</th><th className="py-1">j at {formatNumber(voltage, 2)} V iR-free (mA/cm²)</th><th className="py-1">Note</th></tr>
              </thead>
              <tbody>
                {data.members.map((m) => (
                  <tr key={m.buildId} className="border-t border-line">
                    <td className="py-1"><Link className="text-copper-700 hover:underline" to={`/projects/${projectId}/builds/${m.buildId}`}>{m.code}</Link></td>
                    <td className="py-1 font-mono tabular-nums">{formatNumber(m.value, variable === 'temperature' ? 0 : 1)}</td>
                    <td className="py-1 font-mono tabular-nums">{m.currentDensity == null ? '—' : <Hint hint={m.method}>{formatSignificant(m.currentDensity * 1000, 3)}</Hint>}</td>
                    <td className="py-1 text-xs text-ink-500">{m.currentDensity == null ? m.note : m.basis === 'kinetic' ? 'kinetic current' : 'iR-free current'}</td>
                  </tr>
                ))}
              </tbody>
            </table>
            {data.leftOut.length > 0 && (
              <div className="mt-3">
                <h3 className="text-xs font-semibold text-ink-700">Left out</h3>
                <ul className="mt-1 space-y-0.5 text-xs text-ink-600">{data.leftOut.map((l) => <li key={`${l.buildId}-${l.reason}`}><span className="font-medium">{l.code}</span>: {l.reason}</li>)}</ul>
              </div>
            )}
          </Panel>
          <Panel title="Pick builds by hand">
            <p className="mb-2 text-xs text-ink-500">Tick the builds to analyse; a build that differs in more than the {variable === 'temperature' ? 'cell temperature' : 'back-pressure'} is kept and listed below with what else differs.</p>
            <ul className="grid max-h-64 grid-cols-2 gap-1 overflow-y-auto text-sm sm:grid-cols-3">
              {withCurve.map((b) => {
                const value = variable === 'temperature' ? b.testConditions?.temperatureC : b.testConditions?.backPressureKPa;
                return (
                  <li key={b.id}>
                    <label className="flex items-center gap-1.5">
                      <input type="checkbox" checked={chosen.has(b.id)} onChange={() => toggle(b.id)} />
                      <span>{b.code}</span>
                      <span className="text-xs text-ink-500">{value == null ? '' : `${formatNumber(value, 0)} ${variable === 'temperature' ? unit : 'kPa(g)'}`}</span>
                    </label>
                  </li>
                );
              })}
            </ul>
            {data.mismatches.length > 0 && (
              <div className="mt-3">
                <h3 className="text-xs font-semibold text-ink-700">Differ in more than the series variable</h3>
                <ul className="mt-1 space-y-0.5 text-xs text-ink-600">{data.mismatches.slice(0, 30).map((m) => <li key={m.buildId}>{m.reason}</li>)}</ul>
                {data.mismatches.length > 30 && <p className="text-xs text-ink-500">and {data.mismatches.length - 30} more</p>}
              </div>
            )}
          </Panel>
        </div>
      )}
    </div>
  );
}
