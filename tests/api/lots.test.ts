// Catalyst lots through the routes: the demo small batch and scale-up, the builds made from each
// with their metal loading, the lot-to-lot comparison at matched recipes, and the refusals.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHarness, demoIds, type Harness } from './harness';

let h: Harness;
let ids: ReturnType<typeof demoIds>;
const lotId = (name: string) => (h.ctx.db.$client.prepare('select id from lots where name = ?').get(name) as { id: number }).id;

beforeAll(async () => {
  h = await createHarness();
  ids = demoIds(h.ctx);
});
afterAll(() => h.close());

describe('lots', () => {
  it('lists the demo lots with their build counts, for a viewer too', async () => {
    const res = await h.as.viewer.get(`/api/projects/${ids.project('C')}/lots`);
    expect(res.status).toBe(200);
    const byName = Object.fromEntries(res.body.lots.map((l: { name: string }) => [l.name, l]));
    expect(byName['FNC-24-07']).toMatchObject({ batchSizeG: 5, metalWtPct: 2, buildCount: 20 }); // demo seed: every cathode build but C-011
    expect(byName['FNC-24-11']).toMatchObject({ batchSizeG: 60, buildCount: 1 }); // demo seed: C-011
  });

  it('reads a lot with its builds: measured metal loading where recorded', async () => {
    const res = await h.as.partner.get(`/api/lots/${lotId('FNC-24-11')}`);
    expect(res.status).toBe(200);
    expect(res.body.builds.map((b: { code: string }) => b.code)).toEqual(['C-011']);
    expect(res.body.builds[0]).toMatchObject({ metalLoadingMgCm2: 0.06, metalLoadingSource: 'measured' }); // demo seed
  });

  it('derives metal loading from catalyst loading × metal content when not measured', async () => {
    const lot = await h.as.researcher.post(`/api/projects/${ids.project('C')}/lots`, { name: 'FNC-26-01', maker: 'own bench', batchSizeG: 2, metalWtPct: 2.5, madeOn: '2026-11-01' });
    expect(lot.status).toBe(201);
    h.ctx.db.$client.prepare('update builds set lot_id = ?, metal_loading_mg_cm2 = null where code = ?').run(lot.body.lot.id, 'C-019');
    const res = await h.as.pi.get(`/api/lots/${lot.body.lot.id}`);
    expect(res.body.builds[0].metalLoadingMgCm2).toBeCloseTo(0.075, 12); // derived by hand: 3.0 mg/cm² × 2.5 wt %
    expect(res.body.builds[0].metalLoadingSource).toBe('from lot metal content');
  });

  it('compares the scale-up with the small batch at matched recipes only', async () => {
    const res = await h.as.viewer.get(`/api/lots/${lotId('FNC-24-11')}/comparison?against=${lotId('FNC-24-07')}&response=vAtRef`);
    expect(res.status).toBe(200);
    expect(res.body.lot.name).toBe('FNC-24-11');
    expect(res.body.against.name).toBe('FNC-24-07');
    // demo seed: C-011 (scale-up) has the recipe of C-010 (small batch), one build each
    expect(res.body.matchedRecipes).toHaveLength(1);
    expect(res.body.a.n).toBe(1);
    expect(res.body.b.n).toBe(1);
    expect(res.body.welch).toBeNull(); // fewer than 2 builds a side: no interval
    expect(res.body.unmatched).toBeGreaterThan(0);
  });

  it('refuses a duplicate name, a bad metal content, an unknown comparison lot and a viewer’s write', async () => {
    const dup = await h.as.pi.post(`/api/projects/${ids.project('C')}/lots`, { name: 'FNC-24-07' });
    expect(dup.status).toBe(409);
    const bad = await h.as.pi.post(`/api/projects/${ids.project('C')}/lots`, { name: 'X-1', metalWtPct: 140 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/metalWtPct/);
    const other = await h.as.pi.get(`/api/lots/${lotId('FNC-24-11')}/comparison?against=${lotId('PRA-26-02')}`);
    expect(other.status).toBe(400);
    expect(other.body.error.details.fields[0].path).toBe('against');
    const viewer = await h.as.viewer.patch(`/api/lots/${lotId('FNC-24-07')}`, { notes: 'x' });
    expect(viewer.status).toBe(403);
    const edited = await h.as.researcher.patch(`/api/lots/${lotId('FNC-24-07')}`, { notes: 'acid-washed twice' });
    expect(edited.body.lot.notes).toBe('acid-washed twice');
  });
});
