// The role × route matrix: every role tries every route, and the expected allow/deny holds.
// The routes come from the feature modules (server/features.ts), each with the permission it
// declares; who is expected to get through follows from that permission and the one role table
// (shared/auth/permissions.ts). Every route must have a row here (checked below), giving the
// request each role sends. Roles: site admin; per project pi, researcher, partner, viewer.
// A denial is 403, or 404 where the project is not visible.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createHarness, demoIds, EVERYONE, type Harness, type Who, type Client } from './harness';
import { ROUTES } from '../../server/features';
import type { Permission } from '../../server/lib/route';
import { rolesAllowed } from '../../shared/auth/permissions';

const CSV = 'Current density (A/cm2),Voltage (V),HFR (Ohm cm2)\n0,0.98,0.12\n0.05,0.74,0.12\n0.1,0.69,0.12\n0.2,0.62,0.12\n0.3,0.57,0.12\n0.4,0.52,0.12\n';

export interface MatrixRow {
  method: 'get' | 'post' | 'patch' | 'put' | 'delete';
  /** OpenAPI-style path, e.g. /api/builds/{id} */
  path: string;
  /** build the request for one role (may create fixtures through h.as.admin) */
  send: (h: Harness, c: Client, who: Who) => Promise<request.Response>;
}

/**
 * Who a declared permission lets through, among the demo people (each of pi, researcher,
 * partner and viewer holds that role in project C; only the partner belongs to a partner lab).
 */
function expectedRoles(permission: Permission): Who[] {
  if (permission === 'public' || permission === 'signed-in') return [...EVERYONE];
  if (permission === 'site-admin') return ['admin'];
  if (permission === 'create-project') return EVERYONE.filter((who) => who !== 'partner');
  const roles = rolesAllowed(permission.action) as Who[];
  return permission.members ? roles.filter((who) => who !== 'admin') : roles;
}

let h: Harness;
let ids: ReturnType<typeof demoIds>;
let counter = 0;
const unique = (prefix: string) => `${prefix}${++counter}`;

async function freshAgent(h: Harness, who: Who) {
  const agent = request.agent(h.app);
  const res = await agent.post('/api/auth/login').send({ email: `${who}@demo.cellwright.test`, password: 'demo-password' });
  return { agent, csrf: res.body.csrfToken as string };
}

// the same curve with a cell temperature no demo build records: a condition to settle
const MISMATCH_CSV = `Cell temperature: 95 °C\n${CSV}`;

async function makeCurve(h: Harness, content = CSV) {
  const res = await h.as.admin.upload(`/api/builds/${ids.build('C-014')}/curves`, { name: 'fixture.csv', content });
  if (res.status !== 201) throw new Error(`fixture upload failed: ${JSON.stringify(res.body)}`);
  return res.body.curve.id as number;
}

const C = () => ids.project('C');

async function makeReference(h: Harness) {
  const res = await h.as.admin.upload(`/api/projects/${C()}/reference-curves`, { name: 'reference.csv', content: CSV }, { label: unique('Reference '), source: 'Invented reference report, table 2' });
  if (res.status !== 201) throw new Error(`reference upload failed: ${JSON.stringify(res.body)}`);
  return res.body.referenceCurve.id as number;
}
const lotId = (h: Harness, name: string) => (h.ctx.db.$client.prepare('select id from lots where name = ?').get(name) as { id: number }).id;
/** a complete polarization profile (current and voltage) */
const PROFILE = { voltage: { header: 'U (V)', unit: 'V' }, current: { header: 'j (A/cm2)', unit: 'A/cm2' } };

export const MATRIX: MatrixRow[] = [
  { method: 'post', path: '/api/auth/login', send: (h, _c, who) => request(h.app).post('/api/auth/login').send({ email: `${who}@demo.cellwright.test`, password: 'demo-password' }) },
  { method: 'post', path: '/api/auth/logout', send: async (h, _c, who) => { const { agent, csrf } = await freshAgent(h, who); return agent.post('/api/auth/logout').set('X-CSRF-Token', csrf); } },
  { method: 'get', path: '/api/auth/me', send: (_h, c) => c.get('/api/auth/me') },
  { method: 'get', path: '/api/auth/sessions', send: (_h, c) => c.get('/api/auth/sessions') },
  { method: 'post', path: '/api/auth/sessions/{id}/revoke', send: async (h, c, who) => {
    await freshAgent(h, who);
    const list = await c.get('/api/auth/sessions');
    const other = list.body.sessions.find((s: { current: boolean; revokedAt: string | null }) => !s.current && !s.revokedAt);
    return c.post(`/api/auth/sessions/${other.id}/revoke`);
  } },
  { method: 'get', path: '/api/auth/tokens', send: (_h, c) => c.get('/api/auth/tokens') },
  { method: 'post', path: '/api/auth/tokens', send: (_h, c) => c.post('/api/auth/tokens', { name: unique('script') }) },
  { method: 'post', path: '/api/auth/tokens/{id}/revoke', send: async (_h, c) => { const t = await c.post('/api/auth/tokens', { name: unique('t') }); return c.post(`/api/auth/tokens/${t.body.id}/revoke`); } },
  { method: 'get', path: '/api/invitations/{token}', send: async (h) => {
    const mail = `${unique('guest')}@partner.example`;
    await h.as.pi.post(`/api/projects/${C()}/invitations`, { email: mail, role: 'viewer' });
    const token = latestInviteToken(h, mail);
    return request(h.app).get(`/api/invitations/${token}`);
  } },
  { method: 'post', path: '/api/invitations/{token}/accept', send: async (h) => {
    const mail = `${unique('guest')}@partner.example`;
    await h.as.pi.post(`/api/projects/${C()}/invitations`, { email: mail, role: 'viewer' });
    return request(h.app).post(`/api/invitations/${latestInviteToken(h, mail)}/accept`).send({ name: 'Guest Person', password: 'long-enough-pw' });
  } },
  { method: 'get', path: '/api/home', send: (_h, c) => c.get('/api/home') },
  { method: 'get', path: '/api/projects', send: (_h, c) => c.get('/api/projects') },
  { method: 'post', path: '/api/projects', send: (_h, c) => c.post('/api/projects', { name: unique('Matrix project '), settings: { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'catalyst' } }) },
  { method: 'get', path: '/api/projects/{id}', send: (_h, c) => c.get(`/api/projects/${C()}`) },
  { method: 'patch', path: '/api/projects/{id}', send: (_h, c) => c.patch(`/api/projects/${C()}`, { description: unique('desc ') }) },
  { method: 'put', path: '/api/projects/{id}/metal-prices', send: (_h, c) => c.put(`/api/projects/${C()}/metal-prices`, { prices: [{ metal: 'Pt', pricePerGram: 31, currency: 'EUR', date: '2026-11-02', source: 'invented quote' }] }) },
  { method: 'get', path: '/api/projects/{id}/permissions', send: (_h, c) => c.get(`/api/projects/${C()}/permissions`) },
  { method: 'get', path: '/api/projects/{id}/factors', send: (_h, c) => c.get(`/api/projects/${C()}/factors`) },
  { method: 'post', path: '/api/projects/{id}/factors', send: (_h, c) => c.post(`/api/projects/${C()}/factors`, { key: unique('inkSolids'), label: 'Ink solids', unit: 'wt %', kind: 'continuous', low: 1, high: 5 }) },
  { method: 'patch', path: '/api/projects/{id}/factors/{factorId}', send: async (h, c) => {
    const f = await h.as.admin.post(`/api/projects/${C()}/factors`, { key: unique('hp'), label: 'Hot-press time', unit: 'min', kind: 'continuous', low: 1, high: 10 });
    return c.patch(`/api/projects/${C()}/factors/${f.body.factor.id}`, { key: f.body.factor.key, label: 'Hot-press time (edited)', unit: 'min', kind: 'continuous', low: 1, high: 12 });
  } },
  { method: 'get', path: '/api/projects/{id}/responses', send: (_h, c) => c.get(`/api/projects/${C()}/responses`) },
  { method: 'post', path: '/api/projects/{id}/responses', send: (_h, c) => c.post(`/api/projects/${C()}/responses`, { key: unique('cost'), label: 'Cost', unit: '€', goal: 'minimize' }) },
  { method: 'get', path: '/api/projects/{id}/targets', send: (_h, c) => c.get(`/api/projects/${C()}/targets`) },
  { method: 'post', path: '/api/projects/{id}/targets', send: (_h, c) => c.post(`/api/projects/${C()}/targets`, { metric: 'vAtRef', comparator: '>=', value: 0.7, unit: 'V', name: unique('Gate ') }) },
  { method: 'patch', path: '/api/targets/{id}', send: async (h, c) => {
    const t = await h.as.admin.post(`/api/projects/${C()}/targets`, { metric: 'hfr', comparator: '<=', value: 120, unit: 'mΩ·cm²' });
    return c.patch(`/api/targets/${t.body.target.id}`, { value: 110 });
  } },
  { method: 'delete', path: '/api/targets/{id}', send: async (h, c) => {
    const t = await h.as.admin.post(`/api/projects/${C()}/targets`, { metric: 'hfr', comparator: '<=', value: 0.12, unit: 'Ω·cm²' });
    return c.delete(`/api/targets/${t.body.target.id}`);
  } },
  { method: 'get', path: '/api/projects/{id}/benchmark', send: (_h, c) => c.get(`/api/projects/${C()}/benchmark`) },
  { method: 'put', path: '/api/projects/{id}/benchmark', send: (_h, c) => c.put(`/api/projects/${C()}/benchmark`, { buildId: ids.build('C-001'), note: 'matrix' }) },
  { method: 'delete', path: '/api/projects/{id}/benchmark', send: (_h, c) => c.delete(`/api/projects/${C()}/benchmark`) },
  { method: 'get', path: '/api/projects/{id}/reference-curves', send: (_h, c) => c.get(`/api/projects/${C()}/reference-curves`) },
  { method: 'post', path: '/api/projects/{id}/reference-curves', send: (_h, c) => c.upload(`/api/projects/${C()}/reference-curves`, { name: 'reference.csv', content: CSV }, { label: unique('Reference '), source: 'Invented reference report, table 2' }) },
  { method: 'get', path: '/api/reference-curves/{id}', send: async (h, c) => c.get(`/api/reference-curves/${await makeReference(h)}`) },
  { method: 'delete', path: '/api/reference-curves/{id}', send: async (h, c) => c.delete(`/api/reference-curves/${await makeReference(h)}`) },
  { method: 'get', path: '/api/projects/{id}/lots', send: (_h, c) => c.get(`/api/projects/${C()}/lots`) },
  { method: 'post', path: '/api/projects/{id}/lots', send: (_h, c) => c.post(`/api/projects/${C()}/lots`, { name: unique('FNC-M'), metalWtPct: 2 }) },
  { method: 'get', path: '/api/lots', send: (_h, c) => c.get('/api/lots') },
  { method: 'post', path: '/api/lots', send: (_h, c) => c.post('/api/lots', { projectId: C(), name: unique('FNC-G'), metalWtPct: 1.9 }) },
  { method: 'post', path: '/api/lots/{id}/files', send: (h, c) => c.upload(`/api/lots/${lotId(h, 'FNC-24-07')}/files`, { name: 'certificate.txt', content: 'Fe 2.0 wt % (invented certificate)\n' }) },
  { method: 'delete', path: '/api/lots/{id}/files/{fileId}', send: async (h, c) => {
    const kept = await h.as.admin.upload(`/api/lots/${lotId(h, 'FNC-24-07')}/files`, { name: 'to-remove.txt', content: `${unique('note ')}\n` });
    return c.delete(`/api/lots/${lotId(h, 'FNC-24-07')}/files/${kept.body.lot.files[0].id}`);
  } },
  { method: 'get', path: '/api/lots/{id}', send: (h, c) => c.get(`/api/lots/${lotId(h, 'FNC-24-07')}`) },
  { method: 'patch', path: '/api/lots/{id}', send: (h, c) => c.patch(`/api/lots/${lotId(h, 'FNC-24-07')}`, { notes: unique('note ') }) },
  { method: 'get', path: '/api/lots/{id}/comparison', send: (h, c) => c.get(`/api/lots/${lotId(h, 'FNC-24-11')}/comparison?against=${lotId(h, 'FNC-24-07')}`) },
  { method: 'get', path: '/api/projects/{id}/members', send: (_h, c) => c.get(`/api/projects/${C()}/members`) },
  { method: 'put', path: '/api/projects/{id}/members', send: (_h, c) => c.put(`/api/projects/${C()}/members`, { userId: ids.user('r.castellane@ridgeway.example'), role: 'partner' }) },
  { method: 'delete', path: '/api/projects/{id}/members/{userId}', send: async (h, c) => {
    const mail = `${unique('leaver')}@partner.example`;
    await h.as.pi.post(`/api/projects/${C()}/invitations`, { email: mail, role: 'viewer' });
    await request(h.app).post(`/api/invitations/${latestInviteToken(h, mail)}/accept`).send({ name: 'Leaving Person', password: 'long-enough-pw' });
    return c.delete(`/api/projects/${C()}/members/${ids.user(mail)}`);
  } },
  { method: 'put', path: '/api/projects/{id}/notify', send: (_h, c) => c.put(`/api/projects/${C()}/notify`, { notify: true }) },
  { method: 'post', path: '/api/projects/{id}/invitations', send: (_h, c) => c.post(`/api/projects/${C()}/invitations`, { email: `${unique('new')}@lab.example`, role: 'researcher' }) },
  { method: 'get', path: '/api/projects/{id}/builds', send: (_h, c) => c.get(`/api/projects/${C()}/builds`) },
  { method: 'post', path: '/api/projects/{id}/builds', send: (_h, c) => c.post(`/api/projects/${C()}/builds`, { status: 'planned', factors: { binder: 25 }, loadingMgCm2: 3, areaCm2: 25 }) },
  { method: 'get', path: '/api/builds/{id}', send: (_h, c) => c.get(`/api/builds/${ids.build('C-014')}`) },
  { method: 'patch', path: '/api/builds/{id}', send: (_h, c) => c.patch(`/api/builds/${ids.build('C-014')}`, { changeNote: unique('partner check, note ') }) },
  { method: 'get', path: '/api/labs', send: (_h, c) => c.get('/api/labs') },
  { method: 'post', path: '/api/admin/labs', send: (_h, c) => c.post('/api/admin/labs', { name: unique('Matrix Lab '), kind: 'partner' }) },
  { method: 'get', path: '/api/admin/people', send: (_h, c) => c.get('/api/admin/people') },
  { method: 'patch', path: '/api/admin/people/{id}', send: (_h, c) => c.patch(`/api/admin/people/${ids.user('r.castellane@ridgeway.example')}`, { name: 'Rosa Castellane' }) },
  { method: 'post', path: '/api/admin/people/{id}/revoke-sessions', send: (_h, c) => c.post(`/api/admin/people/${ids.user('r.castellane@ridgeway.example')}/revoke-sessions`) },
  { method: 'post', path: '/api/admin/digests/send', send: (_h, c) => c.post('/api/admin/digests/send') },
  { method: 'get', path: '/api/admin/outbox', send: (_h, c) => c.get('/api/admin/outbox') },
  { method: 'get', path: '/api/admin/audit', send: (_h, c) => c.get('/api/admin/audit') },
  { method: 'get', path: '/api/admin/backups', send: (_h, c) => c.get('/api/admin/backups') },
  { method: 'post', path: '/api/admin/backups', send: (_h, c) => c.post('/api/admin/backups') },
  { method: 'get', path: '/api/admin/backups/{name}', send: async (h, c) => {
    const list = await h.as.admin.get('/api/admin/backups');
    const name = list.body.backups[0]?.name ?? (await h.as.admin.post('/api/admin/backups')).body.backup.name;
    return c.get(`/api/admin/backups/${name}`);
  } },
  { method: 'post', path: '/api/builds/{id}/curves', send: (_h, c) => c.upload(`/api/builds/${ids.build('C-014')}/curves`, { name: 'matrix.csv', content: CSV }) },
  { method: 'post', path: '/api/builds/{id}/curves/preview', send: (_h, c) => c.upload(`/api/builds/${ids.build('C-014')}/curves/preview`, { name: 'matrix.csv', content: CSV }) },
  { method: 'get', path: '/api/curves/{id}', send: async (h, c) => c.get(`/api/curves/${await makeCurve(h)}`) },
  { method: 'patch', path: '/api/curves/{id}', send: async (h, c) => c.patch(`/api/curves/${await makeCurve(h)}`, { label: 'relabelled' }) },
  { method: 'post', path: '/api/curves/{id}/conditions', send: async (h, c) => c.post(`/api/curves/${await makeCurve(h, MISMATCH_CSV)}/conditions`, { field: 'temperatureC', chosen: 'build' }) },
  { method: 'delete', path: '/api/curves/{id}', send: async (h, c) => c.delete(`/api/curves/${await makeCurve(h)}`) },
  // partners choose only for their own lab's builds (C-014 is Kestrel's); viewers never
  { method: 'put', path: '/api/builds/{id}/record', send: async (h, c) => c.put(`/api/builds/${ids.build('C-014')}/record`, { kind: 'polarization', curveId: await makeCurve(h) }) },
  { method: 'get', path: '/api/files/{id}/raw', send: async (h, c) => { const id = await makeCurve(h); const curve = await h.as.admin.get(`/api/curves/${id}`); return c.get(`/api/files/${curve.body.curve.fileId}/raw`); } },
  { method: 'get', path: '/api/projects/{id}/import-profiles', send: (_h, c) => c.get(`/api/projects/${C()}/import-profiles`) },
  { method: 'post', path: '/api/projects/{id}/import-profiles', send: (_h, c) => c.post(`/api/projects/${C()}/import-profiles`, { name: unique('profile '), mapping: PROFILE }) },
  { method: 'delete', path: '/api/import-profiles/{id}', send: async (h, c, who) => {
    // each writer removes a profile of its own lab (the one it may make); a viewer tries a home-lab one
    const owner = who === 'partner' ? h.as.partner : h.as.researcher;
    const p = await owner.post(`/api/projects/${C()}/import-profiles`, { name: unique('tmp '), mapping: PROFILE });
    return c.delete(`/api/import-profiles/${p.body.profile.id}`);
  } },
  { method: 'get', path: '/api/uploads/{uploadId}/progress', send: (_h, c) => c.get(`/api/uploads/${unique('matrix-upload-')}/progress`) },
  { method: 'get', path: '/api/projects/{id}/durability', send: (_h, c) => c.get(`/api/projects/${C()}/durability`) },
  { method: 'post', path: '/api/projects/{id}/designs', send: (_h, c) => c.post(`/api/projects/${C()}/designs`, { kind: 'full-factorial-2', factors: ['binder', 'cellTemp'], seed: 1 }) },
  { method: 'post', path: '/api/projects/{id}/designs/plan', send: async (h, c) => {
    // every factor not in the design needs a held value, including factors added by earlier rows
    const factors = (await h.as.admin.get(`/api/projects/${C()}/factors`)).body.factors as { key: string; kind: string; low: number | null; levels: string[] | null }[];
    const held = Object.fromEntries(factors.filter((f) => f.key !== 'binder' && f.key !== 'cellTemp').map((f) => [f.key, f.kind === 'continuous' ? f.low! : f.levels![0]!]));
    return c.post(`/api/projects/${C()}/designs/plan`, { runs: [{ runOrder: 1, block: 1, actual: { binder: 25, cellTemp: 180 } }], held });
  } },
  { method: 'get', path: '/api/projects/{id}/designs', send: (_h, c) => c.get(`/api/projects/${C()}/designs`) },
  { method: 'post', path: '/api/projects/{id}/proposals/plan', send: (_h, c) => c.post(`/api/projects/${C()}/proposals/plan`, { response: 'vAtRef', model: 'linear', recipe: { binder: 30, activationTemp: 350, activationTime: 3, gdl: 'woven carbon', cellTemp: 180 }, reason: 'matrix check of the planning route' }) },
  { method: 'post', path: '/api/projects/{id}/surface', send: (_h, c) => c.post(`/api/projects/${C()}/surface`, { response: 'vAtRef', model: 'linear' }) },
  { method: 'post', path: '/api/projects/{id}/proposals', send: (_h, c) => c.post(`/api/projects/${C()}/proposals`, { response: 'vAtRef', model: 'linear', count: 2 }) },
  { method: 'get', path: '/api/projects/{id}/gains', send: (_h, c) => c.get(`/api/projects/${C()}/gains?response=vAtRef`) },
  { method: 'get', path: '/api/projects/{id}/review-pack', send: (_h, c) => c.get(`/api/projects/${C()}/review-pack`) },
  { method: 'get', path: '/api/projects/{id}/review-pack.pdf', send: (_h, c) => c.get(`/api/projects/${C()}/review-pack.pdf`) },
  { method: 'post', path: '/api/projects/{id}/series', send: (_h, c) => c.post(`/api/projects/${C()}/series`, { variable: 'temperature' }) },
  { method: 'get', path: '/api/projects/{id}/lineage', send: (_h, c) => c.get(`/api/projects/${C()}/lineage?response=vAtRef`) },
  { method: 'get', path: '/api/builds/{id}/reviews', send: (_h, c) => c.get(`/api/builds/${ids.build('C-014')}/reviews`) },
  { method: 'post', path: '/api/builds/{id}/reviews', send: (_h, c) => c.post(`/api/builds/${ids.build('C-014')}/reviews`, { body: unique('matrix comment ') }) },
  { method: 'post', path: '/api/builds/{id}/verdict', send: (_h, c) => c.post(`/api/builds/${ids.build('C-014')}/verdict`, { verdict: 'approved', body: unique('matrix verdict '), repeat: true }) },
  { method: 'get', path: '/api/builds/{id}/audit', send: (_h, c) => c.get(`/api/builds/${ids.build('C-014')}/audit`) },
];

function latestInviteToken(h: Harness, email: string): string {
  const row = h.ctx.db.$client.prepare("select text from outbox where \"to\" = ? order by id desc limit 1").get(email) as { text: string };
  const match = row.text.match(/\/invite\/([A-Za-z0-9_-]+)/);
  if (!match) throw new Error('no invitation link in the e-mail');
  return match[1]!;
}

beforeAll(async () => {
  h = await createHarness();
  ids = demoIds(h.ctx);
});
afterAll(() => h.close());

describe('role × route matrix', () => {
  it('has a row for every documented route', () => {
    const covered = new Set(MATRIX.map((r) => `${r.method} ${r.path}`));
    const missing = ROUTES.map((r) => `${r.method} ${r.path}`).filter((k) => !covered.has(k));
    expect(missing).toEqual([]);
  });

  it('has no row for a route that does not exist', () => {
    const documented = new Set(ROUTES.map((r) => `${r.method} ${r.path}`));
    expect(MATRIX.map((r) => `${r.method} ${r.path}`).filter((k) => !documented.has(k))).toEqual([]);
  });

  for (const row of MATRIX) {
    const permission = ROUTES.find((r) => r.method === row.method && r.path === row.path)?.permission ?? 'site-admin';
    const expected = expectedRoles(permission);
    for (const who of EVERYONE) {
      const allowed = expected.includes(who);
      it(`${row.method.toUpperCase()} ${row.path} as ${who} is ${allowed ? 'allowed' : 'refused'}`, async () => {
        const res = await row.send(h, h.as[who], who);
        if (allowed) expect(res.status, JSON.stringify(res.body)).toBeLessThan(300);
        else {
          expect([403, 404], JSON.stringify(res.body)).toContain(res.status);
          expect(res.body.error.code).toBeTypeOf('string');
        }
      });
    }
    if (permission !== 'public') {
      it(`${row.method.toUpperCase()} ${row.path} without signing in is 401`, async () => {
        const path = row.path.replace(/\{[^}]+\}/g, '1');
        const res = await (request(h.app) as unknown as Record<string, (u: string) => request.Test>)[row.method]!(path);
        expect(res.status).toBe(401);
        expect(res.body.error.code).toBe('unauthorized');
      });
    }
  }

  it('tells each role what it may do in the project, from the same table the routes check', async () => {
    const researcher = await h.as.researcher.get(`/api/projects/${C()}/permissions`);
    expect(researcher.body.role).toBe('researcher');
    expect(researcher.body.actions).toMatchObject({ read: true, createBuild: true, fit: true, plan: true, review: false, editSettings: false, invite: false });
    const viewer = await h.as.viewer.get(`/api/projects/${C()}/permissions`);
    expect(Object.entries(viewer.body.actions).filter(([, allowed]) => allowed).map(([action]) => action)).toEqual(['read']);
    expect((await h.as.admin.get(`/api/projects/${C()}/permissions`)).body.role).toBe('admin');
  });

  it('a partner cannot edit another lab’s build, nor see a project it is not in', async () => {
    const other = await h.as.partner.patch(`/api/builds/${ids.build('C-001')}`, { changeNote: 'nope' });
    expect(other.status).toBe(403);
    const hidden = await h.as.partner.get(`/api/projects/${ids.project('A')}`);
    expect(hidden.status).toBe(404);
    const hiddenBuild = await h.as.partner.get(`/api/builds/${ids.build('A-001')}`);
    expect(hiddenBuild.status).toBe(404);
    const upload = await h.as.partner.upload(`/api/builds/${ids.build('C-001')}/curves`, { name: 'x.csv', content: CSV });
    expect(upload.status).toBe(403);
    const c001 = await h.as.admin.get(`/api/builds/${ids.build('C-001')}`);
    const record = await h.as.partner.put(`/api/builds/${ids.build('C-001')}/record`, { curveId: c001.body.build.recordCurveIds.polarization });
    expect(record.status).toBe(403);
    const list = await h.as.partner.get('/api/projects');
    expect(list.body.projects.map((p: { id: number }) => p.id)).toEqual([ids.project('C')]);
  });

  it('a partner’s new build is recorded for its own lab whatever it asks', async () => {
    const res = await h.as.partner.post(`/api/projects/${ids.project('C')}/builds`, { status: 'planned', factors: {}, labId: ids.lab('Northgate') });
    expect(res.status).toBe(403);
    const ok = await h.as.partner.post(`/api/projects/${ids.project('C')}/builds`, { status: 'planned', factors: {} });
    expect(ok.body.build.labId).toBe(ids.lab('Kestrel'));
  });

  it('cookie writes without the CSRF header are refused; Bearer-token writes need none', async () => {
    const agent = request.agent(h.app);
    await agent.post('/api/auth/login').send({ email: 'researcher@demo.cellwright.test', password: 'demo-password' });
    const refused = await agent.post(`/api/projects/${ids.project('C')}/builds`).send({ status: 'planned', factors: {} });
    expect(refused.status).toBe(403);
    expect(refused.body.error.code).toBe('csrf');
    const token = await h.as.researcher.post('/api/auth/tokens', { name: 'station script' });
    const viaToken = await request(h.app).post(`/api/projects/${ids.project('C')}/builds`).set('Authorization', `Bearer ${token.body.token}`).send({ status: 'planned', factors: {} });
    expect(viaToken.status).toBe(201);
  });

  // Import profiles for a lab: its own members (with a writing role) and the project's PIs.
  const PROFILE_RIGHTS: { lab: 'Northgate' | 'Kestrel' | null; allowed: Who[] }[] = [
    { lab: 'Northgate', allowed: ['admin', 'pi', 'researcher'] },
    { lab: 'Kestrel', allowed: ['admin', 'pi', 'partner'] },
    { lab: null, allowed: ['admin', 'pi'] },
  ];
  for (const right of PROFILE_RIGHTS) {
    for (const who of EVERYONE) {
      const allowed = right.allowed.includes(who);
      it(`saving an import profile for ${right.lab ?? 'builds without a lab'} as ${who} is ${allowed ? 'allowed' : 'refused'}`, async () => {
        const labId = right.lab ? ids.lab(right.lab) : null;
        const res = await h.as[who].post(`/api/projects/${C()}/import-profiles`, { name: unique('rights '), labId, mapping: PROFILE });
        if (who === 'partner' && labId === null) {
          // a partner's profile is always its own lab's, whatever it asks
          expect(res.status).toBe(201);
          expect(res.body.profile.labId).toBe(ids.lab('Kestrel'));
        } else if (allowed) {
          expect(res.status, JSON.stringify(res.body)).toBe(201);
          expect(res.body.profile.labId).toBe(labId);
        } else expect([403, 404]).toContain(res.status);
      });
    }
  }

  // Token scopes × kinds of request: read → GET only; upload → GET + curve uploads; full → all
  // the person may do; no scope mints tokens or ends browser sessions.
  const SCOPE_REQUESTS: { what: string; allowed: ('read' | 'upload' | 'full')[]; send: (token: string) => request.Test }[] = [
    { what: 'GET /api/projects/{id}', allowed: ['read', 'upload', 'full'], send: (t) => request(h.app).get(`/api/projects/${C()}`).set('Authorization', `Bearer ${t}`) },
    { what: 'GET /api/files/{id}/raw', allowed: ['read', 'upload', 'full'], send: (t) => request(h.app).get(`/api/files/${(h.ctx.db.$client.prepare('select id from files where project_id = ? order by id limit 1').get(ids.project('C')) as { id: number }).id}/raw`).set('Authorization', `Bearer ${t}`) },
    { what: 'POST /api/builds/{id}/curves', allowed: ['upload', 'full'], send: (t) => request(h.app).post(`/api/builds/${ids.build('C-014')}/curves`).set('Authorization', `Bearer ${t}`).attach('file', Buffer.from(CSV), 'scope.csv') },
    { what: 'POST /api/builds/{id}/curves/preview', allowed: ['upload', 'full'], send: (t) => request(h.app).post(`/api/builds/${ids.build('C-014')}/curves/preview`).set('Authorization', `Bearer ${t}`).attach('file', Buffer.from(CSV), 'scope.csv') },
    { what: 'POST /api/projects/{id}/builds', allowed: ['full'], send: (t) => request(h.app).post(`/api/projects/${C()}/builds`).set('Authorization', `Bearer ${t}`).send({ status: 'planned', factors: {} }) },
    { what: 'PATCH /api/builds/{id}', allowed: ['full'], send: (t) => request(h.app).patch(`/api/builds/${ids.build('C-014')}`).set('Authorization', `Bearer ${t}`).send({ changeNote: unique('scope ') }) },
    { what: 'POST /api/projects/{id}/import-profiles', allowed: ['full'], send: (t) => request(h.app).post(`/api/projects/${C()}/import-profiles`).set('Authorization', `Bearer ${t}`).send({ name: unique('scope '), mapping: PROFILE }) },
    { what: 'POST /api/auth/tokens', allowed: [], send: (t) => request(h.app).post('/api/auth/tokens').set('Authorization', `Bearer ${t}`).send({ name: 'child', scope: 'read' }) },
    { what: 'POST /api/auth/sessions/{id}/revoke', allowed: [], send: (t) => request(h.app).post(`/api/auth/sessions/${(h.ctx.db.$client.prepare('select id from sessions order by id desc limit 1').get() as { id: number }).id}/revoke`).set('Authorization', `Bearer ${t}`) },
    { what: 'POST /api/auth/logout', allowed: [], send: (t) => request(h.app).post('/api/auth/logout').set('Authorization', `Bearer ${t}`) },
  ];
  for (const scope of ['read', 'upload', 'full'] as const) {
    for (const row of SCOPE_REQUESTS) {
      const allowed = row.allowed.includes(scope);
      it(`a ${scope} token (partner) on ${row.what} is ${allowed ? 'allowed' : 'refused'}`, async () => {
        const minted = await h.as.partner.post('/api/auth/tokens', { name: unique(`${scope} `), scope });
        const res = await row.send(minted.body.token);
        if (allowed) expect(res.status, JSON.stringify(res.body)).toBeLessThan(300);
        else {
          expect(res.status, JSON.stringify(res.body)).toBe(403);
          expect(res.body.error.code).toBe('token-scope');
        }
      });
    }
  }
});
