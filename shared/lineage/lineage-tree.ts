// The family tree of a project's builds: each node is one replicate group (the builds of one
// recipe), hung under the group of its parent build, with the group's mean, SD and n.
import { summarizeSample } from '../gains/sample-summary';
import type { ReplicateGrouping } from './replicate-groups';

export interface LineageBuild {
  id: number;
  code: string;
  parentId: number | null;
  status: string;
  changeNote: string | null;
  /** the chosen response on this build, null when not measured */
  value: number | null;
}

export interface LineageMember {
  id: number;
  code: string;
  status: string;
  value: number | null;
}

export interface LineageTreeNode {
  /** replicate group id (= the first build of the group) */
  groupId: number;
  /** the group's first build: its code, change note and status speak for the node */
  buildId: number;
  code: string;
  changeNote: string | null;
  status: string;
  members: LineageMember[];
  parentGroupId: number | null;
  /** the parent build (of the member that names one), for recipe diffs */
  parentBuildId: number | null;
  children: number[];
  depth: number;
  /** mean, SD (null when n < 2) and n of the members' measured values; null when none is measured */
  summary: { mean: number; sd: number | null; n: number } | null;
}

export interface LineageTree {
  /** depth-first order, roots in increasing id, children in increasing id */
  nodes: LineageTreeNode[];
  roots: number[];
  /** group ids whose parent link was cut because it closed a loop */
  cutLoops: number[];
}

/**
 * Builds the lineage tree over replicate groups. A group's parent is the group of the parent
 * build named by its earliest member that names one outside the group. A loop of group parents
 * (possible only when grouping merges builds on two branches) is cut at the group met again.
 * Reference: none (tree bookkeeping); summaries as in shared/gains/sample-summary (Chan et al. 1983).
 * Cost: O(n + groups · depth).
 * @throws RangeError when a build is missing from the grouping or a value is not finite.
 * @example buildLineageTree([{ id: 1, code: 'B-001', parentId: null, status: 'tested', changeNote: null, value: 0.6 }], groupReplicates([...])).roots // [1]
 */
export function buildLineageTree(builds: readonly LineageBuild[], grouping: ReplicateGrouping): LineageTree {
  const byId = new Map<number, LineageBuild>();
  for (const build of builds) {
    if (!grouping.groupOf.has(build.id)) throw new RangeError(`buildLineageTree: build ${build.code} (id ${build.id}) is not in the replicate grouping`);
    if (build.value !== null && !Number.isFinite(build.value)) throw new RangeError(`buildLineageTree: values must be finite or null, got ${build.value} on ${build.code}`);
    byId.set(build.id, build);
  }
  const nodes = new Map<number, LineageTreeNode>();
  for (const group of grouping.groups) {
    const present = group.memberIds.filter((id) => byId.has(id));
    if (present.length === 0) continue;
    const first = byId.get(present[0])!;
    const values: number[] = [];
    const members: LineageMember[] = [];
    let parentBuildId: number | null = null;
    for (const id of present) {
      const member = byId.get(id)!;
      members.push({ id: member.id, code: member.code, status: member.status, value: member.value });
      if (member.value !== null) values.push(member.value);
      if (parentBuildId === null && member.parentId !== null && byId.has(member.parentId) && grouping.groupOf.get(member.parentId) !== group.id) parentBuildId = member.parentId;
    }
    const stats = values.length ? summarizeSample(values, `buildLineageTree: group ${first.code}`) : null;
    nodes.set(group.id, {
      groupId: group.id,
      buildId: first.id,
      code: first.code,
      changeNote: first.changeNote,
      status: first.status,
      members,
      parentGroupId: parentBuildId === null ? null : grouping.groupOf.get(parentBuildId)!,
      parentBuildId,
      children: [],
      depth: 0,
      summary: stats ? { mean: stats.mean, sd: stats.sd, n: stats.n } : null,
    });
  }

  // Cut loops: walk up from each node; meeting a node already on this walk closes a loop.
  const cutLoops: number[] = [];
  const settled = new Set<number>();
  for (const id of [...nodes.keys()].sort((a, b) => a - b)) {
    const walk: number[] = [];
    const onWalk = new Set<number>();
    let cursor: number | null = id;
    while (cursor !== null && !settled.has(cursor)) {
      if (onWalk.has(cursor)) {
        nodes.get(cursor)!.parentGroupId = null;
        nodes.get(cursor)!.parentBuildId = null;
        cutLoops.push(cursor);
        break;
      }
      onWalk.add(cursor);
      walk.push(cursor);
      cursor = nodes.get(cursor)!.parentGroupId;
    }
    for (const visited of walk) settled.add(visited);
  }

  for (const node of nodes.values()) if (node.parentGroupId !== null) nodes.get(node.parentGroupId)!.children.push(node.groupId);
  for (const node of nodes.values()) node.children.sort((a, b) => a - b);
  const roots = [...nodes.values()].filter((n) => n.parentGroupId === null).map((n) => n.groupId).sort((a, b) => a - b);
  const ordered: LineageTreeNode[] = [];
  const stack: { id: number; depth: number }[] = [];
  for (let r = roots.length - 1; r >= 0; r--) stack.push({ id: roots[r], depth: 0 });
  while (stack.length) {
    const { id, depth } = stack.pop()!;
    const node = nodes.get(id)!;
    node.depth = depth;
    ordered.push(node);
    for (let c = node.children.length - 1; c >= 0; c--) stack.push({ id: node.children[c], depth: depth + 1 });
  }
  return { nodes: ordered, roots, cutLoops: cutLoops.sort((a, b) => a - b) };
}
