// Lineage of a project: replicate groups, the tree of builds from each baseline with the chosen
// response on every node, the best path, and each build's recipe change from its parent.
import type { AppContext } from '../context';
import type { ProjectAccess } from '../auth/access';
import { AppError } from '../lib/errors';
import { listBuilds } from '../builds/service';
import { listFactors, listResponses } from '../projects/service';
import { bestPath, buildLineageTree, describeChanges, diffRecipe, groupReplicates, type LineageGoal, type LineageTree, type RecipeChange, type ReplicateGrouping } from '../../shared/lineage';
import type { Build, LineageData, ResponseInfo } from '../../shared/api-types';
import { curveResponses, findResponse, knownResponseKeys } from '../../shared/curves/metric-catalogue';

/** The curve metrics and hand-entered responses a project can chart. */
export function projectResponses(ctx: AppContext, projectId: number): ResponseInfo[] {
  const list: ResponseInfo[] = curveResponses();
  for (const r of listResponses(ctx, projectId)) list.push({ key: r.key, label: r.label, unit: r.unit, goal: r.goal, target: r.target, source: 'hand-entered' });
  return list;
}

export function resolveResponse(ctx: AppContext, projectId: number, key: string): ResponseInfo {
  const defs = listResponses(ctx, projectId);
  const found = findResponse(key, defs);
  if (!found) {
    const known = knownResponseKeys(defs).join(', ');
    throw new AppError(400, 'validation', `Invalid query: response: "${key}" is neither a curve metric nor a hand-entered response of this project (known: ${known})`, { fields: [{ path: 'response', message: 'unknown response' }] });
  }
  return found;
}

export function goalOf(response: ResponseInfo): LineageGoal {
  if (response.goal === 'target' && response.target != null) return { target: response.target };
  return response.goal === 'minimize' ? 'minimize' : 'maximize';
}

export interface ProjectLineage {
  builds: Build[];
  byId: Map<number, Build>;
  grouping: ReplicateGrouping;
  tree: LineageTree;
  /** measured value of the response on one build, null when not measured */
  valueOf: (build: Build) => number | null;
}

export function valueFor(build: Build, key: string): number | null {
  const value = build.values[key];
  return typeof value === 'number' && Number.isFinite(value) ? value : null;
}

/** Everything lineage and gains need for one response, computed once. */
export function loadLineage(ctx: AppContext, access: ProjectAccess, responseKey: string): ProjectLineage {
  const builds = listBuilds(ctx, access);
  const byId = new Map(builds.map((b) => [b.id, b]));
  const grouping = groupReplicates(builds.map((b) => ({ id: b.id, factors: b.factors, loadingMgCm2: b.loadingMgCm2, catalystLot: b.catalystLot, labId: b.labId, replicateOf: b.replicateOf, status: b.status })));
  // Discarded builds show in the tree but carry no value into any summary.
  const valueOf = (b: Build) => (b.status === 'discarded' ? null : valueFor(b, responseKey));
  const tree = buildLineageTree(
    builds.map((b) => ({ id: b.id, code: b.code, parentId: b.parentId, status: b.status, changeNote: b.changeNote, value: valueOf(b) })),
    grouping,
  );
  return { builds, byId, grouping, tree, valueOf };
}

/** The recipe change of a build from its parent, as data and as text. */
export function changesFromParent(child: Build, parent: Build | undefined, factors: ReturnType<typeof listFactors>): { changes: RecipeChange[]; text: string } | null {
  if (!parent) return null;
  const snapshot = (b: Build) => ({ factors: b.factors, loadingMgCm2: b.loadingMgCm2, metalLoadingMgCm2: b.metalLoadingMgCm2, catalystLot: b.catalystLot, labName: b.labName, testConditions: b.testConditions as Record<string, number | string | null | undefined> });
  const changes = diffRecipe(snapshot(parent), snapshot(child), factors);
  return { changes, text: describeChanges(changes) };
}

export function lineageView(ctx: AppContext, access: ProjectAccess, responseKey: string): Omit<LineageData, 'responses'> {
  const response = resolveResponse(ctx, access.projectId, responseKey);
  const lineage = loadLineage(ctx, access, response.key);
  const factors = listFactors(ctx, access.projectId);
  const best = bestPath(lineage.tree, goalOf(response));
  const onPath = new Set(best?.path ?? []);
  const nodes = lineage.tree.nodes.map((node) => {
    const representative = lineage.byId.get(node.buildId)!;
    const memberWithParent = node.parentBuildId != null ? node.members.map((m) => lineage.byId.get(m.id)!).find((m) => m.parentId === node.parentBuildId) ?? representative : representative;
    const diff = node.parentBuildId != null ? changesFromParent(memberWithParent, lineage.byId.get(node.parentBuildId), factors) : null;
    return {
      groupId: node.groupId,
      buildId: node.buildId,
      code: node.code,
      changeNote: node.changeNote,
      status: node.status,
      planned: node.members.every((m) => m.status === 'planned'),
      members: node.members,
      parentGroupId: node.parentGroupId,
      parentBuildId: node.parentBuildId,
      children: node.children,
      depth: node.depth,
      value: node.summary,
      changes: diff?.changes ?? [],
      changeText: diff?.text ?? null,
      onBestPath: onPath.has(node.groupId),
      best: best?.bestGroupId === node.groupId,
    };
  });
  return {
    response,
    nodes,
    roots: lineage.tree.roots,
    bestPath: best ? { bestGroupId: best.bestGroupId, buildIds: best.path } : null,
    cutLoops: lineage.tree.cutLoops,
  };
}
