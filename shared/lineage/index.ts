// Lineage: recipe diffs, replicate groups, the lineage tree and the best path through it.
export { diffRecipe } from './recipe-diff';
export type { RecipeChange, RecipeFactor, RecipeSnapshot } from './recipe-diff';
export { describeChanges } from './describe-changes';
export { groupReplicates } from './replicate-groups';
export type { ReplicateCandidate, ReplicateGroup, ReplicateGrouping } from './replicate-groups';
export { buildLineageTree } from './lineage-tree';
export type { LineageBuild, LineageMember, LineageTree, LineageTreeNode } from './lineage-tree';
export { bestPath } from './best-path';
export type { BestPath, LineageGoal } from './best-path';
