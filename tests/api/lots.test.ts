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
    expect(byName['FNC-24-07']).toMatchObject({ batchSizeG: 5, metalWtPct: 2, buildCount: 21 }); // demo seed: every cathode build but C-011 and C-022
    expect(byName['FNC-24-11']).toMatchObject({ batchSizeG: 60, buildCount: 2 }); // demo seed: C-011 and its replicate C-022
  });

  it('reads a lot with its builds: measured metal loading where recorded', async () => {
    const res = await h.as.partner.get(`/api/lots/${lotId('FNC-24-11')}`);
    expect(res.status).toBe(200);
    expect(res.body.builds.map((b: { code: string }) => b.code)).toEqual(['C-011', 'C-022']);
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
    // demo seed: C-011 and C-022 (scale-up) have the recipe of C-010 and C-023 (small batch), two builds each
    expect(res.body.matchedRecipes).toHaveLength(1);
    expect(res.body.a.n).toBe(2);
    expect(res.body.b.n).toBe(2);
    const v = async (code: string) => (await h.as.viewer.get(`/api/builds/${ids.build(code)}`)).body.build.values.vAtRef as number;
    const [a1, a2, b1, b2] = [await v('C-010'), await v('C-023'), await v('C-011'), await v('C-022')];
    // Welch–Satterthwaite worked by hand for two values a side: s²/n = (x₁ − x₂)²/4, ν = se⁴ / Σ (s²/n)² (n − 1 = 1)
    const qa = (a1 - a2) ** 2 / 4;
    const qb = (b1 - b2) ** 2 / 4;
    expect(res.body.welch.diff).toBeCloseTo((b1 + b2) / 2 - (a1 + a2) / 2, 12);
    expect(res.body.welch.se).toBeCloseTo(Math.sqrt(qa + qb), 12);
    expect(res.body.welch.df).toBeCloseTo((qa + qb) ** 2 / (qa ** 2 + qb ** 2), 9);
    expect(res.body.welch.low).toBeLessThan(res.body.welch.diff);
    expect(res.body.welch.high).toBeGreaterThan(res.body.welch.diff);
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

describe('lots across projects (GET/POST /api/lots)', () => {
  it('lists the lots of every project one may read, with the project named, filtered by project or name', async () => {
    const all = await h.as.viewer.get('/api/lots');
    expect(all.status).toBe(200);
    const names = all.body.lots.map((l: { name: string }) => l.name);
    // demo seed: the viewer reads both demo projects, two lots each
    expect(names).toEqual(expect.arrayContaining(['FNC-24-07', 'FNC-24-11', 'PRA-26-02', 'PRA-26-05']));
    expect(all.body.lots.find((l: { name: string }) => l.name === 'FNC-24-07').projectName).toMatch(/PGM-free cathode/);
    // demo seed: every lot keeps its invented certificate of analysis (a PDF)
    for (const lot of all.body.lots.filter((l: { name: string }) => ['FNC-24-07', 'FNC-24-11', 'PRA-26-02', 'PRA-26-05'].includes(l.name))) expect(lot.files.map((f: { name: string; contentType: string }) => [f.name, f.contentType])).toContainEqual([`${lot.name}-certificate-of-analysis.pdf`, 'application/pdf']);
    const one = await h.as.viewer.get(`/api/lots?projectId=${ids.project('A')}`);
    expect(one.body.lots.map((l: { name: string }) => l.name).sort()).toEqual(['PRA-26-02', 'PRA-26-05']);
    const search = await h.as.viewer.get('/api/lots?q=scale-up');
    expect(search.body.lots.map((l: { name: string }) => l.name)).toEqual(['FNC-24-11']); // maker "own scale-up reactor"
    // the partner is a member of the cathode project only (demo seed: partner2 of both)
    const partner = await h.as.partner.get('/api/lots');
    expect(partner.body.lots.every((l: { projectId: number }) => l.projectId === ids.project('C'))).toBe(true);
  });

  it('records a lot in the project the body names; a viewer and an unknown project are refused', async () => {
    const made = await h.as.researcher.post('/api/lots', { projectId: ids.project('C'), name: 'FNC-27-01', maker: 'own synthesis bench', batchSizeG: 4, metalWtPct: 2.1, madeOn: '2026-11-30' });
    expect(made.status).toBe(201);
    expect(made.body.lot).toMatchObject({ projectId: ids.project('C'), name: 'FNC-27-01', batchSizeG: 4, metalWtPct: 2.1, buildCount: 0, files: [] });
    expect((await h.as.viewer.post('/api/lots', { projectId: ids.project('C'), name: 'FNC-27-02' })).status).toBe(403);
    const missing = await h.as.pi.post('/api/lots', { name: 'FNC-27-03' });
    expect(missing.status).toBe(400);
    expect(missing.body.error.message).toMatch(/projectId/);
    expect((await h.as.pi.post('/api/lots', { projectId: 999999, name: 'FNC-27-04' })).status).toBe(404);
  });
});

describe('certificates kept with a lot', () => {
  it('keeps a certificate with the lot, downloadable unchanged, listed with the lot; audited', async () => {
    const text = 'Certificate of analysis (invented)\nFe content by ICP-OES: 1.8 wt %\n';
    const res = await h.as.researcher.upload(`/api/lots/${lotId('FNC-24-11')}/files`, { name: 'FNC-24-11-certificate.txt', content: text });
    expect(res.status).toBe(201);
    const kept = res.body.lot.files.find((f: { name: string }) => f.name === 'FNC-24-11-certificate.txt');
    expect(kept).toMatchObject({ sizeBytes: Buffer.byteLength(text), uploadedBy: expect.any(String) });
    const raw = await h.as.viewer.get(`/api/files/${kept.id}/raw`).buffer(true);
    expect(raw.status).toBe(200);
    expect(String(raw.body)).toBe(text);
    const read = await h.as.viewer.get(`/api/lots/${lotId('FNC-24-11')}`);
    expect(read.body.lot.files.map((f: { id: number }) => f.id)).toContain(kept.id);
    const audits = h.ctx.db.$client.prepare("select action from audit_log where entity = 'lot' and entity_id = ? and action = 'attach'").all(lotId('FNC-24-11'));
    expect(audits.length).toBeGreaterThan(0);
    // taken off the list, the bytes stay
    const off = await h.as.pi.delete(`/api/lots/${lotId('FNC-24-11')}/files/${kept.id}`);
    expect(off.status).toBe(200);
    expect(off.body.lot.files.map((f: { id: number }) => f.id)).not.toContain(kept.id);
    expect((await h.as.viewer.get(`/api/files/${kept.id}/raw`)).status).toBe(200);
  });

  it('refuses a program, an empty file and a viewer, storing nothing', async () => {
    const before = (h.ctx.db.$client.prepare('select count(*) as n from files').get() as { n: number }).n;
    const exe = await h.as.pi.upload(`/api/lots/${lotId('FNC-24-07')}/files`, { name: 'setup.exe', content: 'MZ' });
    expect(exe.status).toBe(415);
    expect(exe.body.error.message).toMatch(/^setup\.exe: a lot keeps documents, images and tables/);
    const empty = await h.as.pi.upload(`/api/lots/${lotId('FNC-24-07')}/files`, { name: 'empty.pdf', content: '' });
    expect(empty.status).toBe(422);
    const viewer = await h.as.viewer.upload(`/api/lots/${lotId('FNC-24-07')}/files`, { name: 'c.pdf', content: '%PDF-1.4' });
    expect(viewer.status).toBe(403);
    expect((h.ctx.db.$client.prepare('select count(*) as n from files').get() as { n: number }).n).toBe(before);
  });
});

describe('a build picks its lot', () => {
  it('points at the lot record, takes its name, and carries its metal content for the derived metal loading', async () => {
    const made = await h.as.researcher.post(`/api/projects/${ids.project('C')}/builds`, { code: 'C-LOT1', factors: {}, status: 'planned', loadingMgCm2: 3, lotId: lotId('FNC-24-11') });
    expect(made.status).toBe(201);
    // demo seed: FNC-24-11 is 1.8 wt % metal
    expect(made.body.build).toMatchObject({ lotId: lotId('FNC-24-11'), catalystLot: 'FNC-24-11', lotMetalWtPct: 1.8 });
    const moved = await h.as.researcher.patch(`/api/builds/${made.body.build.id}`, { lotId: lotId('FNC-24-07') });
    expect(moved.body.build).toMatchObject({ lotId: lotId('FNC-24-07'), catalystLot: 'FNC-24-07', lotMetalWtPct: 2 });
    // free text naming a recorded lot links to it; other text leaves the build without a record
    const named = await h.as.researcher.patch(`/api/builds/${made.body.build.id}`, { catalystLot: 'FNC-24-11' });
    expect(named.body.build.lotId).toBe(lotId('FNC-24-11'));
    const other = await h.as.researcher.patch(`/api/builds/${made.body.build.id}`, { catalystLot: 'bought in, no record' });
    expect(other.body.build).toMatchObject({ lotId: null, catalystLot: 'bought in, no record' });
  });

  it('refuses a lot of another project, naming the field', async () => {
    const res = await h.as.researcher.post(`/api/projects/${ids.project('C')}/builds`, { code: 'C-LOT2', factors: {}, status: 'planned', lotId: lotId('PRA-26-02') });
    expect(res.status).toBe(400);
    expect(res.body.error.details.fields).toEqual([{ path: 'lotId', message: `lot ${lotId('PRA-26-02')} is not a lot of this project` }]);
  });
});
