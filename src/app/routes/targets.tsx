// A project's targets: each with its status and progress chart (best to date against build date,
// the target line and the due date); PIs add and remove targets here.
import { useParams } from 'react-router-dom';
import { useProject, useResponses } from '@/features/projects/api/projects';
import { useCreateTarget, useDeleteTarget, useTargets } from '@/features/targets/api/targets';
import { TargetForm, type MetricChoice } from '@/features/targets/components/target-form';
import { TargetStatusText, targetStatement } from '@/features/targets/components/target-status';
import { TargetProgressChart } from '@/features/targets/components/target-progress-chart';
import { PageHeader, Panel, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';
import { Button } from '@/components/ui/button';
import { useConfirm } from '@/components/ui/confirm-dialog';
import { CURVE_METRICS, type CurveMetricEntry } from '@shared/curves/metric-catalogue';
import { can } from '@/features/projects/components/permissions';
import { formatDate } from '@/lib/format';

/** The catalogue's metrics, looked up by key. */
const CURVE_METRIC_INFO: Record<string, CurveMetricEntry> = CURVE_METRICS;

export default function TargetsPage() {
  const projectId = Number(useParams().projectId);
  const project = useProject(projectId);
  const targets = useTargets(projectId);
  const responses = useResponses(projectId);
  const create = useCreateTarget(projectId);
  const remove = useDeleteTarget(projectId);
  const [confirm, dialog] = useConfirm();
  if (project.isLoading || targets.isLoading || responses.isLoading) return <Loading />;
  const error = project.error ?? targets.error ?? responses.error;
  if (error || !project.data) return <ErrorNote error={error} />;
  const mayEdit = can(project.data.myRole, 'editTargets');
  const metrics: MetricChoice[] = [
    ...Object.entries(CURVE_METRIC_INFO).map(([key, info]) => ({ key, label: info.label, unit: info.unit })),
    ...(responses.data ?? []).map((r) => ({ key: r.key, label: r.label, unit: r.unit })),
  ];
  const list = targets.data ?? [];
  return (
    <div>
      <PageHeader eyebrow={project.data.name} title="Targets" subtitle="Each programme target with its status and the best value to date, build by build." />
      {list.length === 0 && (
        <EmptyState title="No targets yet">{mayEdit ? 'Add the programme’s first target below: a metric, at least or at most a value, and when it is due.' : 'A PI of the project sets the programme’s targets; they will show here with their progress.'}</EmptyState>
      )}
      <div className="grid gap-4 xl:grid-cols-2">
        {list.map((t) => (
          <Panel
            key={t.id}
            title={t.name || targetStatement(t)}
            actions={mayEdit ? <Button onClick={async () => { if (await confirm({ title: 'Remove this target?', message: `“${t.name || targetStatement(t)}” and its progress chart leave the project pages. The change is kept in the audit log.`, confirmLabel: 'Remove target' })) remove.mutate(t.id); }}>Remove</Button> : undefined}
          >
            <p className="text-sm text-ink-700">{targetStatement(t)}{t.conditions ? ` at ${t.conditions}` : ''}{t.dueDate ? ` · due ${formatDate(t.dueDate)}` : ''}</p>
            <p className="mt-1 text-sm"><TargetStatusText target={t} /></p>
            {t.status.series.length > 0 ? <div className="mt-3"><TargetProgressChart target={t} /></div> : <p className="mt-3 text-sm text-ink-500">Upload a curve or enter a value on a build to start this target’s progress chart.</p>}
          </Panel>
        ))}
      </div>
      {mayEdit && (
        <Panel title="Add a target" className="mt-5">
          <TargetForm metrics={metrics} onSubmit={(v) => create.mutate(v)} pending={create.isPending} error={create.error} />
        </Panel>
      )}
      {dialog}
    </div>
  );
}
