// The gains waterfall for a chain of builds: each step's change of a response with its 95 %
// interval (Welch where both sides are replicated, else the project's pooled replicate SD).
import type { AppContext } from '../context';
import type { ProjectAccess } from '../auth/access';
import { AppError, unprocessable } from '../lib/errors';
import { classifySteps, computeGains, isTestConditionChange, pooledReplicateSd } from '../../shared/gains';
import { bestPath } from '../../shared/lineage';
import { listFactors } from '../projects/service';
import { changesFromParent, goalOf, loadLineage, resolveResponse } from '../lineage/service';
import type { GainsData } from '../../shared/api-types';

export function gainsFor(ctx: AppContext, access: ProjectAccess, options: { response: string; builds?: number[] }): GainsData {
  const response = resolveResponse(ctx, access.projectId, options.response);
  const lineage = loadLineage(ctx, access, response.key);
  let chain: number[];
  let chainSource: 'given' | 'best-path';
  if (options.builds && options.builds.length) {
    const fields: { path: string; message: string }[] = [];
    const seen = new Set<number>();
    options.builds.forEach((id, position) => {
      if (seen.has(id)) fields.push({ path: `builds.${position}`, message: `build ${id} is listed twice` });
      seen.add(id);
      if (!lineage.byId.has(id)) fields.push({ path: `builds.${position}`, message: `build ${id} is not in this project` });
    });
    if (fields.length) throw new AppError(400, 'validation', `Invalid query: ${fields.map((f) => `${f.path}: ${f.message}`).join('; ')}`, { fields });
    chain = options.builds;
    chainSource = 'given';
  } else {
    const best = bestPath(lineage.tree, goalOf(response));
    if (!best) throw unprocessable('no-values', `No build in this project has a measured ${response.label} (${response.key}) yet: upload a polarization curve or enter the value to see gains.`);
    chain = best.path;
    chainSource = 'best-path';
  }

  // Each step stands for its replicate group: the group's measured values, discarded builds left out.
  const groupValues = new Map<number, { values: number[]; codes: string[] }>();
  for (const group of lineage.grouping.groups) {
    const values: number[] = [];
    const codes: string[] = [];
    for (const id of group.memberIds) {
      const build = lineage.byId.get(id)!;
      codes.push(build.code);
      const value = lineage.valueOf(build);
      if (value !== null) values.push(value);
    }
    groupValues.set(group.id, { values, codes });
  }
  const missing: string[] = [];
  const steps = chain.map((id) => {
    const build = lineage.byId.get(id)!;
    const group = groupValues.get(lineage.grouping.groupOf.get(id)!)!;
    if (group.values.length === 0) missing.push(build.code + (build.status === 'discarded' ? ' (discarded)' : build.status === 'planned' ? ' (planned)' : ''));
    return { buildId: id, code: build.code, changeNote: build.changeNote, values: group.values, replicates: group.codes };
  });
  if (missing.length) {
    throw unprocessable('no-values', `These builds have no measured ${response.label} (${response.key}): ${missing.join(', ')}. Remove them from the chain or add their results.`, { builds: missing });
  }
  const pooled = pooledReplicateSd([...groupValues.values()].map((g) => g.values));
  let result;
  try {
    result = computeGains({ steps, pooled: pooled ? { sd: pooled.sd, df: pooled.df } : null });
  } catch (error) {
    if (error instanceof RangeError) throw unprocessable('cannot-compute', error.message.replace(/^\w+: /, ''));
    throw error;
  }
  const factors = listFactors(ctx, access.projectId);
  const testVariables = new Set(factors.filter((f) => f.testVariable).map((f) => f.key));
  const diffs = result.steps.map((step, k) => {
    const build = lineage.byId.get(step.buildId)!;
    const previous = k > 0 ? lineage.byId.get(result.steps[k - 1].buildId) : undefined;
    return changesFromParent(build, previous, factors);
  });
  const classified = classifySteps(result.steps.map((step, k) => ({ gain: step.gain, changes: diffs[k]?.changes ?? null })), testVariables);
  return {
    response,
    unit: response.unit,
    confidence: 0.95,
    chain: chainSource,
    pooledSd: pooled,
    steps: result.steps.map((step, k) => {
      const build = lineage.byId.get(step.buildId)!;
      const diff = diffs[k];
      return {
        buildId: step.buildId,
        code: step.code,
        value: step.value,
        gain: step.gain,
        low: step.low,
        high: step.high,
        withinNoise: step.withinNoise,
        n: step.n,
        sd: step.sd,
        method: step.method,
        note: step.note,
        changeNote: step.changeNote,
        changeText: diff?.text ?? null,
        replicates: steps[k].replicates,
        status: build.status,
        changeClass: classified.classes[k],
        testChanges: (diff?.changes ?? []).filter((c) => isTestConditionChange(c, testVariables)).map((c) => c.label),
      };
    }),
    total: { ...result.total, value: result.steps[result.steps.length - 1].value },
    baseline: result.baseline,
    byClass: { recipeOnlyTotal: classified.recipeOnlyTotal, testConditionTotal: classified.testConditionTotal, mixedTotal: classified.mixedTotal },
  };
}
