// Answers of the lineage view (GET /api/projects/:id/lineage) and the gains waterfall
// (GET /api/projects/:id/gains) for one response.
import type { ResponseInfo } from './responses';

export interface LineageNodeView {
  /** replicate group id (= the first build of the group) */
  groupId: number;
  buildId: number;
  code: string;
  changeNote: string | null;
  status: string;
  /** every member of the group is still planned */
  planned: boolean;
  members: { id: number; code: string; status: string; value: number | null }[];
  parentGroupId: number | null;
  parentBuildId: number | null;
  children: number[];
  depth: number;
  /** mean, SD (null when n < 2) and n of the members' measured values; null when none is measured */
  value: { mean: number; sd: number | null; n: number } | null;
  /** recipe change from the parent build */
  changes: { key: string; label: string; unit: string; from: number | string | null; to: number | string | null }[];
  changeText: string | null;
  onBestPath: boolean;
  best: boolean;
}

export interface LineageData {
  response: ResponseInfo;
  /** every response the project can chart */
  responses: ResponseInfo[];
  nodes: LineageNodeView[];
  roots: number[];
  bestPath: { bestGroupId: number; buildIds: number[] } | null;
  /** group ids whose parent link was cut because it closed a loop */
  cutLoops: number[];
}

export interface GainsStep {
  buildId: number;
  code: string;
  /** mean of the step's replicate group, in the response's unit */
  value: number;
  /** change from the previous step (null on the baseline) with its interval */
  gain: number | null;
  low: number | null;
  high: number | null;
  withinNoise: boolean | null;
  n: number;
  sd: number | null;
  method: 'welch' | 'pooled' | 'none';
  note: string | null;
  changeNote: string | null;
  changeText: string | null;
  /** codes of the builds in the step's replicate group */
  replicates: string[];
  status: string;
  /** what the step changed: the electrode, the test conditions, both ('mixed'), or nothing recorded; null on the baseline */
  changeClass: 'electrode' | 'test-conditions' | 'mixed' | 'unchanged' | null;
  /** the labels of the changed test conditions (empty when none) */
  testChanges: string[];
}

export interface GainsData {
  response: ResponseInfo;
  unit: string;
  /** confidence level of the intervals, e.g. 0.95 */
  confidence: number;
  /** the chain the caller gave, or the lineage's best path */
  chain: 'given' | 'best-path';
  pooledSd: { sd: number; df: number; groups: number } | null;
  steps: GainsStep[];
  total: { gain: number; low: number | null; high: number | null; withinNoise: boolean | null; method: string; note: string | null; value: number };
  baseline: { buildId: number; code: string; value: number };
  /** the overall total split by what the steps changed; the three add up to total.gain */
  byClass: { recipeOnlyTotal: number; testConditionTotal: number; mixedTotal: number };
}
