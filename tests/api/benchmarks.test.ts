// Benchmarks through the routes: the demo's benchmark build, a PI's imported reference curve with
// its provenance and metrics, the benchmark switched between them, the refusals, and the audit.
import { beforeAll, describe, expect, it } from 'vitest';
import { demoHarness } from './harness';

const t = demoHarness();

// an invented reference curve: steps at 0, 0.05 … 0.4 A/cm² with an HFR column
const REFERENCE = 'Current density (A/cm2),Voltage (V),HFR (Ohm cm2)\n0,0.98,0.12\n0.05,0.74,0.12\n0.1,0.69,0.12\n0.2,0.62,0.12\n0.3,0.57,0.12\n0.4,0.52,0.12\n';

describe('the demo benchmark', () => {
  it('is a build of each demo project, readable by a viewer and a partner, with its polarization points', async () => {
    for (const who of ['viewer', 'partner'] as const) {
      const res = await t.h.as[who].get(`/api/projects/${t.ids.project('C')}/benchmark`);
      expect(res.status).toBe(200);
      const b = res.body.benchmark;
      expect(b.kind).toBe('build');
      expect(b.buildCode).toBe(b.label);
      expect(b.points.j.length).toBeGreaterThan(5);
      expect(b.points.j.length).toBe(b.points.v.length);
      // the values differences are taken from are the build's own values
      const build = await t.h.as[who].get(`/api/builds/${b.buildId}`);
      expect(b.values.vAtRef).toBe(build.body.build.values.vAtRef);
      expect(b.curveId).toBe(build.body.build.recordCurveIds.polarization);
    }
  });
});

describe('a PI imports a reference curve and makes it the benchmark', () => {
  let P: number;
  let refId: number;
  beforeAll(async () => {
    const project = await t.h.as.pi.post('/api/projects', { name: 'Benchmark check project', settings: { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: false, loadingBasis: 'catalyst' } });
    P = project.body.project.id;
  });

  it('has no benchmark at first', async () => {
    const res = await t.h.as.pi.get(`/api/projects/${P}/benchmark`);
    expect(res.status).toBe(200);
    expect(res.body.benchmark).toBeNull();
  });

  it('imports the curve with its provenance and measures it at the project reference point', async () => {
    const res = await t.h.as.pi.upload(`/api/projects/${P}/reference-curves`, { name: 'invented-reference.csv', content: REFERENCE }, {
      label: 'Reference MEA (invented report)', source: 'Invented programme report R-12, figure 3', sourceDate: '2025-03-14', loadingMgCm2: '1.0', temperatureC: '160', cathodeGas: 'air', makeBenchmark: 'true',
    });
    expect(res.status).toBe(201);
    const ref = res.body.referenceCurve;
    expect(ref).toMatchObject({ label: 'Reference MEA (invented report)', source: 'Invented programme report R-12, figure 3', sourceDate: '2025-03-14', loadingMgCm2: 1, pointCount: 6, fileName: 'invented-reference.csv' });
    expect(ref.conditions).toMatchObject({ temperatureC: 160, cathodeGas: 'air' });
    // derived by hand: j_ref = 0.2 A/cm² is a measured step at 0.62 V
    expect(ref.metrics.vAtRef).toBeCloseTo(0.62, 9);
    // derived by hand: V_ref = 0.6 V lies between 0.2 A/cm² (0.62 V) and 0.3 A/cm² (0.57 V)
    expect(ref.metrics.jAtRef).toBeGreaterThan(0.2);
    expect(ref.metrics.jAtRef).toBeLessThan(0.3);
    refId = ref.id;
    // the raw bytes are kept and downloadable, unchanged
    const raw = await t.h.as.viewer.get(`/api/files/${ref.fileId}/raw`).buffer(true);
    expect(raw.status).toBe(404); // the viewer is not a member of this new project: it is not visible
    const own = await t.h.as.pi.get(`/api/files/${ref.fileId}/raw`).buffer(true);
    expect(own.status).toBe(200);
    expect(String(own.body)).toBe(REFERENCE);
  });

  it('is now the benchmark, with the reference curve’s metrics as the values to compare with', async () => {
    const res = await t.h.as.pi.get(`/api/projects/${P}/benchmark`);
    expect(res.body.benchmark).toMatchObject({ kind: 'reference', referenceCurveId: refId, label: 'Reference MEA (invented report)', source: 'Invented programme report R-12, figure 3', sourceDate: '2025-03-14', buildId: null });
    expect(res.body.benchmark.values.vAtRef).toBeCloseTo(0.62, 9);
    expect(res.body.benchmark.points.v).toEqual([0.98, 0.74, 0.69, 0.62, 0.57, 0.52]);
    const one = await t.h.as.pi.get(`/api/reference-curves/${refId}`);
    expect(one.body.points.j).toEqual([0, 0.05, 0.1, 0.2, 0.3, 0.4]);
  });

  it('switches the benchmark to a build of the project, then clears it; audited', async () => {
    const build = await t.h.as.pi.post(`/api/projects/${P}/builds`, { code: 'BM-001', factors: {}, status: 'tested', testedOn: '2026-05-01' });
    const set = await t.h.as.pi.put(`/api/projects/${P}/benchmark`, { buildId: build.body.build.id, note: 'the group’s standard MEA' });
    expect(set.status).toBe(200);
    expect(set.body.benchmark).toMatchObject({ kind: 'build', buildCode: 'BM-001', note: 'the group’s standard MEA', points: null, sourceDate: '2026-05-01' });
    const cleared = await t.h.as.pi.delete(`/api/projects/${P}/benchmark`);
    expect(cleared.body.benchmark).toBeNull();
    const audits = t.h.ctx.db.$client.prepare("select action from audit_log where entity = 'benchmark' and project_id = ? order by id").all(P) as { action: string }[];
    expect(audits.map((a) => a.action)).toEqual(['create', 'update', 'delete']);
  });

  it('refuses a build of another project, both ids, and a reference curve without its source', async () => {
    const other = await t.h.as.pi.put(`/api/projects/${P}/benchmark`, { buildId: t.ids.build('C-001') });
    expect(other.status).toBe(422);
    expect(other.body.error.message).toMatch(/buildId: build \d+ is not a build of this project/);
    const both = await t.h.as.pi.put(`/api/projects/${P}/benchmark`, { buildId: 1, referenceCurveId: refId });
    expect(both.status).toBe(400);
    const noSource = await t.h.as.pi.upload(`/api/projects/${P}/reference-curves`, { name: 'r.csv', content: REFERENCE }, { label: 'No source' });
    expect(noSource.status).toBe(400);
    expect(JSON.stringify(noSource.body)).toMatch(/source/);
    const count = t.h.ctx.db.$client.prepare('select count(*) as n from reference_curves where project_id = ?').get(P) as { n: number };
    expect(count.n).toBe(1);
  });

  it('refuses an unreadable file with its line and column, storing nothing', async () => {
    const bad = 'Current density (A/cm2),Voltage (V)\n0,0.98\n0.1,0.69\n0.2,zero point six\n0.3,0.57\n0.4,0.52\n';
    const res = await t.h.as.pi.upload(`/api/projects/${P}/reference-curves`, { name: 'bad.csv', content: bad }, { label: 'Bad', source: 'nowhere' });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toBe('bad.csv: line 4, column "Voltage (V)": not a number ("zero point six"); nothing was stored.');
    const files = t.h.ctx.db.$client.prepare("select count(*) as n from files where original_name = 'bad.csv'").get() as { n: number };
    expect(files.n).toBe(0);
  });

  it('removes the reference curve; when it is the benchmark the project has none', async () => {
    await t.h.as.pi.put(`/api/projects/${P}/benchmark`, { referenceCurveId: refId });
    const res = await t.h.as.pi.delete(`/api/reference-curves/${refId}`);
    expect(res.status).toBe(200);
    expect((await t.h.as.pi.get(`/api/projects/${P}/benchmark`)).body.benchmark).toBeNull();
    expect((await t.h.as.pi.get(`/api/reference-curves/${refId}`)).status).toBe(404);
  });
});
