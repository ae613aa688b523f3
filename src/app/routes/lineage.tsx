// Lineage: the tree of builds from each baseline with the chosen response on every node, the best
// path highlighted, planned builds shown as such; one click turns the best path into a waterfall.
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { useProject } from '@/features/projects/api/projects';
import { useLineage } from '@/features/lineage/api/get-lineage';
import { LineageTree } from '@/features/lineage/components/lineage-tree';
import { PageHeader, Panel, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';
import { Field, Select } from '@/components/ui/field';
import { LinkButton } from '@/components/ui/button';
import { responseDisplay } from '@/lib/format';
import { useTargets } from '@/features/targets/api/targets';
import { conversionFactor } from '@shared/targets/target-units';
import { targetStatement } from '@/features/targets/components/target-status';

export default function LineagePage() {
  const projectId = Number(useParams().projectId);
  const [params, setParams] = useSearchParams();
  const response = params.get('response') ?? 'vAtRef';
  const project = useProject(projectId);
  const lineage = useLineage(projectId, response);
  const targets = useTargets(projectId);
  if (project.isLoading || lineage.isLoading) return <Loading />;
  const error = project.error ?? lineage.error;
  if (error || !project.data || !lineage.data) return <ErrorNote error={error} />;
  const data = lineage.data;
  const best = data.bestPath;
  // the first target on this response, in the response's own unit
  const onResponse = (targets.data ?? []).map((t) => ({ t, factor: t.metric === data.response.key ? conversionFactor(t.unit, data.response.unit) : null })).find((x) => x.factor != null);
  const target = onResponse ? { label: onResponse.t.name ? `${onResponse.t.name} (${targetStatement(onResponse.t)})` : targetStatement(onResponse.t), value: onResponse.t.value * onResponse.factor!, comparator: onResponse.t.comparator } : null;
  const goal = data.response.goal === 'minimize' ? 'lowest' : data.response.goal === 'target' ? 'closest to target' : 'highest';
  return (
    <div className="max-w-6xl">
      <PageHeader
        eyebrow={<Link to={`/projects/${projectId}`} className="hover:underline">{project.data.name}</Link>}
        title="Lineage"
        subtitle="Every build under the build it was derived from; replicates (same recipe, or marked as replicates) share one row, with their mean, SD and n."
        actions={best ? <LinkButton variant="primary" to={`/projects/${projectId}/gains?response=${encodeURIComponent(response)}&builds=${best.buildIds.join(',')}`}>Show the best path as gains</LinkButton> : undefined}
      />
      <Panel
        title={<span>Tree by {data.response.label}</span>}
        actions={
          <div className="w-64">
            <Field label="Response">
              {(props) => (
                <Select {...props} value={response} onChange={(e) => { const p = new URLSearchParams(params); p.set('response', e.target.value); setParams(p); }}>
                  {data.responses.map((r) => { const d = responseDisplay(r); return <option key={r.key} value={r.key}>{d.label}{d.unit ? ` (${d.unit})` : ''}</option>; })}
                </Select>
              )}
            </Field>
          </div>
        }
      >
        <p className="mb-3 text-xs text-ink-500">
          {best ? `Best path: baseline to the ${goal} ${data.response.label} among builds that descend from a baseline (copper rail; the best build is starred). ` : `No build has a measured ${data.response.label} yet. `}
          Planned builds are dashed; discarded builds are shown but not counted.
        </p>
        {target && (
          <p className="mb-3 flex items-center gap-2 text-sm text-[#a34700]" role="note">
            <svg aria-hidden width="22" height="8"><path d="M0 4h22" stroke="#D55E00" strokeWidth="2" strokeDasharray="5 3" /></svg>
            Target: {target.label}. Each measured row says whether it meets it or how far it has to go.
          </p>
        )}
        {data.nodes.length === 0 ? <EmptyState title="No builds yet">Create a baseline build, then derive builds from it.</EmptyState> : <LineageTree data={data} projectId={projectId} target={target} />}
      </Panel>
    </div>
  );
}
