// Surface: opens on a fit of the project's main response with a model chosen from the builds,
// and answers in order: what matters (effects in the response's unit), how far to trust it,
// what if (a recipe typed in, a map of two factors), the next builds, several responses at
// once, and — closed until opened — the full statistics.
import { useEffect, useState } from 'react';
import { useParams } from 'react-router-dom';
import type { Build, ResponseDef } from '@shared/api-types';
import { useProject, useFactors, useResponses } from '@/features/projects/api/projects';
import { useBuilds } from '@/features/builds/api/builds';
import { canPlan } from '@/features/projects/components/permissions';
import { useSurface, type SurfaceRequest } from '@/features/surface/api/surface';
import { FitForm } from '@/features/surface/components/fit-form';
import { EffectsChart } from '@/features/surface/components/effects-chart';
import { FitNotes, ModelChoiceNote, QualitySentence } from '@/features/surface/components/model-quality';
import { TwoFactorMap, WhatIfPanel, defaultAxes, startingRecipe, type Recipe } from '@/features/surface/components/what-if';
import { StatisticsSection } from '@/features/surface/components/statistics-section';
import { DesirabilityPanel } from '@/features/surface/components/desirability-panel';
import { ProposalsPanel } from '@/features/surface/components/proposals-panel';
import { displayOf } from '@/features/surface/components/display';
import { PageHeader, Panel, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';
import { METRICS } from '@/lib/format';

/** The response the page opens on: V at j_ref when builds have it, else the response most builds have. */
function mainResponse(builds: Build[], responses: ResponseDef[]): string {
  const tested = builds.filter((b) => b.status === 'tested' || b.status === 'reviewed');
  const count = (key: string) => tested.filter((b) => typeof b.values[key] === 'number').length;
  if (count('vAtRef') >= 3) return 'vAtRef';
  const keys = [...Object.keys(METRICS), ...responses.map((r) => r.key)];
  let best = 'vAtRef';
  for (const key of keys) if (count(key) > count(best)) best = key;
  return best;
}

export default function SurfacePage() {
  const projectId = Number(useParams().projectId);
  const project = useProject(projectId);
  const factors = useFactors(projectId);
  const responses = useResponses(projectId);
  const builds = useBuilds(projectId);
  const allowed = canPlan(project.data?.myRole ?? null);
  const [request, setRequest] = useState<SurfaceRequest | null>(null);
  const surface = useSurface(projectId, allowed ? request : null);
  const result = surface.data;
  const [recipe, setRecipe] = useState<Recipe | null>(null);

  // open on a fit: the main response, the model chosen from the builds, every factor that varies
  useEffect(() => {
    if (request || !builds.data || !responses.data) return;
    setRequest({ response: mainResponse(builds.data, responses.data), model: 'auto' });
  }, [request, builds.data, responses.data]);
  // a new fit starts the what-if at its best build
  const fitKey = result ? `${result.response.key}|${result.factors.map((f) => f.key).join(',')}|${result.fit.n}` : '';
  useEffect(() => {
    if (result) setRecipe(startingRecipe(result));
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [fitKey]);

  if (project.isLoading || factors.isLoading || responses.isLoading || builds.isLoading) return <Loading />;
  const error = project.error ?? factors.error ?? responses.error ?? builds.error;
  if (error || !project.data) return <ErrorNote error={error} />;
  const p = project.data;
  const s = p.settings;
  const d = result ? displayOf(result.response) : null;
  const conditions = `j_ref ${s.refCurrentDensity} A/cm²${s.irFree ? ', iR-free' : ''}${result?.gases.length ? ` · ${result.gases.join(', ')}` : ''}${result ? ` · ${result.fit.n} builds` : ''}`;
  const axes = result ? defaultAxes(result) : null;

  return (
    <div className="flex flex-col gap-5">
      <PageHeader eyebrow={p.name} title="Surface" subtitle="A response surface fitted on the tested and reviewed builds: which recipe changes matter and by how much, how far to trust the model, and the next builds it proposes." />
      {!allowed ? (
        <EmptyState title="Fitting is for the project's PI and researchers">Your role can read builds and their metrics on the builds table.</EmptyState>
      ) : factors.data!.length === 0 ? (
        <EmptyState title="No factors yet">Add factors in the project settings, record builds with their values, then come back here.</EmptyState>
      ) : (
        <div className="grid gap-5 xl:grid-cols-[1fr_17rem]">
          <div className="flex min-w-0 flex-col gap-5">
            {surface.error ? (
              <>
                <ErrorNote error={surface.error} />
                <EmptyState title="No fit to show yet">Record more tested builds with this response, choose fewer terms, or pick another response on the right.</EmptyState>
              </>
            ) : null}
            {!result && !surface.error && <Loading label="Fitting the builds…" />}
            {result && d && request && (
              <>
                <p className="text-sm text-ink-700">
                  <span className="font-semibold text-ink-950">{d.label} ({d.unit})</span> · {conditions}{surface.isFetching ? ' · refitting…' : ''}
                </p>
                <Panel title="What matters"><EffectsChart result={result} subtitle={conditions} /></Panel>
                <Panel title="How far to trust it">
                  <div className="flex flex-col gap-3">
                    <QualitySentence result={result} />
                    <ModelChoiceNote result={result} />
                    <FitNotes result={result} />
                  </div>
                </Panel>
                {recipe && (
                  <Panel title="What if">
                    <div className="flex flex-col gap-5">
                      <WhatIfPanel result={result} recipe={recipe} onRecipe={setRecipe} />
                      <TwoFactorMap key={fitKey} result={result} recipe={recipe} onRecipe={setRecipe} subtitle={conditions} />
                    </div>
                  </Panel>
                )}
                <Panel title="Next builds">
                  <ProposalsPanel key={JSON.stringify(request)} projectId={projectId} request={request} result={result} allFactors={factors.data!} canPlan={allowed} />
                </Panel>
                {recipe && axes && axes[0] && axes[1] && axes[0] !== axes[1] && (
                  <Panel title="Several responses at once">
                    <DesirabilityPanel projectId={projectId} request={request} base={result} responses={responses.data!} view={{ x: axes[0], y: axes[1], held: recipe }} />
                  </Panel>
                )}
                <details className="rounded-lg border border-line bg-panel">
                  <summary className="cursor-pointer px-4 py-2.5 text-sm font-semibold text-ink-900">Statistics (term tests, shape check, coefficients, every build's residuals; CSV)</summary>
                  <div className="border-t border-line p-4"><StatisticsSection result={result} subtitle={conditions} /></div>
                </details>
              </>
            )}
          </div>
          <Panel title="What is fitted" className="self-start">
            {request ? (
              <FitForm key={`${JSON.stringify(request)}|${result?.factors.map((f) => f.key).join(",") ?? ""}`} factors={factors.data!} responses={responses.data!} initial={{ ...request, factors: request.factors ?? result?.factors.map((f) => f.key) }} busy={surface.isFetching} onFit={setRequest} />
            ) : (
              <Loading />
            )}
          </Panel>
        </div>
      )}
    </div>
  );
}
