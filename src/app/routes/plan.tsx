// Plan: generate a designed experiment over the project's factors, read its structure, export
// it, and turn it into planned builds; below, the queue of builds already planned.
import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import type { FactorDef } from '@shared/api-types';
import type { Design } from '@shared/doe/designs/types';
import { useProject, useFactors } from '@/features/projects/api/projects';
import { useBuilds, useLabs } from '@/features/builds/api/builds';
import { useMe } from '@/features/auth/api/get-me';
import { canPlan } from '@/features/projects/components/permissions';
import { useGenerateDesign } from '@/features/plan/api/designs';
import { DesignForm } from '@/features/plan/components/design-form';
import { DesignSummary, DesignTable } from '@/features/plan/components/design-table';
import { PlanRunsPanel } from '@/features/plan/components/plan-runs-panel';
import { PageHeader, Panel, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';
import { StatusBadge } from '@/components/ui/status-badge';
import { formatDate } from '@/lib/format';

export default function PlanPage() {
  const projectId = Number(useParams().projectId);
  const project = useProject(projectId);
  const factors = useFactors(projectId);
  const builds = useBuilds(projectId);
  const labs = useLabs();
  const me = useMe();
  const generate = useGenerateDesign(projectId);
  const [result, setResult] = useState<{ design: Design; factors: FactorDef[] } | null>(null);

  if (project.isLoading || factors.isLoading || builds.isLoading) return <Loading />;
  const error = project.error ?? factors.error ?? builds.error;
  if (error || !project.data) return <ErrorNote error={error} />;
  const p = project.data;
  const planned = builds.data!.filter((b) => b.status === 'planned');
  const allowed = canPlan(p.myRole);

  return (
    <div className="flex flex-col gap-5">
      <PageHeader eyebrow={p.name} title="Plan" subtitle="Designed experiments over this project's factors, and the queue of planned builds." />
      {!allowed ? (
        <EmptyState title="Planning is for the project's PI and researchers">Your role can read the planned builds below.</EmptyState>
      ) : factors.data!.length === 0 ? (
        <EmptyState title="No factors yet" action={<Link className="text-copper-700 hover:underline" to={`/projects/${projectId}/settings`}>Add factors in settings</Link>}>A design needs factors with ranges (continuous) or levels (categorical).</EmptyState>
      ) : (
        <div className="grid gap-5 lg:grid-cols-[22rem_1fr]">
          <Panel title="New design">
            <DesignForm factors={factors.data!} busy={generate.isPending} onSubmit={(body) => generate.mutate(body, { onSuccess: setResult })} />
            <div className="mt-3"><ErrorNote error={generate.error} /></div>
          </Panel>
          <div className="flex min-w-0 flex-col gap-5">
            {result ? (
              <>
                <Panel title="Design">
                  <DesignSummary design={result.design} factors={result.factors} />
                  <div className="mt-4"><DesignTable design={result.design} factors={result.factors} fileName={`${p.codePrefix}-${result.design.kind}-seed${result.design.info.seed}`} /></div>
                </Panel>
                <Panel title="Turn into planned builds">
                  <PlanRunsPanel key={`${result.design.info.seed}-${result.design.runs.length}-${result.design.kind}`} projectId={projectId} design={result.design} builds={builds.data!} labs={labs.data ?? []} homeLabId={me.data?.user.labId ?? null} />
                </Panel>
              </>
            ) : (
              <EmptyState title="No design yet">Choose a design and its factors, then generate it to see the runs.</EmptyState>
            )}
          </div>
        </div>
      )}
      <Panel title={`Planned builds (${planned.length})`}>
        {planned.length === 0 ? (
          <p className="text-sm text-ink-500">Nothing planned. Planned builds appear here until they are made.</p>
        ) : (
          <table className="w-full text-sm" aria-label="Planned builds">
            <thead className="text-left text-xs text-ink-700">
              <tr><th className="py-1">Build</th><th>Status</th><th>Recipe</th><th>Lab</th><th>Planned for</th></tr>
            </thead>
            <tbody>
              {planned.map((b) => (
                <tr key={b.id} className="border-t border-line">
                  <td className="py-1"><Link to={`/projects/${projectId}/builds/${b.id}`} className="font-medium text-copper-700 hover:underline">{b.code}</Link></td>
                  <td><StatusBadge status={b.status} /></td>
                  <td className="text-ink-700">{factors.data!.map((f) => b.factors[f.key] !== undefined ? `${f.label} ${b.factors[f.key]}${f.unit ? ` ${f.unit}` : ''}` : null).filter(Boolean).join(' · ')}</td>
                  <td>{b.labName ?? '—'}</td>
                  <td>{formatDate(b.builtOn)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </Panel>
    </div>
  );
}
