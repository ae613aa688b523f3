// The campaign's story line: from a baseline down the lineage to the best measured recipe.
import type { LineageTree } from './lineage-tree';

export type LineageGoal = 'maximize' | 'minimize' | { target: number };

export interface BestPath {
  /** the best node's group id */
  bestGroupId: number;
  /** group ids from the root (baseline) to the best node, inclusive */
  path: number[];
}

const NO_RESULT = new Set(['planned', 'discarded']);

/**
 * The best measured node of the tree and the path to it from its root. "Best" is the highest
 * group mean (maximize), the lowest (minimize) or the closest to the target. Planned and discarded
 * nodes and nodes with no measured value are skipped. Nodes that descend from a baseline (depth ≥ 1)
 * are preferred, since a lone build tells no step-by-step story; only when there are none does a
 * root compete. Ties go to the larger n, then to the earlier group.
 * Reference: none (selection rule); the goal follows the project's response definitions.
 * Cost: O(nodes · depth).
 * @returns null when no node has a measured value.
 * @throws RangeError when the target is not a finite number.
 * @example bestPath(tree, 'maximize')?.path // [1, 4, 6, 7, 10, 18] (group ids)
 */
export function bestPath(tree: LineageTree, goal: LineageGoal): BestPath | null {
  if (typeof goal === 'object' && !Number.isFinite(goal.target)) throw new RangeError(`bestPath: target must be a finite number, got ${goal.target}`);
  const score = (mean: number): number => (goal === 'maximize' ? mean : goal === 'minimize' ? -mean : -Math.abs(mean - goal.target));
  let best: { id: number; score: number; n: number; deep: boolean } | null = null;
  for (const node of tree.nodes) {
    if (!node.summary || NO_RESULT.has(node.status)) continue;
    const candidate = { id: node.groupId, score: score(node.summary.mean), n: node.summary.n, deep: node.depth >= 1 };
    if (
      !best ||
      (candidate.deep && !best.deep) ||
      (candidate.deep === best.deep &&
        (candidate.score > best.score || (candidate.score === best.score && (candidate.n > best.n || (candidate.n === best.n && candidate.id < best.id)))))
    ) {
      best = candidate;
    }
  }
  if (!best) return null;
  const byId = new Map(tree.nodes.map((n) => [n.groupId, n]));
  const path: number[] = [];
  let cursor: number | null = best.id;
  while (cursor !== null && path.length <= tree.nodes.length) {
    path.unshift(cursor);
    cursor = byId.get(cursor)?.parentGroupId ?? null;
  }
  return { bestGroupId: best.id, path };
}
