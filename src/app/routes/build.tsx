// One build: recipe, test conditions, lineage, curves with metrics, uploads and the review thread.
import { Link, Navigate, useParams } from 'react-router-dom';
import { useQueries } from '@tanstack/react-query';
import type { CurveSummary, Project, FactorDef, BuildDetail } from '@shared/api-types';
import { useBuild, useUpdateBuild } from '@/features/builds/api/builds';
import { useFactors, useProject, useResponses } from '@/features/projects/api/projects';
import { curveQueryOptions, useCurve, useUpdateCurve } from '@/features/curves/api/curves';
import { PolarizationPlot, curveTitle } from '@/features/curves/components/polarization-plot';
import { CurveShelf } from '@/features/curves/components/curve-shelf';
import { ApiError } from '@/lib/api-client';
import { formatDateTime } from '@/lib/format';
import { MetricsList, WhatIfReference } from '@/features/curves/components/metrics-panel';
import { DurabilityPlot } from '@/features/curves/components/durability-plot';
import { FitTable, HfrComparison, ImpedanceMetrics, ImpedancePlots } from '@/features/curves/components/impedance-view';
import { DurabilityControls } from '@/features/durability/components/durability-controls';
import { DropZone, UploadRows, useUploadBatch } from '@/features/curves/components/upload-panel';
import { ImportNotes } from '@/features/curves/components/import-notes';
import { PageHeader, Panel, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';
import { StatusBadge } from '@/components/ui/status-badge';
import { Button, LinkButton } from '@/components/ui/button';
import { useConfirm } from '@/components/ui/confirm-dialog';
import { formatDate, formatNumber, withUnit } from '@/lib/format';
import { ReviewThread } from '@/features/review/components/review-thread';
import { MetalEconomyFigures } from '@/features/builds/components/metal-economy';
import { useBenchmark, useClearBenchmark, useSetBenchmark, type BenchmarkView } from '@/features/benchmarks/api/benchmarks';
import { benchmarkForPlot } from '@/features/benchmarks/components/benchmark-parts';
import { BenchmarkBadge } from '@/components/ui/benchmark-badge';
import { can } from '@/features/projects/components/permissions';
import { useTargets } from '@/features/targets/api/targets';
import { targetLinesFor } from '@/features/targets/components/target-lines';
import { curveMetricsCsv, curvePointsCsv } from '@/features/curves/components/curve-csv';
import { downloadText } from '@/components/plot/export';
import type { CurvePoints } from '@shared/api-types';

function Recipe({ detail, factors }: { detail: BuildDetail; factors: FactorDef[] }) {
  const b = detail.build;
  const rows: [string, string][] = [
    ...factors.map((f) => [`${f.label}`, withUnit(b.factors[f.key], f.unit)] as [string, string]),
    ['Catalyst loading', withUnit(b.loadingMgCm2, 'mg/cm²')],
    ['Metal loading', withUnit(b.metalLoadingMgCm2, 'mg/cm²')],
    ['Active area', withUnit(b.areaCm2, 'cm²')],
    ['Catalyst lot', b.catalystLot ?? '—'],
  ];
  if (b.plannedOn) rows.push(['Planned on', formatDate(b.plannedOn)]);
  return (
    <>
      <dl className="grid grid-cols-2 gap-x-6 gap-y-2 text-sm">
        {rows.map(([k, v]) => (
          <div key={k}><dt className="text-xs text-ink-500">{k}</dt><dd className="num text-ink-950">{v}</dd></div>
        ))}
      </dl>
      <PlanOrigin build={b} />
    </>
  );
}

/** Where a planned build came from: its design, and the reason given for planning a flagged proposal. */
function PlanOrigin({ build }: { build: BuildDetail['build'] }) {
  if (build.designId == null && !build.planReason) return null;
  return (
    <div className="mt-3 flex flex-col gap-1 border-t border-line pt-2 text-sm">
      {build.designId != null && <p className="text-ink-700">Planned from <Link className="text-copper-700 hover:underline" to={`/projects/${build.projectId}/plan#design-${build.designId}`}>design {build.designId}</Link>.</p>}
      {build.planReason && <p className="text-amber-700"><span aria-hidden>▲ </span>Planned from a flagged proposal (outside the builds' support or at a physical limit). Reason given: “{build.planReason}”</p>}
    </div>
  );
}

function Conditions({ detail }: { detail: BuildDetail }) {
  const c = detail.build.testConditions ?? {};
  const b = detail.build;
  const rows: [string, string][] = [
    ['Cell temperature', withUnit(c.temperatureC, '°C')],
    ['Gases', c.anodeGas || c.cathodeGas ? `${c.anodeGas ?? '?'} / ${c.cathodeGas ?? '?'}` : '—'],
    ['Back-pressure', withUnit(c.backPressureKPa, 'kPa(g)')],
    ['Stoichiometry (a/c)', c.anodeStoich != null || c.cathodeStoich != null ? `${c.anodeStoich ?? '—'} / ${c.cathodeStoich ?? '—'}` : '—'],
    ['Lab', b.labName ?? '—'],
    ['Operator', b.operatorName ?? '—'],
    ['Built on', formatDate(b.builtOn)],
    ['Tested on', formatDate(b.testedOn)],
  ];
  return (
    <dl className="grid grid-cols-2 gap-x-6 gap-y-2 text-sm">
      {rows.map(([k, v]) => (
        <div key={k}><dt className="text-xs text-ink-500">{k}</dt><dd className="num text-ink-950">{v}</dd></div>
      ))}
    </dl>
  );
}

function Lineage({ detail, projectId }: { detail: BuildDetail; projectId: number }) {
  const { ancestors, children, replicates } = detail.lineage;
  const link = (n: { id: number; code: string }) => <Link className="font-medium text-copper-700 hover:underline" to={`/projects/${projectId}/builds/${n.id}`}>{n.code}</Link>;
  return (
    <div className="space-y-3 text-sm">
      <ol className="flex flex-wrap items-center gap-1.5" aria-label="Ancestors">
        {ancestors.map((a) => (
          <li key={a.id} className="flex items-center gap-1.5">{link(a)}<span className="text-ink-300" aria-hidden>→</span></li>
        ))}
        <li className="rounded bg-ink-100 px-1.5 font-semibold text-ink-950">{detail.build.code}</li>
      </ol>
      {ancestors.length === 0 && <p className="text-xs text-ink-500">A baseline: no parent build.</p>}
      {detail.lineage.changeFromParent && (
        <p className="text-xs text-ink-700" title="diffed from the recorded recipe, loading, lot, lab and test conditions">
          <span className="text-ink-500">Changed from {ancestors[ancestors.length - 1]?.code}: </span>{detail.lineage.changeFromParent}
        </p>
      )}
      <div>
        <div className="text-xs text-ink-500">Children</div>
        {children.length === 0 ? <p className="text-xs text-ink-500">None yet.</p> : (
          <ul className="mt-1 space-y-0.5">{children.map((c) => <li key={c.id}>{link(c)} <span className="text-ink-500">— {c.changeNote ?? 'no change note'}</span></li>)}</ul>
        )}
      </div>
      {replicates.length > 0 && (
        <div>
          <div className="text-xs text-ink-500">Replicates (same recipe)</div>
          <div className="mt-1 flex flex-wrap gap-2">{replicates.map((r) => <span key={r.id}>{link(r)}</span>)}</div>
        </div>
      )}
    </div>
  );
}

/** A curve's name in a plot legend: its label, whether it is the record, and when it was uploaded. */
function seriesName(c: CurveSummary) {
  return `${curveTitle(c)}${c.isRecord ? ' (record)' : ''} · ${formatDateTime(c.createdAt)}`;
}

/** CSV of the curve's points as stored and of its metrics with method and inputs. */
function CurveDownloads({ curve, points, code, settings }: { curve: CurveSummary; points?: CurvePoints; code: string; settings: Project['settings'] }) {
  const base = `${code}-${curve.kind}-${curve.id}`;
  return (
    <span className="print-hidden inline-flex flex-wrap items-center gap-1.5" role="group" aria-label="Download the curve as CSV">
      {points && !points.downsampled && <Button onClick={() => downloadText(curvePointsCsv(points), `${base}-points.csv`)}>Points CSV</Button>}
      <Button onClick={() => downloadText(curveMetricsCsv(curve, { code }, settings), `${base}-metrics.csv`)}>Metrics CSV</Button>
    </span>
  );
}

function CurveView({ curve, overlays, project, detail, benchmark }: { curve: CurveSummary; overlays: CurveSummary[]; project: Project; detail: BuildDetail; benchmark: BenchmarkView | null }) {
  const { data, isLoading, error } = useCurve(curve.id);
  const targets = useTargets(project.id);
  const others = useQueries({ queries: (curve.kind === 'polarization' ? overlays : []).map((o) => curveQueryOptions(o.id)) });
  if (curve.kind === 'impedance') return <ImpedanceView curve={curve} detail={detail} settings={project.settings} />;
  if (curve.kind !== 'polarization') return <DurabilityView curve={curve} overlays={overlays} code={detail.build.code} settings={project.settings} />;
  if (isLoading) return <Loading label="Loading points…" />;
  if (error || !data) return <ErrorNote error={error} />;
  const stale = curve.metricsVersion !== project.metricsVersion;
  const series = [
    { name: overlays.length ? seriesName(curve) : detail.build.code, points: data.points },
    ...others.flatMap((o, i) => (o.data ? [{ name: seriesName(overlays[i]!), points: o.data.points }] : [])),
  ];
  return (
    <div className="grid gap-4 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
      <div className="min-w-0">
        <PolarizationPlot
          series={series}
          settings={project.settings}
          conditions={detail.build.testConditions}
          title={`${detail.build.code} · ${curveTitle(curve)}`}
          fileName={`${detail.build.code}-polarization`}
          // the benchmark build's own record curve is not drawn twice
          benchmark={benchmarkForPlot(benchmark, { buildIds: [detail.build.id], curveIds: [curve.id, ...overlays.map((o) => o.id)] })}
          targets={targetLinesFor(targets.data, 'vAtRef', 'V')}
        />
      </div>
      <div className="min-w-0 space-y-3">
        {stale && <p className="text-xs text-amber-700">These metrics were computed for an earlier reference point and are being recomputed.</p>}
        <MetricsList result={curve} settings={project.settings} />
        <p className="text-[11px] text-ink-500">
          {String(curve.summary.steps ?? '?')} current steps{curve.summary.sweeps ? `, sweeps: ${String(curve.summary.sweeps)}` : ''}
          {curve.summary.hysteresisMv != null ? `, hysteresis at j_ref ${formatNumber(Number(curve.summary.hysteresisMv), 1)} mV` : ''} · mapping: {String(curve.summary.mappingSource ?? 'detected')}
          {curve.summary.profileNote ? <span className="block text-amber-700">{String(curve.summary.profileNote)}</span> : null}
          {curve.fileId && <> · <a className="text-copper-700 underline" href={`/api/files/${curve.fileId}/raw`}>raw file</a></>}
        </p>
        <CurveDownloads curve={curve} points={data.points} code={detail.build.code} settings={project.settings} />
        <ImportNotes curve={curve} canChoose={detail.permissions.upload} />
        <WhatIfReference curve={curve} points={data.points} settings={project.settings} loading={{ loadingMgCm2: detail.build.loadingMgCm2, metalLoadingMgCm2: detail.build.metalLoadingMgCm2 }} />
      </div>
    </div>
  );
}

function ImpedanceView({ curve, detail, settings }: { curve: CurveSummary; detail: BuildDetail; settings: Project['settings'] }) {
  const { data, isLoading, error } = useCurve(curve.id);
  if (isLoading) return <Loading label="Loading the spectrum…" />;
  if (error || !data) return <ErrorNote error={error} />;
  return (
    <div className="grid gap-4 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
      <div className="min-w-0"><ImpedancePlots curve={curve} points={data.points} title={`${detail.build.code} · ${curveTitle(curve)}`} fileName={`${detail.build.code}-impedance`} /></div>
      <div className="min-w-0 space-y-3">
        <ImpedanceMetrics curve={curve} />
        <HfrComparison curve={curve} polarizationHfr={detail.build.values.hfr} />
        <FitTable summary={curve.summary as Record<string, unknown>} />
        <CurveDownloads curve={curve} points={data.points} code={detail.build.code} settings={settings} />
        <ImportNotes curve={curve} canChoose={detail.permissions.upload} />
        {curve.fileId && <p className="text-[11px] text-ink-500"><a className="text-copper-700 underline" href={`/api/files/${curve.fileId}/raw`}>raw file</a></p>}
      </div>
    </div>
  );
}

function DurabilityView({ curve, overlays, code, settings }: { curve: CurveSummary; overlays: CurveSummary[]; code: string; settings: Project['settings'] }) {
  // the build is already in the query cache; its permissions say whether the options can be edited
  const build = useBuild(curve.buildId);
  const update = useUpdateCurve(curve.buildId);
  return (
    <div className="grid gap-4 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
      <div className="min-w-0"><DurabilityPlot curve={curve} title={curveTitle(curve)} overlays={overlays} /></div>
      <div className="min-w-0 space-y-3">
        {/* a log's every point is in its raw file; its metrics here */}
        <CurveDownloads curve={curve} code={code} settings={settings} />
        <ImportNotes curve={curve} canChoose={Boolean(build.data?.permissions.upload)} />
        <DurabilityControls curve={curve} update={update} canEdit={Boolean(build.data?.permissions.upload)} />
      </div>
    </div>
  );
}

/** No build at this address for this person: it does not exist or is in a project they are not in. */
function BuildNotFound({ buildId }: { buildId: number }) {
  return (
    <div className="max-w-lg">
      <h1 className="text-lg font-semibold text-ink-950">Build not found</h1>
      <p className="mt-2 text-sm text-ink-500">There is no build {buildId} that you can open: it does not exist, or it belongs to a project you are not a member of.</p>
      <Link to="/" className="mt-4 inline-block text-sm font-medium text-copper-700 underline">Back to home</Link>
    </div>
  );
}

export default function BuildPage() {
  const projectId = Number(useParams().projectId);
  const buildId = Number(useParams().buildId);
  const project = useProject(projectId);
  const detail = useBuild(buildId);
  const factors = useFactors(projectId);
  const responses = useResponses(projectId);
  const update = useUpdateBuild(buildId, projectId);
  const batch = useUploadBatch(projectId);
  const benchmark = useBenchmark(projectId);
  const setBenchmark = useSetBenchmark(projectId);
  const clearBenchmark = useClearBenchmark(projectId);
  const [confirm, confirmDialog] = useConfirm();
  // a build opened under another project's address moves to its own project's address
  if (detail.data && detail.data.build.projectId !== projectId) return <Navigate to={`/projects/${detail.data.build.projectId}/builds/${buildId}`} replace />;
  if (detail.error instanceof ApiError && detail.error.status === 404) return <BuildNotFound buildId={buildId} />;
  if (project.isLoading || detail.isLoading || factors.isLoading || responses.isLoading) return <Loading />;
  const error = project.error ?? detail.error ?? factors.error ?? responses.error;
  if (error || !detail.data || !project.data) return <ErrorNote error={error} />;
  const d = detail.data;
  const b = d.build;
  const curves = d.curves;
  const bench = benchmark.data ?? null;
  const isBenchmark = bench?.kind === 'build' && bench.buildId === b.id;
  const maySetBenchmark = can(project.data.myRole, 'setBenchmark');

  const addFiles = (files: File[]) => {
    const rows = files.map((file, i) => ({ key: `${Date.now()}-${i}-${file.name}`, file, buildId, state: 'waiting' as const, progress: 0 }));
    batch.setRows((r) => [...rows, ...r]);
    rows.forEach((row) => batch.send(row, {}));
  };

  return (
    <div className="max-w-7xl">
      <PageHeader
        eyebrow={<Link to={`/projects/${projectId}`} className="hover:underline">{project.data.name}</Link>}
        title={<span className="flex items-center gap-3">{b.code} <StatusBadge status={b.status} />{isBenchmark && <BenchmarkBadge note={bench!.note} />}</span>}
        subtitle={b.changeNote ?? undefined}
        actions={
          <>
            {d.permissions.edit && b.status !== 'discarded' && (
              <Button variant="danger" onClick={async () => { if (await confirm({ title: `Discard ${b.code}?`, message: 'It leaves the gains, fits and proposals but stays in the records, and can be restored from this page.', confirmLabel: `Discard ${b.code}` })) update.mutate({ status: 'discarded' }); }}>Discard</Button>
            )}
            {d.permissions.edit && b.status === 'discarded' && <Button onClick={() => update.mutate({ status: 'tested' })}>Restore</Button>}
            {maySetBenchmark && b.status !== 'discarded' && !isBenchmark && (
              <Button
                disabled={setBenchmark.isPending}
                onClick={async () => {
                  const now = bench ? `It replaces the current benchmark, ${bench.label}.` : 'The project has no benchmark yet.';
                  if (await confirm({ title: `Make ${b.code} the project’s benchmark?`, message: `Every polarization plot of the project will show its curve, and values can be shown as a difference from it. ${now}`, confirmLabel: `Make ${b.code} the benchmark` })) setBenchmark.mutate({ buildId: b.id, note: '' });
                }}
              >
                Mark as benchmark
              </Button>
            )}
            {maySetBenchmark && isBenchmark && <Button disabled={clearBenchmark.isPending} onClick={() => clearBenchmark.mutate()}>Stop using as benchmark</Button>}
            {d.permissions.edit && <LinkButton to={`/projects/${projectId}/builds/new?parent=${b.id}`}>New child build</LinkButton>}
            {d.permissions.edit && <LinkButton variant="primary" to={`/projects/${projectId}/builds/${b.id}/edit`}>Edit</LinkButton>}
          </>
        }
      />
      {confirmDialog}
      <ErrorNote error={update.error ?? setBenchmark.error ?? clearBenchmark.error} />
      <div className="grid gap-4 lg:grid-cols-3">
        <Panel title="Recipe"><Recipe detail={d} factors={factors.data!} /></Panel>
        <Panel title="Test conditions"><Conditions detail={d} /></Panel>
        <Panel title="Lineage"><Lineage detail={d} projectId={projectId} /></Panel>
      </div>
      <Panel title="Precious-metal economy" className="mt-4"><MetalEconomyFigures build={b} settings={project.data.settings} /></Panel>
      {responses.data!.length > 0 && (
        <Panel title="Hand-entered responses" className="mt-4">
          <dl className="flex flex-wrap gap-8 text-sm">
            {responses.data!.map((r) => <div key={r.key}><dt className="text-xs text-ink-500">{r.label}</dt><dd className="num">{withUnit(b.responses[r.key], r.unit)}</dd></div>)}
          </dl>
        </Panel>
      )}
      {b.notes && (
        <Panel title="Notes" className="mt-4"><p className="whitespace-pre-wrap text-sm text-ink-800">{b.notes}</p></Panel>
      )}
      <Panel title="Curves and metrics" className="mt-4">
        <CurveShelf
          curves={curves}
          build={{ id: b.id, code: b.code, status: b.status }}
          projectId={projectId}
          canChoose={d.permissions.upload}
          renderCurve={(shown, overlays) => <CurveView key={shown.id} curve={shown} overlays={overlays} project={project.data} detail={d} benchmark={bench} />}
          empty={<EmptyState title="No curves yet">{d.permissions.upload ? 'Upload a polarization curve to see metrics.' : 'When the build’s curves are uploaded, its polarization plot and metrics show here.'}</EmptyState>}
        />
        {d.permissions.upload && (
          <div className="mt-4">
            <DropZone onFiles={addFiles} />
            <UploadRows
              rows={batch.rows}
              projectId={projectId}
              settings={project.data.settings}
              buildCodeOf={() => b.code}
              onConfirm={(row, mapping, opts) => batch.send(row, { mapping, kind: opts.kind, saveProfileAs: opts.saveProfileAs, areaCm2: opts.areaCm2, sheet: opts.sheet })}
              onSkip={(row) => batch.patch(row.key, { state: 'error', message: 'Skipped: nothing was stored.' })}
            />
          </div>
        )}
      </Panel>
      <ReviewThread buildId={buildId} projectId={projectId} permissions={d.permissions} status={b.status} />
    </div>
  );
}
