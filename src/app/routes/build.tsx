// One build: recipe, test conditions, lineage, curves with metrics, uploads and the review thread.
import { Link, useParams } from 'react-router-dom';
import { useState } from 'react';
import type { CurveSummary, Project, FactorDef, BuildDetail } from '@shared/api-types';
import { useBuild, useUpdateBuild } from '@/features/builds/api/builds';
import { useFactors, useProject, useResponses } from '@/features/projects/api/projects';
import { useCurve } from '@/features/curves/api/curves';
import { PolarizationPlot, curveTitle } from '@/features/curves/components/polarization-plot';
import { MetricsList, WhatIfReference } from '@/features/curves/components/metrics-panel';
import { DurabilityPlot } from '@/features/curves/components/durability-plot';
import { DurabilityControls } from '@/features/durability/components/durability-controls';
import { DropZone, UploadRows, useUploadBatch } from '@/features/curves/components/upload-panel';
import { PageHeader, Panel, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';
import { StatusBadge } from '@/components/ui/status-badge';
import { Button } from '@/components/ui/button';
import { formatDate, formatNumber, withUnit } from '@/lib/format';
import { ReviewThread } from '@/features/review/components/review-thread';

function Recipe({ detail, factors }: { detail: BuildDetail; factors: FactorDef[] }) {
  const b = detail.build;
  const rows: [string, string][] = [
    ...factors.map((f) => [`${f.label}`, withUnit(b.factors[f.key], f.unit)] as [string, string]),
    ['Catalyst loading', withUnit(b.loadingMgCm2, 'mg/cm²')],
    ['Metal loading', withUnit(b.metalLoadingMgCm2, 'mg/cm²')],
    ['Active area', withUnit(b.areaCm2, 'cm²')],
    ['Catalyst lot', b.catalystLot ?? '—'],
  ];
  return (
    <dl className="grid grid-cols-2 gap-x-6 gap-y-2 text-sm">
      {rows.map(([k, v]) => (
        <div key={k}><dt className="text-xs text-ink-500">{k}</dt><dd className="num text-ink-950">{v}</dd></div>
      ))}
    </dl>
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

function CurveView({ curve, project, detail }: { curve: CurveSummary; project: Project; detail: BuildDetail }) {
  const { data, isLoading, error } = useCurve(curve.id);
  if (curve.kind !== 'polarization') return <DurabilityView curve={curve} />;
  if (isLoading) return <Loading label="Loading points…" />;
  if (error || !data) return <ErrorNote error={error} />;
  const stale = curve.metricsVersion !== project.metricsVersion;
  return (
    <div className="grid gap-4 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
      <PolarizationPlot
        series={[{ name: detail.build.code, points: data.points }]}
        settings={project.settings}
        conditions={detail.build.testConditions}
        title={`${detail.build.code} · ${curveTitle(curve)}`}
        fileName={`${detail.build.code}-polarization`}
      />
      <div className="space-y-3">
        {stale && <p className="text-xs text-amber-700">These metrics were computed for an earlier reference point and are being recomputed.</p>}
        <MetricsList result={curve} settings={project.settings} />
        <p className="text-[11px] text-ink-500">
          {String(curve.summary.steps ?? '?')} current steps{curve.summary.sweeps ? `, sweeps: ${String(curve.summary.sweeps)}` : ''}
          {curve.summary.hysteresisMv != null ? `, hysteresis at j_ref ${formatNumber(Number(curve.summary.hysteresisMv), 1)} mV` : ''} · mapping: {String(curve.summary.mappingSource ?? 'detected')}
          {curve.summary.profileNote ? <span className="block text-amber-700">{String(curve.summary.profileNote)}</span> : null}
          {curve.fileId && <> · <a className="text-copper-700 underline" href={`/api/files/${curve.fileId}/raw`}>raw file</a></>}
        </p>
        <WhatIfReference curve={curve} points={data.points} settings={project.settings} loading={{ loadingMgCm2: detail.build.loadingMgCm2, metalLoadingMgCm2: detail.build.metalLoadingMgCm2 }} />
      </div>
    </div>
  );
}

function DurabilityView({ curve }: { curve: CurveSummary }) {
  // the build is already in the query cache; its permissions say whether the options can be edited
  const build = useBuild(curve.buildId);
  return (
    <div className="grid gap-4 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
      <DurabilityPlot curve={curve} title={curveTitle(curve)} />
      <DurabilityControls curve={curve} buildId={curve.buildId} canEdit={Boolean(build.data?.permissions.upload)} />
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
  const [active, setActive] = useState<number | null>(null);
  if (project.isLoading || detail.isLoading || factors.isLoading || responses.isLoading) return <Loading />;
  const error = project.error ?? detail.error ?? factors.error ?? responses.error;
  if (error || !detail.data || !project.data) return <ErrorNote error={error} />;
  const d = detail.data;
  const b = d.build;
  const curves = d.curves;
  const shown = curves.find((c) => c.id === active) ?? curves[0];

  const addFiles = (files: File[]) => {
    const rows = files.map((file, i) => ({ key: `${Date.now()}-${i}-${file.name}`, file, buildId, state: 'waiting' as const, progress: 0 }));
    batch.setRows((r) => [...rows, ...r]);
    rows.forEach((row) => batch.send(row, {}));
  };

  return (
    <div className="max-w-7xl">
      <PageHeader
        eyebrow={<Link to={`/projects/${projectId}`} className="hover:underline">{project.data.name}</Link>}
        title={<span className="flex items-center gap-3">{b.code} <StatusBadge status={b.status} /></span>}
        subtitle={b.changeNote ?? undefined}
        actions={
          <>
            {d.permissions.edit && b.status !== 'discarded' && (
              <Button variant="danger" onClick={() => { if (window.confirm(`Discard ${b.code}? It stays in the records and can be restored.`)) update.mutate({ status: 'discarded' }); }}>Discard</Button>
            )}
            {d.permissions.edit && b.status === 'discarded' && <Button onClick={() => update.mutate({ status: 'tested' })}>Restore</Button>}
            {d.permissions.edit && <Link to={`/projects/${projectId}/builds/new?parent=${b.id}`}><Button>New child build</Button></Link>}
            {d.permissions.edit && <Link to={`/projects/${projectId}/builds/${b.id}/edit`}><Button variant="primary">Edit</Button></Link>}
          </>
        }
      />
      <ErrorNote error={update.error} />
      <div className="grid gap-4 lg:grid-cols-3">
        <Panel title="Recipe"><Recipe detail={d} factors={factors.data!} /></Panel>
        <Panel title="Test conditions"><Conditions detail={d} /></Panel>
        <Panel title="Lineage"><Lineage detail={d} projectId={projectId} /></Panel>
      </div>
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
      <Panel
        title="Curves and metrics"
        className="mt-4"
        actions={curves.length > 1 ? (
          <div className="flex gap-1" role="tablist" aria-label="Curves">
            {curves.map((c) => (
              <button key={c.id} role="tab" aria-selected={shown?.id === c.id} onClick={() => setActive(c.id)} className={`rounded px-2 py-0.5 text-xs ${shown?.id === c.id ? 'bg-ink-800 text-white' : 'bg-ink-100 text-ink-700 hover:bg-ink-300/40'}`}>
                {c.kind} · {c.label.slice(0, 24)}
              </button>
            ))}
          </div>
        ) : undefined}
      >
        {shown ? <CurveView key={shown.id} curve={shown} project={project.data} detail={d} /> : (
          <EmptyState title="No curves yet">{d.permissions.upload ? 'Upload a polarization curve to see metrics.' : 'When the build’s curves are uploaded, its polarization plot and metrics show here.'}</EmptyState>
        )}
        {d.permissions.upload && (
          <div className="mt-4">
            <DropZone onFiles={addFiles} />
            <UploadRows
              rows={batch.rows}
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
