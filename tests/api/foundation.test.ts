// Sign-in, sessions, invitations, projects, factors, responses and builds through the HTTP API.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createHarness, demoIds, type Harness } from './harness';
import { createApp } from '../../server/app';
import { createContext } from '../../server/bootstrap';
import { seedDemo } from '../../server/seed/seed';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

let h: Harness;
let ids: ReturnType<typeof demoIds>;

beforeAll(async () => {
  h = await createHarness();
  ids = demoIds(h.ctx);
});
afterAll(() => h.close());

describe('sign-in and sessions', () => {
  it('refuses a wrong password with one message for both unknown e-mail and wrong password', async () => {
    const wrong = await request(h.app).post('/api/auth/login').send({ email: 'pi@demo.cellwright.test', password: 'nope' });
    const unknown = await request(h.app).post('/api/auth/login').send({ email: 'nobody@demo.cellwright.test', password: 'nope' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body.error.message).toBe(unknown.body.error.message);
  });

  it('sets an httpOnly, SameSite=Lax session cookie and security headers', async () => {
    const res = await request(h.app).post('/api/auth/login').send({ email: 'viewer@demo.cellwright.test', password: 'demo-password' });
    const cookie = String(res.headers['set-cookie']);
    expect(cookie).toMatch(/cw_session=/);
    expect(cookie).toMatch(/HttpOnly/);
    expect(cookie).toMatch(/SameSite=Lax/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
  });

  it('stores passwords as argon2id hashes, never in clear', () => {
    const row = h.ctx.db.$client.prepare('select password_hash from users where email = ?').get('pi@demo.cellwright.test') as { password_hash: string };
    expect(row.password_hash.startsWith('$argon2id$')).toBe(true);
  });

  it('sign-out revokes the session on the server', async () => {
    const agent = request.agent(h.app);
    const login = await agent.post('/api/auth/login').send({ email: 'researcher@demo.cellwright.test', password: 'demo-password' });
    expect((await agent.get('/api/auth/me')).status).toBe(200);
    const cookie = String(login.headers['set-cookie']).split(';')[0]!;
    await agent.post('/api/auth/logout').set('X-CSRF-Token', login.body.csrfToken);
    const replay = await request(h.app).get('/api/auth/me').set('Cookie', cookie);
    expect(replay.status).toBe(401);
  });

  it('rate-limits sign-in attempts', async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-rl-'));
    const ctx = createContext({ DATABASE_PATH: path.join(dir, 'db.sqlite'), UPLOADS_DIR: path.join(dir, 'up'), LOG_LEVEL: 'silent', LOGIN_RATE_LIMIT: '3', SEED_DEMO: 'never' });
    const app = createApp(ctx, { serveClient: false });
    const statuses: number[] = [];
    for (let i = 0; i < 5; i++) statuses.push((await request(app).post('/api/auth/login').send({ email: 'x@y.example', password: 'wrong' })).status);
    expect(statuses).toEqual([401, 401, 401, 429, 429]); // limit 3 set above: the 4th and 5th attempts are refused
    ctx.db.$client.close();
    fs.rmSync(dir, { recursive: true, force: true });
  });

  it('an admin can disable a person, which signs them out everywhere', async () => {
    const agent = request.agent(h.app);
    await agent.post('/api/auth/login').send({ email: 'r.castellane@ridgeway.example', password: 'demo-password' });
    expect((await agent.get('/api/auth/me')).status).toBe(200);
    const id = ids.user('r.castellane@ridgeway.example');
    await h.as.admin.patch(`/api/admin/people/${id}`, { disabled: true });
    expect((await agent.get('/api/auth/me')).status).toBe(401);
    const again = await request(h.app).post('/api/auth/login').send({ email: 'r.castellane@ridgeway.example', password: 'demo-password' });
    expect(again.status).toBe(401);
    await h.as.admin.patch(`/api/admin/people/${id}`, { disabled: false });
  });
});

describe('invitations', () => {
  it('an invitation e-mail carries a one-time link that sets name and password', async () => {
    const res = await h.as.pi.post(`/api/projects/${ids.project('C')}/invitations`, { email: 'new.member@lab.example', role: 'researcher' });
    expect(res.status).toBe(201);
    const mail = h.ctx.db.$client.prepare('select * from outbox where "to" = ? order by id desc').get('new.member@lab.example') as { subject: string; text: string; transport: string };
    expect(mail.transport).toBe('outbox');
    expect(mail.subject).toContain('PGM-free cathode');
    const token = mail.text.match(/\/invite\/([\w-]+)/)![1]!;
    expect(mail.text).toContain('http://cellwright.test/invite/');
    const info = await request(h.app).get(`/api/invitations/${token}`);
    expect(info.body).toMatchObject({ email: 'new.member@lab.example', role: 'researcher' });
    const weak = await request(h.app).post(`/api/invitations/${token}/accept`).send({ name: 'New Member', password: 'short' });
    expect(weak.status).toBe(400);
    expect(weak.body.error.details.fields[0].path).toBe('password');
    const accepted = await request(h.app).post(`/api/invitations/${token}/accept`).send({ name: 'New Member', password: 'a-long-password' });
    expect(accepted.status).toBe(201);
    const reuse = await request(h.app).post(`/api/invitations/${token}/accept`).send({ name: 'Someone Else', password: 'a-long-password' });
    expect(reuse.status).toBe(410);
    const login = await request(h.app).post('/api/auth/login').send({ email: 'new.member@lab.example', password: 'a-long-password' });
    expect(login.status).toBe(200);
  });

  it('an expired invitation is refused with a message saying so', async () => {
    await h.as.pi.post(`/api/projects/${ids.project('C')}/invitations`, { email: 'late@lab.example', role: 'viewer' });
    const mail = h.ctx.db.$client.prepare('select text from outbox where "to" = ? order by id desc').get('late@lab.example') as { text: string };
    const token = mail.text.match(/\/invite\/([\w-]+)/)![1]!;
    h.ctx.db.$client.prepare("update invitations set expires_at = '2000-01-01T00:00:00.000Z' where email = ?").run('late@lab.example');
    const res = await request(h.app).get(`/api/invitations/${token}`);
    expect(res.status).toBe(410);
    expect(res.body.error.message).toMatch(/expired/);
  });

  it('a partner invitation names the partner lab', async () => {
    const res = await h.as.pi.post(`/api/projects/${ids.project('C')}/invitations`, { email: 'someone@partner.example', role: 'partner' });
    expect(res.status).toBe(400);
    expect(res.body.error.details.fields[0].path).toBe('labId');
  });
});

describe('projects, factors, responses', () => {
  it('creating a project makes the creator its PI and keeps the reference point', async () => {
    const res = await h.as.researcher.post('/api/projects', { name: 'Direct DME anode screening', settings: { refCurrentDensity: 0.1, refVoltage: 0.5, irFree: false, loadingBasis: 'metal' } });
    expect(res.status).toBe(201);
    expect(res.body.project.myRole).toBe('pi');
    expect(res.body.project.settings.refCurrentDensity).toBe(0.1);
  });

  it('validation errors are 400 with every bad field named', async () => {
    const res = await h.as.pi.post(`/api/projects/${ids.project('C')}/factors`, { key: '9bad', label: '', kind: 'continuous', low: 5, high: 1 });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation');
    const paths = res.body.error.details.fields.map((f: { path: string }) => f.path).sort();
    expect(paths).toEqual(['high', 'key', 'label']);
    const cat = await h.as.pi.post(`/api/projects/${ids.project('C')}/factors`, { key: 'membrane', label: 'Membrane', kind: 'categorical', levels: ['PBI-A'] });
    expect(cat.body.error.details.fields[0]).toMatchObject({ path: 'levels' });
  });

  it('a hand-entered response cannot shadow a curve metric', async () => {
    const res = await h.as.pi.post(`/api/projects/${ids.project('C')}/responses`, { key: 'vAtRef', label: 'V', goal: 'maximize' });
    expect(res.status).toBe(409);
  });

  it('malformed JSON and unknown API routes answer in the error shape', async () => {
    const bad = await h.as.pi.post(`/api/projects/${ids.project('C')}/factors`).set('Content-Type', 'application/json').send('{"key":');
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/JSON/);
    const unknown = await h.as.pi.get('/api/nothing-here');
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.code).toBe('not-found');
  });
});

describe('builds', () => {
  const base = { binder: 25, activationTemp: 340, activationTime: 2, gdl: 'woven carbon', cellTemp: 180 };

  it('assigns the next code, accepts hand-entered responses, and lists them with units-free values', async () => {
    const res = await h.as.researcher.post(`/api/projects/${ids.project('C')}/builds`, { factors: base, loadingMgCm2: 3, areaCm2: 25, parentId: ids.build('C-010'), changeNote: 'thinner layer', responses: { thicknessUm: 42 } });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.build.code).toMatch(/^C-\d{3}$/);
    expect(res.body.build.parentCode).toBe('C-010');
    expect(res.body.build.values.thicknessUm).toBe(42);
    const list = await h.as.viewer.get(`/api/projects/${ids.project('C')}/builds`);
    expect(list.body.builds.find((b: { id: number }) => b.id === res.body.build.id)).toBeTruthy();
  });

  it('checks factor values against bounds and levels, naming each field', async () => {
    const res = await h.as.researcher.post(`/api/projects/${ids.project('C')}/builds`, { factors: { ...base, binder: 55, gdl: 'felt', extra: 1 } });
    expect(res.status).toBe(400);
    const fields = Object.fromEntries(res.body.error.details.fields.map((f: { path: string; message: string }) => [f.path, f.message]));
    expect(fields['factors.binder']).toMatch(/outside 10–40 wt %/);
    expect(fields['factors.gdl']).toMatch(/woven carbon, carbon paper/);
    expect(fields['factors.extra']).toMatch(/unknown factor/);
  });

  it('a planned build may leave factors open; a built one may not', async () => {
    const planned = await h.as.researcher.post(`/api/projects/${ids.project('C')}/builds`, { status: 'planned', factors: { binder: 30 } });
    expect(planned.status).toBe(201);
    const built = await h.as.researcher.patch(`/api/builds/${planned.body.build.id}`, { status: 'built' });
    expect(built.status).toBe(400);
    expect(built.body.error.message).toMatch(/a value is required/);
  });

  it('refuses lineage loops and parents from another project', async () => {
    const loop = await h.as.researcher.patch(`/api/builds/${ids.build('C-001')}`, { parentId: ids.build('C-010') });
    expect(loop.status).toBe(400);
    expect(loop.body.error.message).toMatch(/loop/);
    const foreign = await h.as.researcher.post(`/api/projects/${ids.project('C')}/builds`, { status: 'planned', factors: {}, parentId: ids.build('A-001') });
    expect(foreign.status).toBe(400);
  });

  it('shows lineage: ancestors, children and replicates', async () => {
    const res = await h.as.viewer.get(`/api/builds/${ids.build('C-007')}`);
    expect(res.body.lineage.ancestors.map((a: { code: string }) => a.code)).toEqual(['C-001', 'C-004', 'C-006']);
    expect(res.body.lineage.children.map((a: { code: string }) => a.code)).toEqual(expect.arrayContaining(['C-009', 'C-010']));
    expect(res.body.lineage.replicates.map((a: { code: string }) => a.code)).toEqual(['C-008']);
    // diffed from the records (demo seed: C-006 has 20 wt %, C-007 30 wt %)
    expect(res.body.lineage.changeFromParent).toBe('PTFE binder 20 → 30 wt %');
  });

  it('the (cached) builds list follows every write: edits, uploads and a new reference point', async () => {
    const url = `/api/projects/${ids.project('C')}/builds`;
    const find = async (code: string) => (await h.as.viewer.get(url)).body.builds.find((b: { code: string }) => b.code === code);
    const before = await find('C-017');
    await h.as.researcher.patch(`/api/builds/${ids.build('C-017')}`, { changeNote: 'supplier check, re-pressed' });
    expect((await find('C-017')).changeNote).toBe('supplier check, re-pressed');
    const project = (await h.as.pi.get(`/api/projects/${ids.project('C')}`)).body.project;
    await h.as.pi.patch(`/api/projects/${ids.project('C')}`, { settings: { ...project.settings, refCurrentDensity: 0.1 } });
    const moved = await find('C-017');
    expect(moved.values.vAtRef).toBeGreaterThan(before.values.vAtRef); // a lower j_ref reads a higher voltage on any polarization curve
    await h.as.pi.patch(`/api/projects/${ids.project('C')}`, { settings: project.settings });
    expect((await find('C-017')).values.vAtRef).toBeCloseTo(before.values.vAtRef, 9);
  });

  it('records every write in the audit log with before and after', async () => {
    const res = await h.as.researcher.patch(`/api/builds/${ids.build('C-019')}`, { changeNote: 'design centre point, re-made' });
    expect(res.status).toBe(200);
    const audit = await h.as.admin.get(`/api/admin/audit?entity=build&entityId=${ids.build('C-019')}`);
    const entry = audit.body.entries[0];
    expect(entry.action).toBe('update');
    expect(entry.before.changeNote).toBe('design centre point');
    expect(entry.after.changeNote).toBe('design centre point, re-made');
    expect(entry.userName).toBe('Ayla Sorvik');
  });
});

describe('home', () => {
  it('names each project’s best build: the highest V at j_ref of its builds that are not discarded', async () => {
    const home = await h.as.pi.get('/api/home');
    const project = home.body.projects.find((p: { id: number }) => p.id === ids.project('C'));
    const list = (await h.as.pi.get(`/api/projects/${ids.project('C')}/builds`)).body.builds as { code: string; status: string; values: { vAtRef?: number | null } }[];
    const top = list.filter((b) => b.status !== 'discarded' && b.values.vAtRef != null).sort((a, b) => b.values.vAtRef! - a.values.vAtRef!)[0]!;
    expect(project.best.code).toBe(top.code); // the same maximum found from the builds list
    expect(project.best.vAtRef).toBeCloseTo(top.values.vAtRef!, 12);
    expect(home.body.recentUploads.length).toBeGreaterThan(0);
  });

  it('says what each recent upload belongs to: a build, a catalyst lot (its certificate) or a reference curve', async () => {
    const home = await h.as.pi.get('/api/home');
    const uploads = home.body.recentUploads as { name: string; buildId: number | null; lotId: number | null; lotName: string | null; referenceCurveId: number | null }[];
    // demo seed: the lot certificates and the anode project's reference curve are uploaded last
    const certificate = uploads.find((u) => u.name === 'FNC-24-11-certificate-of-analysis.pdf')!;
    expect(certificate).toMatchObject({ buildId: null, lotName: 'FNC-24-11', referenceCurveId: null });
    const reference = uploads.find((u) => u.name === 'round-robin-rr7-fig4.csv')!;
    expect(reference.buildId).toBeNull();
    expect(reference.referenceCurveId).toEqual(expect.any(Number));
    for (const u of uploads) expect([u.buildId, u.lotId, u.referenceCurveId].filter((x) => x != null).length).toBeLessThanOrEqual(1);
  });
});

describe('start-up and the OpenAPI document', () => {
  it('documents every route with its request schema', async () => {
    const res = await request(h.app).get('/api/openapi.json');
    expect(res.status).toBe(200);
    expect(res.body.openapi).toBe('3.0.3');
    expect(Object.keys(res.body.paths)).toEqual(expect.arrayContaining(['/api/projects', '/api/projects/{id}/builds', '/api/builds/{id}/curves', '/api/files/{id}/raw']));
    const create = res.body.paths['/api/projects/{id}/builds'].post;
    expect(create.requestBody.content['application/json'].schema.properties).toHaveProperty('loadingMgCm2');
  });

  it('seeding is idempotent and creates the demo people with the documented sign-ins', async () => {
    const count = (h.ctx.db.$client.prepare('select count(*) n from users').get() as { n: number }).n;
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-seed-'));
    const ctx = createContext({ DATABASE_PATH: path.join(dir, 'db.sqlite'), UPLOADS_DIR: path.join(dir, 'up'), LOG_LEVEL: 'silent' });
    await seedDemo(ctx);
    const emails = (ctx.db.$client.prepare('select email from users').all() as { email: string }[]).map((r) => r.email);
    expect(emails).toEqual(expect.arrayContaining(['admin@demo.cellwright.test', 'pi@demo.cellwright.test', 'researcher@demo.cellwright.test', 'partner@demo.cellwright.test', 'viewer@demo.cellwright.test']));
    const builds = (ctx.db.$client.prepare('select count(*) n from builds').get() as { n: number }).n;
    expect(builds).toBeGreaterThanOrEqual(25); // the demo lab is sized at 25–40 builds
    expect(builds).toBeLessThanOrEqual(40);
    ctx.db.$client.close();
    fs.rmSync(dir, { recursive: true, force: true });
    expect(count).toBeGreaterThan(0);
  });
});
