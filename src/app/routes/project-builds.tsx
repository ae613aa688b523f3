// A project's builds table, with shortcuts to create a build, upload curves and compare.
import { useNavigate, useParams } from 'react-router-dom';
import { useState } from 'react';
import { useProject, useFactors, useResponses } from '@/features/projects/api/projects';
import { BUILDS_PAGE_SIZE, useBuildsPage } from '@/features/builds/api/builds';
import { BuildsTable } from '@/features/builds/components/builds-table';
import { PageHeader, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';
import { Button, LinkButton } from '@/components/ui/button';
import { canWrite } from '@/features/projects/components/permissions';
import { useTargets } from '@/features/targets/api/targets';
import { TargetList } from '@/features/targets/components/target-status';
import { Link } from 'react-router-dom';
import { useBenchmark } from '@/features/benchmarks/api/benchmarks';

export default function ProjectBuilds() {
  const projectId = Number(useParams().projectId);
  const project = useProject(projectId);
  // the list is read a page at a time; a project that fits on one page is sorted and filtered whole
  const [page, setPage] = useState(0);
  const builds = useBuildsPage(projectId, page);
  const factors = useFactors(projectId);
  const responses = useResponses(projectId);
  const targets = useTargets(projectId);
  const benchmark = useBenchmark(projectId);
  const navigate = useNavigate();
  const [selected, setSelected] = useState<Set<number>>(new Set());
  if (project.isLoading || builds.isLoading || factors.isLoading || responses.isLoading) return <Loading />;
  const total = builds.data?.total ?? 0;
  const paged = total > BUILDS_PAGE_SIZE;
  const error = project.error ?? builds.error ?? factors.error ?? responses.error;
  if (error || !project.data) return <ErrorNote error={error} />;
  const p = project.data;
  const role = p.myRole;

  return (
    <div>
      <PageHeader
        eyebrow="Project"
        title={p.name}
        subtitle={p.description}
        actions={
          <>
            {selected.size > 0 && (
              <Button onClick={() => navigate(`/projects/${projectId}/compare?builds=${[...selected].join(',')}`)}>Compare {selected.size} selected</Button>
            )}
            {canWrite(role) && <LinkButton to={`/projects/${projectId}/upload`}>Upload curves</LinkButton>}
            {canWrite(role) && <LinkButton variant="primary" to={`/projects/${projectId}/builds/new`}>New build</LinkButton>}
          </>
        }
      />
      {targets.data && targets.data.length > 0 && (
        <section aria-label="Targets" className="mb-4 rounded-lg border border-line bg-panel px-4 py-3">
          <div className="mb-1.5 flex items-baseline justify-between gap-3">
            <h2 className="text-sm font-semibold text-ink-950">Targets</h2>
            <Link className="text-xs text-copper-700 hover:underline" to={`/projects/${projectId}/targets`}>Progress charts</Link>
          </div>
          <TargetList targets={targets.data} />
        </section>
      )}
      {builds.data!.builds.length === 0 ? (
        <EmptyState title="No builds yet" action={canWrite(role) ? <LinkButton variant="primary" to={`/projects/${projectId}/builds/new`}>Record the first build</LinkButton> : undefined}>
          Record an electrode build with its recipe, then upload its polarization curve to see metrics.
        </EmptyState>
      ) : (
        <BuildsTable
          project={p}
          builds={builds.data!.builds}
          serverPages={paged ? { page, pageCount: Math.ceil(total / BUILDS_PAGE_SIZE), total, pageSize: BUILDS_PAGE_SIZE, onPage: setPage, loading: builds.isFetching } : undefined}
          factors={factors.data!}
          responses={responses.data!}
          selected={selected}
          benchmark={benchmark.data ?? null}
          onSelect={(id, on) => setSelected((s) => { const n = new Set(s); if (on) n.add(id); else n.delete(id); return n; })}
        />
      )}
    </div>
  );
}
