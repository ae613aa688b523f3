// Stored numbers follow the build and the current metric rules: a new loading or H₂ crossover
// measures the build's curves again, and curves measured under an older rule are measured again
// at start-up.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHarness, demoIds, type Harness } from './harness';
import { METRICS_ALGORITHM, remeasureOutdatedCurves } from '../../server/curves/service';

let h: Harness;
let ids: ReturnType<typeof demoIds>;
beforeAll(async () => {
  h = await createHarness();
  ids = demoIds(h.ctx);
});
afterAll(() => h.close());

function recordMetrics(buildId: number) {
  const row = h.ctx.db.$client.prepare(`select metrics, summary from curves where build_id = ? and kind = 'polarization' and is_record = 1`).get(buildId) as { metrics: string; summary: string };
  return { metrics: JSON.parse(row.metrics) as Record<string, number | null>, summary: JSON.parse(row.summary) as Record<string, unknown> };
}

describe('a build edit that changes the metrics', () => {
  it('halving the catalyst loading doubles the mass activity of its curves (A/g = j / loading; definition)', async () => {
    const buildId = ids.build('C-001');
    const build = (await h.as.pi.get(`/api/builds/${buildId}`).expect(200)).body.build;
    const before = recordMetrics(buildId).metrics.massActivity;
    expect(before).not.toBeNull();
    await h.as.pi.patch(`/api/builds/${buildId}`, { loadingMgCm2: build.loadingMgCm2 / 2 }).expect(200);
    const after = recordMetrics(buildId).metrics.massActivity;
    expect(after! / before!).toBeCloseTo(2, 9);
    const listed = (await h.as.pi.get(`/api/projects/${build.projectId}/builds`).expect(200)).body.builds.find((b: { id: number }) => b.id === buildId);
    expect(listed.values.massActivity).toBeCloseTo(after!, 9);
  });
});

describe('curves measured under an older rule', () => {
  it('are measured again, and stamped with the current rule', () => {
    const sqlite = h.ctx.db.$client;
    const buildId = ids.build('C-002');
    const { metrics } = recordMetrics(buildId);
    sqlite.prepare(`update curves set metrics = json_set(metrics, '$.vAtRef', 9.99), summary = json_remove(summary, '$.metricsAlgorithm') where build_id = ? and kind = 'polarization'`).run(buildId);
    expect(remeasureOutdatedCurves(h.ctx)).toBeGreaterThan(0);
    const again = recordMetrics(buildId);
    expect(again.metrics.vAtRef).toBeCloseTo(metrics.vAtRef!, 12);
    expect(again.summary.metricsAlgorithm).toBe(METRICS_ALGORITHM);
    expect(remeasureOutdatedCurves(h.ctx)).toBe(0);
  });
});
