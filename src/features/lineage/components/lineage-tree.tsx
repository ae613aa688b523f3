// The lineage as an indented tree: one row per replicate group with its response (mean ± SD, n),
// the recipe change from its parent, its status; the best path marked by a copper rail and a
// word, the best node by a star; planned builds drawn dashed and labelled.
import { Link } from 'react-router-dom';
import { StatusBadge } from '@/components/ui/status-badge';
import { formatNumber, responseDisplay } from '@/lib/format';
import type { BuildStatus } from '@shared/api-types';
import type { LineageData, LineageNodeView } from '../api/get-lineage';

const display = (response: LineageData['response']) => responseDisplay(response);

/** A target on the tree's response: ≥ or ≤ a value in the response's own unit. */
export interface LineageTarget { label: string; value: number; comparator: '>=' | '<=' }

/** Where a node stands against a target: met, or the gap still to close in the display unit. */
function TargetMark({ target, mean, d }: { target: LineageTarget; mean: number; d: ReturnType<typeof display> }) {
  const met = target.comparator === '>=' ? mean >= target.value : mean <= target.value;
  if (met) return <span className="whitespace-nowrap rounded-full border border-[#D55E00]/40 px-1.5 text-[11px] text-[#a34700]" title={`meets ${target.label}`}>meets target</span>;
  const gap = Math.abs(target.value - mean) * d.scale;
  return <span className="whitespace-nowrap text-[11px] text-ink-500" title={`short of ${target.label}`}>{formatNumber(gap, d.digits)} {d.unit} to target</span>;
}

function Row({ node, data, projectId, lone = false, target }: { node: LineageNodeView; data: LineageData; projectId: number; lone?: boolean; target?: LineageTarget | null }) {
  const d = display(data.response);
  const v = node.value;
  return (
    <li
      className={`relative rounded-md border px-3 py-2 ${node.planned ? 'border-dashed border-ink-300 bg-paper/40' : node.onBestPath ? 'border-copper-500 bg-copper-100/40' : 'border-line bg-white'}`}
      style={{ marginLeft: `${node.depth * 1.75}rem` }}
      aria-label={`${node.code}${node.onBestPath ? ', on the best path' : ''}${node.best ? ', best' : ''}`}
    >
      {node.depth > 0 && <span aria-hidden className="absolute -left-5 top-1/2 h-px w-4 bg-ink-300" />}
      <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
        <Link className="font-semibold text-copper-700 hover:underline" to={`/projects/${projectId}/builds/${node.buildId}`}>{node.code}</Link>
        {node.members.length > 1 && (
          <span className="text-xs text-ink-500">
            with {node.members.slice(1).map((m, i) => (
              <span key={m.id}>{i > 0 && ', '}<Link className="hover:underline" to={`/projects/${projectId}/builds/${m.id}`}>{m.code}</Link></span>
            ))} (replicates)
          </span>
        )}
        <StatusBadge status={(node.planned ? 'planned' : node.status) as BuildStatus} />
        {node.best && <span className="inline-flex items-center gap-1 rounded-full bg-copper-600 px-2 py-0.5 text-xs font-medium text-white"><svg aria-hidden width="10" height="10" viewBox="0 0 10 10"><path d="M5 .8 6.3 3.6 9.3 3.9 7 5.9 7.7 8.9 5 7.3 2.3 8.9 3 5.9.7 3.9 3.7 3.6z" fill="currentColor" /></svg>best</span>}
        {node.onBestPath && !node.best && <span className="text-xs font-medium text-copper-700">best path</span>}
        {target && v && <span className="ml-auto"><TargetMark target={target} mean={v.mean} d={d} /></span>}
        <span className={`num text-sm text-ink-950 ${target && v ? '' : 'ml-auto'}`}>
          {v ? <>{formatNumber(v.mean * d.scale, d.digits)}{v.sd != null && <> ± {formatNumber(v.sd * d.scale, Math.max(1, d.digits))}</>} {d.unit} <span className="text-xs text-ink-500">n = {v.n}</span></> : <span className="text-xs text-ink-500">{node.planned ? 'not made yet' : node.status === 'discarded' ? 'discarded: not counted' : 'not measured'}</span>}
        </span>
      </div>
      <div className="mt-0.5 text-xs text-ink-700">
        {node.depth === 0 ? <span className="text-ink-500">{lone ? `no parent${node.changeNote ? ` — ${node.changeNote}` : ''}` : node.changeNote?.toLowerCase().startsWith('baseline') ? node.changeNote : `baseline${node.changeNote ? ` — ${node.changeNote}` : ''}`}</span> : (
          <>
            {node.changeNote && <span>{node.changeNote}</span>}
            {node.changeText && <span className="text-ink-500">{node.changeNote ? ' · ' : ''}recipe: {node.changeText}</span>}
            {!node.changeNote && !node.changeText && <span className="text-ink-500">no recorded change from the parent</span>}
          </>
        )}
      </div>
    </li>
  );
}

/** `target`: the first target on the tree's response; each measured node says whether it meets it. */
export function LineageTree({ data, projectId, target }: { data: LineageData; projectId: number; target?: LineageTarget | null }) {
  const trees: LineageNodeView[][] = [];
  for (const node of data.nodes) {
    if (node.depth === 0) trees.push([]);
    trees[trees.length - 1].push(node);
  }
  // Campaign trees (with children) first, lone builds after.
  const campaigns = trees.filter((t) => t.length > 1);
  const lone = trees.filter((t) => t.length === 1);
  return (
    <div className="space-y-5">
      {campaigns.map((tree) => (
        <section key={tree[0].groupId} aria-label={`Lineage from ${tree[0].code}`}>
          <h3 className="mb-1.5 text-xs font-semibold uppercase tracking-wide text-ink-500">From baseline {tree[0].code}</h3>
          <ul className="space-y-1.5">{tree.map((n) => <Row key={n.groupId} node={n} data={data} projectId={projectId} target={target} />)}</ul>
        </section>
      ))}
      {lone.length > 0 && (
        <section aria-label="Builds without a parent or children">
          <h3 className="mb-1.5 text-xs font-semibold uppercase tracking-wide text-ink-500">Builds without a parent or children</h3>
          <ul className="space-y-1.5">{lone.map((t) => <Row key={t[0].groupId} node={t[0]} data={data} projectId={projectId} lone target={target} />)}</ul>
        </section>
      )}
    </div>
  );
}
