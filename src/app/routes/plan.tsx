// Plan: opens on the queue of planned builds (what to make next, where each came from), then
// designed experiments over the project's factors — generate one, read its structure, export
// it, plan its builds — and the designs already planned.
import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import type { Build, FactorDef } from '@shared/api-types';
import type { Design } from '@shared/doe/designs/types';
import { useProject, useFactors } from '@/features/projects/api/projects';
import { useBuilds, useLabs } from '@/features/builds/api/builds';
import { useMe } from '@/features/auth/api/get-me';
import { canPlan } from '@/features/projects/components/permissions';
import { useDesigns, useGenerateDesign, type StoredDesign } from '@/features/plan/api/designs';
import { DesignForm, KIND_LABELS } from '@/features/plan/components/design-form';
import { DesignSummary, DesignTable } from '@/features/plan/components/design-table';
import { PlanRunsPanel } from '@/features/plan/components/plan-runs-panel';
import { PageHeader, Panel, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';
import { StatusBadge } from '@/components/ui/status-badge';
import { formatDate } from '@/lib/format';
import type { DesignKind } from '@shared/doe/designs/types';

function designName(d: StoredDesign): string {
  const kind = KIND_LABELS[d.kind as DesignKind] ?? 'Design';
  const variant = typeof d.settings.variant === 'string' ? ` (${d.settings.variant})` : '';
  return `${kind}${variant}, ${d.runCount} builds${d.seed != null ? `, seed ${d.seed}` : ''}`;
}

function origin(b: Build, designs: StoredDesign[]): string {
  if (b.designId != null) {
    const d = designs.find((x) => x.id === b.designId);
    return d ? `design ${d.id}: ${designName(d)}` : `design ${b.designId}`;
  }
  if (b.changeNote && /proposal from the surface/.test(b.changeNote)) return 'a surface proposal';
  return 'entered by hand';
}

function recipeText(b: Build, factors: FactorDef[]): string {
  return factors.map((f) => (b.factors[f.key] !== undefined ? `${f.label} ${b.factors[f.key]}${f.kind === 'continuous' && f.unit ? ` ${f.unit}` : ''}` : null)).filter(Boolean).join(' · ');
}

export default function PlanPage() {
  const projectId = Number(useParams().projectId);
  const project = useProject(projectId);
  const factors = useFactors(projectId);
  const builds = useBuilds(projectId);
  const designs = useDesigns(projectId);
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
  const stored = designs.data ?? [];

  return (
    <div className="flex flex-col gap-5">
      <PageHeader eyebrow={p.name} title="Plan" subtitle="The queue of planned builds, and designed experiments over this project's factors." />
      <Panel title={`Planned builds (${planned.length})`}>
        {planned.length === 0 ? (
          <p className="text-sm text-ink-500">Nothing planned. Plan builds from a design below, or from a proposal on the surface page; they stay here until they are made.</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full text-sm" aria-label="Planned builds">
              <thead className="text-left text-xs text-ink-700">
                <tr><th className="py-1 pr-3">Build</th><th className="pr-3">Status</th><th className="pr-3">Recipe</th><th className="pr-3">Lab</th><th className="pr-3">Planned on</th><th>From</th></tr>
              </thead>
              <tbody>
                {planned.map((b) => (
                  <tr key={b.id} className="border-t border-line align-top">
                    <td className="py-1 pr-3"><Link to={`/projects/${projectId}/builds/${b.id}`} className="font-medium text-copper-700 hover:underline">{b.code}</Link></td>
                    <td className="pr-3"><StatusBadge status={b.status} /></td>
                    <td className="pr-3 text-ink-700">{recipeText(b, factors.data!)}</td>
                    <td className="pr-3">{b.labName ?? '—'}</td>
                    <td className="pr-3">{formatDate(b.plannedOn)}</td>
                    <td className="text-ink-700">{origin(b, stored)}{b.planReason ? <span className="block text-xs text-amber-700">▲ flagged; reason: {b.planReason}</span> : null}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </Panel>
      {!allowed ? (
        <EmptyState title="Designing experiments is for the project's PI and researchers">Your role can read the planned builds above.</EmptyState>
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
                  <PlanRunsPanel key={`${result.design.info.seed}-${result.design.runs.length}-${result.design.kind}`} projectId={projectId} design={result.design} factors={factors.data!} builds={builds.data!} labs={labs.data ?? []} homeLabId={me.data?.user.labId ?? null} />
                </Panel>
              </>
            ) : (
              <EmptyState title="No design yet">Choose a design and its factors on the left, then generate it to see the builds it asks for.</EmptyState>
            )}
          </div>
        </div>
      )}
      {stored.length > 0 && (
        <Panel title={`Designs planned so far (${stored.length})`}>
          <ul className="flex flex-col gap-2 text-sm" aria-label="Designs planned so far">
            {stored.map((d) => (
              <li key={d.id} id={`design-${d.id}`} className="border-t border-line pt-2 first:border-0 first:pt-0">
                <span className="font-medium">Design {d.id}: {designName(d)}</span>
                <span className="text-ink-500"> — planned {formatDate(d.createdAt)}{d.createdByName ? ` by ${d.createdByName}` : ''}{d.note ? `; “${d.note}”` : ''}</span>
                <div className="mt-0.5 flex flex-wrap gap-x-2 text-xs">
                  {d.builds.map((b) => <Link key={b.id} to={`/projects/${projectId}/builds/${b.id}`} className="num text-copper-700 hover:underline">{b.code}</Link>)}
                </div>
              </li>
            ))}
          </ul>
        </Panel>
      )}
    </div>
  );
}
