// Which builds are replicates of one another: the same recipe made again, or builds marked as a
// replicate of another. A group's mean, SD and n stand for its builds wherever a value is shown.

export interface ReplicateCandidate {
  id: number;
  factors: Record<string, number | string>;
  loadingMgCm2?: number | null;
  catalystLot?: string | null;
  labId?: number | null;
  /** the build this one was marked a replicate of */
  replicateOf?: number | null;
  status: string;
}

export interface ReplicateGroup {
  /** the smallest build id of the group (the first one made) */
  id: number;
  /** build ids in increasing order */
  memberIds: number[];
}

export interface ReplicateGrouping {
  groups: ReplicateGroup[];
  /** build id → group id */
  groupOf: Map<number, number>;
}

/** Builds without a result of their own never pool with others. */
const STANDS_ALONE = new Set(['planned', 'discarded']);

function recipeKey(build: ReplicateCandidate): string {
  const keys = Object.keys(build.factors).sort();
  const parts: string[] = [];
  for (const key of keys) {
    const value = build.factors[key];
    // 12 significant digits: typed-in recipes that differ only by float noise are one recipe
    parts.push(`${key}=${typeof value === 'number' ? Number(value.toPrecision(12)) : JSON.stringify(value)}`);
  }
  const loading = build.loadingMgCm2 == null ? '' : Number(build.loadingMgCm2.toPrecision(12));
  return `${parts.join('|')}#loading=${loading}#lot=${build.catalystLot ?? ''}#lab=${build.labId ?? ''}`;
}

/**
 * Replicate groups: the connected sets of builds linked by "replicate of" marks or by an
 * identical recipe (same factor values, catalyst loading, catalyst lot and lab — partner labs differ
 * systematically, so the same recipe made elsewhere is not a replicate unless marked so).
 * Planned and discarded builds always stand alone. Union–find with path halving.
 * Reference: Tarjan (1975), J. ACM 22, 215–225 (disjoint-set union).
 * Cost: O(n log n) for the recipe keys, near-linear for the unions.
 * @throws RangeError when a build id repeats or is not a positive whole number.
 * @example groupReplicates([{ id: 1, factors: { b: 20 }, status: 'tested' }, { id: 2, factors: { b: 20 }, status: 'tested' }]).groups // [{ id: 1, memberIds: [1, 2] }]
 */
export function groupReplicates(builds: readonly ReplicateCandidate[]): ReplicateGrouping {
  const parent = new Map<number, number>();
  for (const build of builds) {
    if (!Number.isInteger(build.id) || build.id <= 0) throw new RangeError(`groupReplicates: build ids must be positive whole numbers, got ${build.id}`);
    if (parent.has(build.id)) throw new RangeError(`groupReplicates: build ids must be unique, got ${build.id} twice`);
    parent.set(build.id, build.id);
  }
  const find = (id: number): number => {
    let node = id;
    while (parent.get(node) !== node) {
      const up = parent.get(parent.get(node)!)!;
      parent.set(node, up);
      node = up;
    }
    return node;
  };
  const union = (a: number, b: number) => {
    const rootA = find(a);
    const rootB = find(b);
    if (rootA === rootB) return;
    // the smaller id becomes the root so the group id is the first build made
    if (rootA < rootB) parent.set(rootB, rootA);
    else parent.set(rootA, rootB);
  };
  const byId = new Map(builds.map((b) => [b.id, b]));
  const firstWithRecipe = new Map<string, number>();
  for (const build of builds) {
    if (STANDS_ALONE.has(build.status)) continue;
    const marked = build.replicateOf;
    if (marked != null && byId.has(marked) && !STANDS_ALONE.has(byId.get(marked)!.status)) union(build.id, marked);
    const key = recipeKey(build);
    const first = firstWithRecipe.get(key);
    if (first === undefined) firstWithRecipe.set(key, build.id);
    else union(build.id, first);
  }
  const members = new Map<number, number[]>();
  const groupOf = new Map<number, number>();
  for (const build of builds) {
    const root = find(build.id);
    groupOf.set(build.id, root);
    const list = members.get(root) ?? [];
    list.push(build.id);
    members.set(root, list);
  }
  const groups: ReplicateGroup[] = [];
  for (const [id, memberIds] of members) groups.push({ id, memberIds: memberIds.sort((a, b) => a - b) });
  groups.sort((a, b) => a.id - b.id);
  return { groups, groupOf };
}
