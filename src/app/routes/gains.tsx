// Gains: the step-by-step waterfall of a response along a chain of builds (by default the
// lineage's best path), with 95 % intervals and "within noise" flags; chart and table export.
// The URL keeps the response and the chain (?response=vAtRef&builds=1,4,6) so it can be shared.
import { useState } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { useProject } from '@/features/projects/api/projects';
import { useBuildBriefs } from '@/features/builds/api/builds';
import { useGains } from '@/features/gains/api/get-gains';
import { useLineage } from '@/features/lineage/api/get-lineage';
import { WaterfallChart } from '@/features/gains/components/waterfall-chart';
import { useTargets } from '@/features/targets/api/targets';
import { targetLinesFor } from '@/features/targets/components/target-lines';
import { GainsTable } from '@/features/gains/components/gains-table';
import { ChainEditor } from '@/features/gains/components/chain-editor';
import { PageHeader, Panel, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';
import { Field, Select } from '@/components/ui/field';
import { formatNumber, responseDisplay } from '@/lib/format';
import type { Build, ProjectSettings } from '@shared/api-types';
import { referenceConditions } from '@shared/curves/metric-catalogue';
import { useBenchmark } from '@/features/benchmarks/api/benchmarks';
import { DifferenceToggle } from '@/components/ui/benchmark-badge';

function conditionsText(responseKey: string, settings: ProjectSettings, chainBuilds: Build[]): string {
  const parts = referenceConditions(responseKey, settings, formatNumber);
  const temps = chainBuilds.map((b) => b.testConditions?.temperatureC).filter((t): t is number => typeof t === 'number');
  if (temps.length) {
    const lo = Math.min(...temps), hi = Math.max(...temps);
    parts.push(lo === hi ? `${lo} °C` : `${lo}–${hi} °C`);
  }
  const gases = [...new Set(chainBuilds.map((b) => (b.testConditions?.anodeGas || b.testConditions?.cathodeGas ? `${b.testConditions.anodeGas ?? '?'}/${b.testConditions.cathodeGas ?? '?'}` : null)).filter(Boolean))];
  if (gases.length) parts.push(gases.join(', '));
  parts.push('95 % intervals');
  return parts.join(' · ');
}

export default function GainsPage() {
  const projectId = Number(useParams().projectId);
  const [params, setParams] = useSearchParams();
  const response = params.get('response') ?? 'vAtRef';
  const chainParam = params.get('builds');
  const chain = chainParam ? chainParam.split(',').map(Number).filter((n) => Number.isInteger(n) && n > 0) : null;
  const project = useProject(projectId);
  const targets = useTargets(projectId);
  const builds = useBuildBriefs(projectId);
  const lineage = useLineage(projectId, response);
  const gains = useGains(projectId, response, chain);
  const benchmark = useBenchmark(projectId);
  const [asDifference, setAsDifference] = useState(false);

  const setQuery = (next: { response?: string; builds?: number[] | null }) => {
    const p = new URLSearchParams(params);
    if (next.response !== undefined) p.set('response', next.response);
    if (next.builds !== undefined) {
      if (next.builds === null || next.builds.length === 0) p.delete('builds');
      else p.set('builds', next.builds.join(','));
    }
    setParams(p, { replace: false });
  };

  if (project.isLoading || builds.isLoading) return <Loading />;
  if (project.error || !project.data) return <ErrorNote error={project.error} />;
  const responses = lineage.data?.responses ?? [];
  const data = gains.data;
  const shownChain = data ? data.steps.map((s) => s.buildId) : chain ?? [];
  const byId = new Map((builds.data ?? []).map((b) => [b.id, b]));
  const benchmarkValue = benchmark.data?.values[response];
  const benchmarkLine = benchmark.data && benchmarkValue != null && Number.isFinite(benchmarkValue) ? { label: benchmark.data.label, value: benchmarkValue } : null;
  const fileName = `gains-${project.data.codePrefix}-${response}-${shownChain.map((id) => byId.get(id)?.code ?? id).join('_')}`.slice(0, 120);

  return (
    <div className="max-w-7xl">
      <PageHeader
        eyebrow={<Link to={`/projects/${projectId}`} className="hover:underline">{project.data.name}</Link>}
        title="Gains"
        subtitle="How much each change added, step by step from the baseline — and which steps are bigger than build-to-build noise."
        actions={<Link to={`/projects/${projectId}/lineage?response=${encodeURIComponent(response)}`} className="text-sm text-copper-700 hover:underline">Open the lineage</Link>}
      />
      <div className="grid gap-4 xl:grid-cols-[minmax(0,3fr)_minmax(16rem,1fr)]">
        <Panel title="Waterfall">
          {gains.isLoading ? <Loading label="Computing gains…" /> : gains.error ? (
            <div className="space-y-3">
              <ErrorNote error={gains.error} />
              {chain && <button type="button" className="text-sm text-copper-700 underline" onClick={() => setQuery({ builds: null })}>Show the best path instead</button>}
            </div>
          ) : !data ? (
            <EmptyState title="Nothing to show yet">Upload polarization curves to the builds of a lineage to see its gains.</EmptyState>
          ) : data.steps.length < 2 ? (
            <EmptyState title="Only the baseline so far">Add a build to the chain (on the right) to see a step.</EmptyState>
          ) : (
            <WaterfallChart data={data} subtitle={conditionsText(response, project.data.settings, data.steps.map((s) => byId.get(s.buildId)).filter((b): b is Build => Boolean(b)))} fileName={fileName} targets={targetLinesFor(targets.data, data.response.key, data.unit)} project={project.data.name} benchmark={benchmarkLine} />
          )}
        </Panel>
        <div className="space-y-4">
          <Panel title="Response">
            <Field label="Response" hint="The chain's measured value at the project's reference point; each step's gain is the change from the step before.">
              {(props) => (
                <Select {...props} value={response} onChange={(e) => setQuery({ response: e.target.value })}>
                  {(responses.length ? responses : [{ key: response, label: responseDisplay({ key: response, label: 'V at j_ref', unit: '' }).label, unit: '' }]).map((r) => { const d = responseDisplay(r); return <option key={r.key} value={r.key}>{d.label}{d.unit ? ` (${d.unit})` : ''}</option>; })}
                </Select>
              )}
            </Field>
          </Panel>
          <Panel title="Chain of builds">
            <ChainEditor
              chain={shownChain}
              builds={(builds.data ?? []).map((b) => ({ id: b.id, code: b.code, changeNote: b.changeNote, status: b.status }))}
              onChange={(ids) => setQuery({ builds: ids })}
              onReset={() => setQuery({ builds: null })}
              fromBestPath={!chain}
            />
          </Panel>
        </div>
      </div>
      {data && data.steps.length >= 1 && (
        <Panel title="Steps" className="mt-4" actions={benchmarkLine ? <DifferenceToggle benchmark={benchmark.data} checked={asDifference} onChange={setAsDifference} /> : undefined}>
          <GainsTable data={data} projectId={projectId} fileName={fileName} benchmark={asDifference ? benchmarkLine : null} />
        </Panel>
      )}
    </div>
  );
}
