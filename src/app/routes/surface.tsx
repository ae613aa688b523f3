// Surface: fit a response over the project's factors on its tested builds, read the summary,
// look at contours with the other factors held where you like, weigh several responses, and
// plan the next build from a proposal.
import { useEffect, useState } from 'react';
import { useParams } from 'react-router-dom';
import { useProject, useFactors, useResponses } from '@/features/projects/api/projects';
import { canPlan } from '@/features/projects/components/permissions';
import { useSurface, type SurfaceRequest } from '@/features/surface/api/surface';
import { FitForm } from '@/features/surface/components/fit-form';
import { AnovaTable, CoefficientTable, DiagnosticPlots, FitSummary } from '@/features/surface/components/fit-report';
import { ContourPanel, ViewControls, defaultView, type View } from '@/features/surface/components/contour-panel';
import { DesirabilityPanel } from '@/features/surface/components/desirability-panel';
import { ProposalsPanel } from '@/features/surface/components/proposals-panel';
import { displayOf } from '@/features/surface/components/display';
import { PageHeader, Panel, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';

export default function SurfacePage() {
  const projectId = Number(useParams().projectId);
  const project = useProject(projectId);
  const factors = useFactors(projectId);
  const responses = useResponses(projectId);
  const [request, setRequest] = useState<SurfaceRequest | null>(null);
  const allowed = canPlan(project.data?.myRole ?? null);
  const surface = useSurface(projectId, allowed ? request : null);
  const [view, setView] = useState<View | null>(null);
  const result = surface.data;

  // a new set of fitted factors gets fresh axes and held values
  const factorKeys = result?.factors.map((f) => f.key).join('|') ?? '';
  useEffect(() => {
    if (result) setView(defaultView(result.factors));
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [factorKeys]);

  if (project.isLoading || factors.isLoading || responses.isLoading) return <Loading />;
  const error = project.error ?? factors.error ?? responses.error;
  if (error || !project.data) return <ErrorNote error={error} />;
  const p = project.data;
  const initial: SurfaceRequest = { response: 'vAtRef', model: 'linear', factors: factors.data!.map((f) => f.key) };
  const s = p.settings;
  const conditions = `j_ref ${s.refCurrentDensity} A/cm²${s.irFree ? ', iR-free' : ''}${result?.gases.length ? ` · ${result.gases.join(', ')}` : ''}${result ? ` · ${result.fit.n} builds, ${typeof request?.model === 'string' ? request.model : 'own terms'} model` : ''}`;

  return (
    <div className="flex flex-col gap-5">
      <PageHeader eyebrow={p.name} title="Surface" subtitle="A response-surface model fitted on the tested and reviewed builds, in coded units; its plots, and proposals for the next builds." />
      {!allowed ? (
        <EmptyState title="Fitting is for the project's PI and researchers">Your role can read builds and their metrics on the builds table.</EmptyState>
      ) : factors.data!.length === 0 ? (
        <EmptyState title="No factors yet">Add factors in the project settings, record builds with their values, then fit.</EmptyState>
      ) : (
        <div className="grid gap-5 lg:grid-cols-[18rem_1fr]">
          <Panel title="Fit">
            <FitForm factors={factors.data!} responses={responses.data!} initial={request ?? initial} busy={surface.isFetching} onFit={setRequest} />
          </Panel>
          <div className="flex min-w-0 flex-col gap-5">
            <ErrorNote error={surface.error} />
            {!request && <EmptyState title="Nothing fitted yet">Choose a response and a model, then fit. Start with a linear model; add interactions or squares when the runs allow it.</EmptyState>}
            {surface.isFetching && !result && <Loading label="Fitting…" />}
            {result && request && (
              <>
                <Panel title={`${displayOf(result.response).label} (${displayOf(result.response).unit}) — summary`}>
                  <FitSummary result={result} />
                </Panel>
                <Panel title="Coefficients"><CoefficientTable result={result} /></Panel>
                <Panel title="Analysis of variance"><AnovaTable result={result} /></Panel>
                <Panel title="Residuals"><DiagnosticPlots result={result} subtitle={conditions} /></Panel>
                {view && result.factors.filter((f) => f.kind === 'continuous').length >= 2 && (
                  <Panel title="Contours">
                    <ViewControls factors={result.factors} view={view} onChange={setView} />
                    <div className="mt-3"><ContourPanel result={result} view={view} subtitle={conditions} /></div>
                  </Panel>
                )}
                {view && (
                  <Panel title="Several responses">
                    <DesirabilityPanel projectId={projectId} request={request} base={result} responses={responses.data!} view={view} />
                  </Panel>
                )}
                <Panel title="Proposals for the next builds">
                  <ProposalsPanel key={JSON.stringify(request)} projectId={projectId} request={request} result={result} allFactors={factors.data!} canPlan={allowed} />
                </Panel>
              </>
            )}
          </div>
        </div>
      )}
    </div>
  );
}
