// Targets through the routes: the demo programme's status (met / not yet), a PI's new target met
// by a build entered by hand, the refusals, and the audit trail.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoHarness } from './harness';

const t = demoHarness();

describe('GET /api/projects/:id/targets', () => {
  it('answers the demo cathode targets with their status, readable by a viewer and a partner', async () => {
    for (const who of ['viewer', 'partner'] as const) {
      const res = await t.h.as[who].get(`/api/projects/${t.ids.project('C')}/targets`);
      expect(res.status).toBe(200);
      const byName = Object.fromEntries(res.body.targets.map((t: { name: string }) => [t.name, t]));
      // demo seed: C-007 (7.5 µV/h, tested 2026-09-11) is the first at or under 8 µV/h
      expect(byName['Durability gate'].status).toMatchObject({ state: 'met', metBy: { code: 'C-007', date: '2026-09-11' } });
      expect(byName['Durability gate'].metricLabel).toBe('Degradation rate');
      const voltage = byName['Stack-ready voltage'].status;
      expect(voltage.state).toBe('not-yet');
      expect(voltage.best.code).toBe(voltage.series.at(-1).bestCode);
      // the gap is the target (650 mV) less the best value, in mV — derived by hand from the answer's own best
      expect(voltage.gap).toBeCloseTo(650 - voltage.best.value, 9);
      expect(voltage.gap).toBeGreaterThan(0);
    }
  });
});

describe('a PI sets a target and a build meets it', () => {
  let P: number;
  let targetId: number;
  beforeAll(async () => {
    const project = await t.h.as.pi.post('/api/projects', { name: 'Target check project', settings: { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: false, loadingBasis: 'catalyst' } });
    P = project.body.project.id;
    await t.h.as.pi.post(`/api/projects/${P}/responses`, { key: 'score', label: 'Score', unit: 'mV', goal: 'maximize' });
  });

  it('creates the target in another unit of the same dimension (V for a response in mV)', async () => {
    const res = await t.h.as.pi.post(`/api/projects/${P}/targets`, { metric: 'score', comparator: '>=', value: 0.2, unit: 'V', name: 'Score gate', dueDate: '2027-01-31', conditions: '180 °C' });
    expect(res.status).toBe(201);
    expect(res.body.target).toMatchObject({ metric: 'score', comparator: '>=', value: 0.2, unit: 'V', name: 'Score gate', dueDate: '2027-01-31', conditions: '180 °C', basis: null });
    expect(res.body.target.status).toMatchObject({ state: 'no-data', best: null, gap: null });
    targetId = res.body.target.id;
  });

  it('is not yet with one build at 150 mV, then met by a build at 200 mV', async () => {
    await t.h.as.pi.post(`/api/projects/${P}/builds`, { code: 'T-001', factors: {}, status: 'tested', testedOn: '2026-05-01', responses: { score: 150 } });
    let list = await t.h.as.pi.get(`/api/projects/${P}/targets`);
    expect(list.body.targets[0].status.state).toBe('not-yet');
    expect(list.body.targets[0].status.gap).toBeCloseTo(0.05, 12); // derived by hand: 0.2 V − 0.150 V
    await t.h.as.pi.post(`/api/projects/${P}/builds`, { code: 'T-002', factors: {}, status: 'tested', testedOn: '2026-06-01', responses: { score: 200 } });
    list = await t.h.as.pi.get(`/api/projects/${P}/targets`);
    expect(list.body.targets[0].status).toMatchObject({ state: 'met', metBy: { code: 'T-002', date: '2026-06-01', value: 0.2 } }); // derived by hand: tie meets
    const home = await t.h.as.pi.get('/api/home');
    const card = home.body.projects.find((p: { id: number }) => p.id === P);
    expect(card.targets[0].status.metBy.code).toBe('T-002');
  });

  it('changes and removes the target, audited', async () => {
    const patched = await t.h.as.pi.patch(`/api/targets/${targetId}`, { value: 250, unit: 'mV' });
    expect(patched.status).toBe(200);
    expect(patched.body.target.status).toMatchObject({ state: 'not-yet', gap: 50 }); // derived by hand: 250 − 200 mV
    const removed = await t.h.as.pi.delete(`/api/targets/${targetId}`);
    expect(removed.status).toBe(200);
    expect((await t.h.as.pi.get(`/api/projects/${P}/targets`)).body.targets).toEqual([]);
    const actions = t.h.ctx.db.$client.prepare("select action from audit_log where entity = 'target' and entity_id = ? order by id").all(targetId).map((r) => (r as { action: string }).action);
    expect(actions).toEqual(['create', 'update', 'delete']);
  });

  it('refuses an unknown metric, a unit that does not convert and a basis on a metric without one, naming the field', async () => {
    const unknown = await t.h.as.pi.post(`/api/projects/${P}/targets`, { metric: 'nope', comparator: '>=', value: 1, unit: 'V' });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.details.fields[0].path).toBe('metric');
    const unit = await t.h.as.pi.post(`/api/projects/${P}/targets`, { metric: 'vAtRef', comparator: '>=', value: 1, unit: 'A/g' });
    expect(unit.status).toBe(400);
    expect(unit.body.error.message).toContain('V at j_ref is measured in V; "A/g" does not convert to it');
    const basis = await t.h.as.pi.post(`/api/projects/${P}/targets`, { metric: 'vAtRef', comparator: '>=', value: 0.6, unit: 'V', basis: 'metal' });
    expect(basis.body.error.details.fields[0].path).toBe('basis');
    const shape = await t.h.as.pi.post(`/api/projects/${P}/targets`, { metric: 'vAtRef', comparator: '>', value: 'high', unit: 'V' });
    expect(shape.status).toBe(400);
    expect(shape.body.error.message).toMatch(/comparator/);
    expect((await t.h.as.pi.get(`/api/projects/${P}/targets`)).body.targets).toEqual([]);
  });

  it('a researcher may read but not set targets; a missing target is 404', async () => {
    await t.h.as.admin.post(`/api/projects/${P}/targets`, { metric: 'score', comparator: '>=', value: 1, unit: 'V' });
    const res = await t.h.as.researcher.post(`/api/projects/${t.ids.project('C')}/targets`, { metric: 'vAtRef', comparator: '>=', value: 0.7, unit: 'V' });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toContain('set targets');
    expect((await t.h.as.pi.patch('/api/targets/999999', { value: 1 })).status).toBe(404);
  });
});
