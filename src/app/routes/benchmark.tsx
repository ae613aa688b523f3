// The project's benchmark: what it is (a build or a reference curve with its provenance), its
// curve and metrics, and the project's reference curves; PIs choose the benchmark and import or
// remove reference curves here.
import { Link, useParams } from 'react-router-dom';
import { useProject } from '@/features/projects/api/projects';
import { useBenchmark, useClearBenchmark, useDeleteReference, useImportReference, useReferenceCurves, useSetBenchmark, type BenchmarkView, type ReferenceCurveView } from '@/features/benchmarks/api/benchmarks';
import { ReferenceCurveForm } from '@/features/benchmarks/components/reference-form';
import { PolarizationPlot, conditionsLine } from '@/features/curves/components/polarization-plot';
import { PageHeader, Panel, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';
import { Button } from '@/components/ui/button';
import { useConfirm } from '@/components/ui/confirm-dialog';
import { can } from '@/features/projects/components/permissions';
import { formatDate, formatMetric, METRICS } from '@/lib/format';
import type { Project, TestConditions } from '@shared/api-types';

const SHOWN = ['vAtRef', 'vAtRefIrFree', 'jAtRef', 'massActivity', 'peakPower', 'hfr', 'tafelSlope'] as const;

function conditionsText(c: TestConditions): string {
  const parts = [c.temperatureC != null ? `${c.temperatureC} °C` : null, c.anodeGas || c.cathodeGas ? `${c.anodeGas ?? '?'}/${c.cathodeGas ?? '?'}` : null, c.backPressureKPa != null ? `${c.backPressureKPa} kPa back-pressure` : null].filter(Boolean);
  return parts.length ? parts.join(' · ') : 'not stated';
}

function MetricGrid({ values }: { values: Record<string, number | null> }) {
  return (
    <dl className="grid grid-cols-2 gap-x-6 gap-y-2 text-sm sm:grid-cols-4">
      {SHOWN.map((key) => <div key={key}><dt className="text-xs text-ink-500">{METRICS[key]!.label}</dt><dd className="num">{formatMetric(key, values[key])}</dd></div>)}
    </dl>
  );
}

function CurrentBenchmark({ benchmark, project }: { benchmark: BenchmarkView; project: Project }) {
  return (
    <div className="grid gap-4 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
      <div className="min-w-0">
        {benchmark.points ? (
          <PolarizationPlot series={[{ name: benchmark.label, points: { ...benchmark.points, downsampled: false, total: benchmark.points.v.length }, color: '#6f6a62' }]} settings={project.settings} conditions={benchmark.conditions} title={`Benchmark: ${benchmark.label}`} fileName={`benchmark-${project.codePrefix}`} subtitle={conditionsLine(benchmark.conditions, project.settings)} />
        ) : <EmptyState title="No polarization curve">The benchmark build has no polarization curve yet: plots will show it once one is uploaded.</EmptyState>}
      </div>
      <div className="min-w-0 space-y-3 text-sm">
        <p>
          {benchmark.kind === 'build'
            ? <>Build <Link className="font-medium text-copper-700 hover:underline" to={`/projects/${project.id}/builds/${benchmark.buildId}`}>{benchmark.buildCode}</Link>{benchmark.sourceDate ? `, tested ${formatDate(benchmark.sourceDate)}` : ''}.</>
            : <>Reference curve from <span className="font-medium">{benchmark.source}</span>{benchmark.sourceDate ? ` (${formatDate(benchmark.sourceDate)})` : ''}.</>}
        </p>
        {benchmark.note && <p className="text-ink-700">“{benchmark.note}”</p>}
        <p className="text-ink-700">Measured at: {conditionsText(benchmark.conditions)}</p>
        <MetricGrid values={benchmark.values} />
        <p className="text-xs text-ink-500">Set by {benchmark.setBy ?? 'someone'} on {formatDate(benchmark.setAt)}. Every polarization plot of the project shows it as a grey dashed curve (“Show benchmark” hides it); the builds table, compare and gains can show values as differences from it.</p>
      </div>
    </div>
  );
}

function ReferenceRow({ reference, isBenchmark, mayEdit, onBenchmark, onRemove }: { reference: ReferenceCurveView; isBenchmark: boolean; mayEdit: boolean; onBenchmark: () => void; onRemove: () => void }) {
  return (
    <li className="py-3">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <div>
          <span className="font-medium text-ink-950">{reference.label}</span>
          {isBenchmark && <span className="ml-2 rounded-full border border-ink-300 px-2 py-0.5 text-xs text-ink-700">benchmark</span>}
          <div className="text-xs text-ink-500">
            {reference.source}{reference.sourceDate ? ` · ${formatDate(reference.sourceDate)}` : ''} · {conditionsText(reference.conditions)}
            {reference.loadingMgCm2 != null ? ` · ${reference.loadingMgCm2} mg/cm² catalyst` : ''}
            {reference.metalLoadingMgCm2 != null ? ` · ${reference.metalLoadingMgCm2} mg/cm² metal` : ''}
            {' · '}{reference.pointCount} points · imported by {reference.createdBy ?? 'someone'} on {formatDate(reference.createdAt)}
            {reference.fileId != null && <> · <a className="text-copper-700 underline" href={`/api/files/${reference.fileId}/raw`}>raw file{reference.fileName ? ` (${reference.fileName})` : ''}</a></>}
          </div>
        </div>
        {mayEdit && (
          <span className="flex gap-2">
            {!isBenchmark && <Button onClick={onBenchmark}>Make benchmark</Button>}
            <Button variant="danger" onClick={onRemove}>Remove</Button>
          </span>
        )}
      </div>
      <div className="mt-2"><MetricGrid values={reference.metrics as unknown as Record<string, number | null>} /></div>
      {reference.notes && <p className="mt-1 whitespace-pre-wrap text-xs text-ink-500">{reference.notes}</p>}
    </li>
  );
}

export default function BenchmarkPage() {
  const projectId = Number(useParams().projectId);
  const project = useProject(projectId);
  const benchmark = useBenchmark(projectId);
  const references = useReferenceCurves(projectId);
  const setBenchmark = useSetBenchmark(projectId);
  const clear = useClearBenchmark(projectId);
  const importRef = useImportReference(projectId);
  const remove = useDeleteReference(projectId);
  const [confirm, dialog] = useConfirm();
  if (project.isLoading || benchmark.isLoading || references.isLoading) return <Loading />;
  const error = project.error ?? benchmark.error ?? references.error;
  if (error || !project.data) return <ErrorNote error={error} />;
  const p = project.data;
  const mayEdit = can(p.myRole, 'setBenchmark');
  const b = benchmark.data ?? null;
  const list = references.data ?? [];
  return (
    <div className="max-w-7xl">
      <PageHeader
        eyebrow={<Link to={`/projects/${projectId}`} className="hover:underline">{p.name}</Link>}
        title="Benchmark"
        subtitle="The curve every build of the project is measured against: the group’s standard MEA, or a reference curve from outside with its provenance."
        actions={mayEdit && b ? <Button onClick={async () => { if (await confirm({ title: 'Stop using a benchmark?', message: `${b.label} stays in the project; plots stop showing it until a benchmark is chosen again.`, confirmLabel: 'Stop using it' })) clear.mutate(); }}>Stop using a benchmark</Button> : undefined}
      />
      <ErrorNote error={setBenchmark.error ?? clear.error ?? remove.error} />
      <Panel title={b ? `Benchmark: ${b.label}` : 'Benchmark'}>
        {b ? <CurrentBenchmark benchmark={b} project={p} /> : (
          <EmptyState title="No benchmark yet">{mayEdit ? 'Open a build and choose “Mark as benchmark”, or import a reference curve below.' : 'A PI of the project chooses the benchmark: a build or an imported reference curve.'}</EmptyState>
        )}
      </Panel>
      <Panel title="Reference curves" className="mt-4">
        {list.length === 0 ? <p className="text-sm text-ink-500">No reference curves yet. A reference curve is a polarization curve that belongs to no build — a published curve or a partner’s standard MEA — kept with where it comes from.</p> : (
          <ul className="divide-y divide-line">
            {list.map((r) => (
              <ReferenceRow
                key={r.id}
                reference={r}
                isBenchmark={b?.kind === 'reference' && b.referenceCurveId === r.id}
                mayEdit={mayEdit}
                onBenchmark={() => setBenchmark.mutate({ referenceCurveId: r.id, note: '' })}
                onRemove={async () => { if (await confirm({ title: `Remove ${r.label}?`, message: 'The curve leaves the project (its raw file stays stored). If it is the benchmark, the project has none until another is chosen.', confirmLabel: 'Remove reference curve' })) remove.mutate(r.id); }}
              />
            ))}
          </ul>
        )}
      </Panel>
      {mayEdit && (
        <Panel title="Import a reference curve" className="mt-4">
          <ReferenceCurveForm onSubmit={(form) => importRef.mutate(form)} pending={importRef.isPending} error={importRef.error} done={importRef.isSuccess} />
        </Panel>
      )}
      {dialog}
    </div>
  );
}
