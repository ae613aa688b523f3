// Hardening: sign-in that spelling variants cannot out-guess and whose timing reveals nothing,
// Origin checks on cookie writes, e-mail links only from configured addresses, token scopes,
// the last PI, invitations of existing accounts, and odd requests that must be 4xx, not 500.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createContext } from '../../server/bootstrap';
import { sweepTemporaryUploads } from '../../server/uploads/tmp-sweeper';
import { createHarness, demoIds, type Harness } from './harness';
import { hashPassword, standInHash, verifyAgainstNothing } from '../../server/auth/passwords';
import { sameSecret } from '../../server/auth/sessions';
import { normalizeEmail } from '../../shared/schemas/auth';
import { users } from '../../server/db/schema';

const CSV = 'Current density (A/cm2),Voltage (V),HFR (Ohm cm2)\n0,0.98,0.12\n0.05,0.74,0.12\n0.1,0.69,0.12\n0.2,0.62,0.12\n0.3,0.57,0.12\n0.4,0.52,0.12\n';

/** A harness without the demo: one person, for tests that change the environment. */
async function bareHarness(env: Record<string, string | undefined>) {
  const h = await createHarness({ seed: false, env });
  h.ctx.db.insert(users).values({ email: 'lena.marsh@lab.example', name: 'Lena Marsh', passwordHash: await hashPassword('right-password-1'), isAdmin: true }).run();
  return h;
}

describe('sign-in', () => {
  let h: Harness;
  beforeAll(async () => {
    h = await bareHarness({ LOGIN_RATE_LIMIT: '3' });
  });
  afterAll(() => h.close());

  it('normalises the address once: trim, NFKC, lower case, BOM and zero-width characters removed', () => {
    expect(normalizeEmail('  Lena.Marsh@Lab.Example\t')).toBe('lena.marsh@lab.example');
    expect(normalizeEmail('\uFEFFlena.marsh@lab.example')).toBe('lena.marsh@lab.example');
    expect(normalizeEmail('lena\u200B.marsh@lab.example\u200D')).toBe('lena.marsh@lab.example');
    // NFKC folds full-width letters and the full-width commercial at (Unicode UAX #15)
    expect(normalizeEmail('ｌｅｎａ.marsh＠lab.example')).toBe('lena.marsh@lab.example');
  });

  it('spelling variants of one address share one rate-limit bucket, and the right password is refused while it is full', async () => {
    for (let k = 0; k < 3; k++) {
      const res = await request(h.app).post('/api/auth/login').send({ email: 'lena.marsh@lab.example', password: `wrong-${k}` });
      expect(res.status).toBe(401);
    }
    for (const variant of [' lena.marsh@lab.example', 'LENA.MARSH@lab.example\t', '\uFEFFlena.marsh@lab.example', 'lena.marsh@lab.example\u200B', 'ｌｅｎａ.marsh@lab.example']) {
      const res = await request(h.app).post('/api/auth/login').send({ email: variant, password: 'wrong-again' });
      expect(res.status, variant).toBe(429);
    }
    const right = await request(h.app).post('/api/auth/login').send({ email: ' Lena.Marsh@lab.example ', password: 'right-password-1' });
    expect(right.status).toBe(429);
  });

  it('an unknown address costs the same hash as a wrong password for a known one (no timing oracle)', async () => {
    // Checked by what runs, not by a stopwatch: an unknown address is verified against a stand-in
    // hash made with the very parameters of real hashes, so both answers cost one argon2id verify.
    const parameters = (encoded: string) => encoded.split('$').slice(1, 4).join('$'); // argon2id$v=19$m=…,t=…,p=… (PHC string format)
    const real = await hashPassword('right-password-1');
    expect(parameters(await standInHash())).toBe(parameters(real));
    expect(parameters(real)).toBe('argon2id$v=19$m=19456,t=2,p=1'); // OWASP Password Storage Cheat Sheet's argon2id minimum
    expect(await verifyAgainstNothing('anything')).toBe(false);
    const h2 = await bareHarness({});
    try {
      const unknown = await request(h2.app).post('/api/auth/login').send({ email: 'nobody@lab.example', password: 'not-the-password' });
      const wrong = await request(h2.app).post('/api/auth/login').send({ email: 'lena.marsh@lab.example', password: 'not-the-password' });
      expect(unknown.status).toBe(401);
      expect(wrong.status).toBe(401);
      expect(unknown.body.error).toEqual(wrong.body.error);
    } finally {
      h2.close();
    }
  });

  it('compares secrets in constant time, whatever their lengths', () => {
    expect(sameSecret('abc', 'abc')).toBe(true);
    expect(sameSecret('abc', 'abd')).toBe(false);
    expect(sameSecret('abc', 'abcd')).toBe(false);
    expect(sameSecret('', 'abc')).toBe(false);
    expect(sameSecret(undefined, 'abc')).toBe(false);
  });
});

describe('Origin of cookie-authenticated writes', () => {
  let h: Harness;
  let ids: ReturnType<typeof demoIds>;
  beforeAll(async () => {
    h = await createHarness();
    ids = demoIds(h.ctx);
  });
  afterAll(() => h.close());

  const write = (origin: { Origin?: string; Referer?: string }) => {
    let t = h.as.researcher.raw('post', `/api/projects/${ids.project('C')}/builds`);
    for (const [k, v] of Object.entries(origin)) t = t.set(k, v!);
    return t.send({ status: 'planned', factors: {} });
  };

  it('refuses a valid CSRF token sent from a foreign origin', async () => {
    const res = await write({ Origin: 'http://evil.example' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('bad-origin');
    expect(res.body.error.message).toContain('http://evil.example');
  });

  it('falls back to the Referer when there is no Origin', async () => {
    const res = await write({ Referer: 'http://evil.example/page' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('bad-origin');
  });

  it('accepts the configured origin (PUBLIC_URL), and requests without either header (CSRF token still required)', async () => {
    expect((await write({ Origin: 'http://cellwright.test' })).status).toBe(201);
    expect((await write({ Referer: 'http://cellwright.test/projects/1' })).status).toBe(201);
    expect((await write({})).status).toBe(201);
  });

  it('does not apply to Bearer-token scripts (no cookie, no CSRF exposure)', async () => {
    const t = await h.as.researcher.post('/api/auth/tokens', { name: 'origin script', scope: 'full' });
    const res = await request(h.app).post(`/api/projects/${ids.project('C')}/builds`).set('Authorization', `Bearer ${t.body.token}`).set('Origin', 'http://evil.example').send({ status: 'planned', factors: {} });
    expect(res.status).toBe(201);
  });
});

describe('links in e-mails', () => {
  it('never come from the Host header: without PUBLIC_URL in development they point at this server on localhost', async () => {
    const h = await bareHarness({ PUBLIC_URL: '', NODE_ENV: 'development', PORT: '3106' });
    try {
      const agent = request.agent(h.app);
      const login = await agent.post('/api/auth/login').send({ email: 'lena.marsh@lab.example', password: 'right-password-1' });
      const project = await agent.post('/api/projects').set('X-CSRF-Token', login.body.csrfToken).send({ name: 'Link test', settings: { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'catalyst' } });
      const res = await agent.post(`/api/projects/${project.body.project.id}/invitations`).set('X-CSRF-Token', login.body.csrfToken).set('Host', 'evil.example').send({ email: 'guest@lab.example', role: 'viewer' });
      expect(res.status).toBe(201);
      const mail = h.ctx.db.$client.prepare('select text, html from outbox order by id desc limit 1').get() as { text: string; html: string };
      expect(mail.text).not.toContain('evil.example');
      expect(mail.html).not.toContain('evil.example');
      expect(mail.text).toMatch(/http:\/\/localhost:3106\/invite\//);
    } finally {
      h.close();
    }
  });

  it('use a host from ALLOWED_HOSTS when the request names one', async () => {
    const h = await bareHarness({ PUBLIC_URL: '', NODE_ENV: 'production', ALLOWED_HOSTS: 'cellwright.lab.example, cw.lab.example:8443' });
    try {
      const agent = request.agent(h.app);
      const login = await agent.post('/api/auth/login').set('Host', 'cw.lab.example:8443').send({ email: 'lena.marsh@lab.example', password: 'right-password-1' });
      const csrf = login.body.csrfToken as string;
      const project = await agent.post('/api/projects').set('Host', 'cw.lab.example:8443').set('X-CSRF-Token', csrf).send({ name: 'Link test', settings: { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'catalyst' } });
      const ok = await agent.post(`/api/projects/${project.body.project.id}/invitations`).set('Host', 'cw.lab.example:8443').set('X-CSRF-Token', csrf).send({ email: 'guest@lab.example', role: 'viewer' });
      expect(ok.status).toBe(201);
      const mail = h.ctx.db.$client.prepare('select text from outbox order by id desc limit 1').get() as { text: string };
      expect(mail.text).toMatch(/http:\/\/cw\.lab\.example:8443\/invite\//);
      // an unlisted Host falls back to the first listed host, never to itself
      await agent.post(`/api/projects/${project.body.project.id}/invitations`).set('Host', 'evil.example').set('X-CSRF-Token', csrf).send({ email: 'guest2@lab.example', role: 'viewer' });
      const second = h.ctx.db.$client.prepare('select text from outbox order by id desc limit 1').get() as { text: string };
      expect(second.text).not.toContain('evil.example');
      expect(second.text).toMatch(/\/\/cellwright\.lab\.example\/invite\//);
    } finally {
      h.close();
    }
  });

  it('outside development, invitations are refused (nothing stored or sent) until PUBLIC_URL or ALLOWED_HOSTS is set', async () => {
    const h = await bareHarness({ PUBLIC_URL: '', NODE_ENV: 'production' });
    try {
      const agent = request.agent(h.app);
      const login = await agent.post('/api/auth/login').send({ email: 'lena.marsh@lab.example', password: 'right-password-1' });
      const csrf = login.body.csrfToken as string;
      const project = await agent.post('/api/projects').set('X-CSRF-Token', csrf).send({ name: 'Link test', settings: { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'catalyst' } });
      const res = await agent.post(`/api/projects/${project.body.project.id}/invitations`).set('X-CSRF-Token', csrf).send({ email: 'guest@lab.example', role: 'viewer' });
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe('public-url-missing');
      expect(res.body.error.message).toContain('PUBLIC_URL');
      expect(h.ctx.db.$client.prepare('select count(*) as n from invitations').get()).toEqual({ n: 0 });
      expect(h.ctx.db.$client.prepare('select count(*) as n from outbox').get()).toEqual({ n: 0 });
    } finally {
      h.close();
    }
  });
});

describe('API token scopes', () => {
  let h: Harness;
  let ids: ReturnType<typeof demoIds>;
  beforeAll(async () => {
    h = await createHarness();
    ids = demoIds(h.ctx);
  });
  afterAll(() => h.close());

  const mint = async (scope: string) => {
    const res = await h.as.researcher.post('/api/auth/tokens', { name: `${scope} script`, scope });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.scope).toBe(scope);
    return res.body as { token: string; id: number };
  };
  const bearer = (token: string) => ({
    get: (url: string) => request(h.app).get(url).set('Authorization', `Bearer ${token}`),
    post: (url: string, body: object = {}) => request(h.app).post(url).set('Authorization', `Bearer ${token}`).send(body),
    upload: (url: string) => request(h.app).post(url).set('Authorization', `Bearer ${token}`).attach('file', Buffer.from(CSV), 'scope.csv'),
  });

  it('is chosen at creation and listed; an unknown scope is a 400', async () => {
    await mint('read');
    const list = await h.as.researcher.get('/api/auth/tokens');
    expect(list.body.tokens.find((t: { name: string }) => t.name === 'read script').scope).toBe('read');
    const bad = await h.as.researcher.post('/api/auth/tokens', { name: 'x', scope: 'admin' });
    expect(bad.status).toBe(400);
  });

  it('read: reads only', async () => {
    const t = bearer((await mint('read')).token);
    expect((await t.get(`/api/projects/${ids.project('C')}`)).status).toBe(200);
    const write = await t.post(`/api/projects/${ids.project('C')}/builds`, { status: 'planned', factors: {} });
    expect(write.status).toBe(403);
    expect(write.body.error.code).toBe('token-scope');
    expect((await t.upload(`/api/builds/${ids.build('C-014')}/curves`)).status).toBe(403);
  });

  it('upload: reads and uploads curves, nothing else', async () => {
    const t = bearer((await mint('upload')).token);
    expect((await t.get(`/api/projects/${ids.project('C')}/builds`)).status).toBe(200);
    expect((await t.upload(`/api/builds/${ids.build('C-014')}/curves/preview`)).status).toBe(200);
    expect((await t.upload(`/api/builds/${ids.build('C-014')}/curves`)).status).toBe(201);
    const write = await t.post(`/api/projects/${ids.project('C')}/builds`, { status: 'planned', factors: {} });
    expect(write.status).toBe(403);
    expect(write.body.error.code).toBe('token-scope');
  });

  it('full: every route the person may use, except minting tokens and ending browser sessions', async () => {
    const t = bearer((await mint('full')).token);
    expect((await t.post(`/api/projects/${ids.project('C')}/builds`, { status: 'planned', factors: {} })).status).toBe(201);
    const minted = await t.post('/api/auth/tokens', { name: 'child', scope: 'read' });
    expect(minted.status).toBe(403);
    expect(minted.body.error.code).toBe('token-scope');
    const sessions = await t.get('/api/auth/sessions');
    const revoke = await t.post(`/api/auth/sessions/${sessions.body.sessions[0].id}/revoke`);
    expect(revoke.status).toBe(403);
    const still = await h.as.researcher.get('/api/auth/me');
    expect(still.status).toBe(200);
  });

  it('an admin’s token cannot end other people’s browser sessions either', async () => {
    const adminToken = await h.as.admin.post('/api/auth/tokens', { name: 'admin script', scope: 'full' });
    const res = await request(h.app).post(`/api/admin/people/${ids.user('viewer@demo.cellwright.test')}/revoke-sessions`).set('Authorization', `Bearer ${adminToken.body.token}`);
    expect(res.status).toBe(403);
    expect((await h.as.viewer.get('/api/auth/me')).status).toBe(200);
  });

  it('revoking a token revokes every token recorded as made with it', async () => {
    const parent = await mint('full');
    // tokens made through a token (recorded by parent_token_id) go when their parent goes
    const sqlite = h.ctx.db.$client;
    const researcherId = ids.user('researcher@demo.cellwright.test');
    sqlite.prepare("insert into api_tokens (user_id, name, token_hash, scope, parent_token_id) values (?, 'child', 'hash-child', 'read', ?)").run(researcherId, parent.id);
    const child = sqlite.prepare("select id from api_tokens where token_hash = 'hash-child'").get() as { id: number };
    sqlite.prepare("insert into api_tokens (user_id, name, token_hash, scope, parent_token_id) values (?, 'grandchild', 'hash-grandchild', 'read', ?)").run(researcherId, child.id);
    const res = await h.as.researcher.post(`/api/auth/tokens/${parent.id}/revoke`);
    expect(res.status).toBe(200);
    expect(res.body.revoked).toBe(3);
    const open = sqlite.prepare("select count(*) as n from api_tokens where token_hash in ('hash-child', 'hash-grandchild') and revoked_at is null").get();
    expect(open).toEqual({ n: 0 });
  });
});

describe('members and invitations', () => {
  let h: Harness;
  let ids: ReturnType<typeof demoIds>;
  beforeAll(async () => {
    h = await createHarness();
    ids = demoIds(h.ctx);
  });
  afterAll(() => h.close());

  it('the last PI of a project cannot be demoted; with a second PI it can', async () => {
    const project = await h.as.pi.post('/api/projects', { name: 'Last PI test', settings: { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'catalyst' } });
    const id = project.body.project.id;
    const pi = ids.user('pi@demo.cellwright.test');
    const refused = await h.as.admin.put(`/api/projects/${id}/members`, { userId: pi, role: 'researcher' });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/at least one PI/);
    await h.as.pi.put(`/api/projects/${id}/members`, { userId: ids.user('researcher@demo.cellwright.test'), role: 'pi' });
    const ok = await h.as.admin.put(`/api/projects/${id}/members`, { userId: pi, role: 'researcher' });
    expect(ok.status).toBe(200);
  });

  it('inviting a person who already has an account adds them with a notice instead of an invitation', async () => {
    const project = await h.as.pi.post('/api/projects', { name: 'Existing account test', settings: { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'catalyst' } });
    const id = project.body.project.id;
    const res = await h.as.pi.post(`/api/projects/${id}/invitations`, { email: ' Viewer@Demo.Cellwright.Test ', role: 'viewer' });
    expect(res.status).toBe(201);
    expect(res.body.invitation).toBeNull();
    expect(res.body.member).toMatchObject({ userId: ids.user('viewer@demo.cellwright.test'), role: 'viewer', added: true });
    const members = await h.as.pi.get(`/api/projects/${id}/members`);
    expect(members.body.members.map((m: { email: string }) => m.email)).toContain('viewer@demo.cellwright.test');
    expect(members.body.pendingInvitations).toEqual([]);
    const mail = h.ctx.db.$client.prepare('select subject, text from outbox where "to" = ? order by id desc limit 1').get('viewer@demo.cellwright.test') as { subject: string; text: string };
    expect(mail.subject).toContain('Existing account test');
    expect(mail.text).not.toContain('/invite/');
    expect(mail.text).toContain(`http://cellwright.test/projects/${id}`);
    // already a member: a clear 409, not a second notice
    const again = await h.as.pi.post(`/api/projects/${id}/invitations`, { email: 'viewer@demo.cellwright.test', role: 'viewer' });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('already-member');
  });
});

describe('odd requests answer 4xx, not 500', () => {
  let h: Harness;
  let ids: ReturnType<typeof demoIds>;
  beforeAll(async () => {
    h = await createHarness();
    ids = demoIds(h.ctx);
  });
  afterAll(() => h.close());

  it('PATCH /api/admin/people/:id with {} is a 400 naming what can change', async () => {
    const res = await h.as.admin.patch(`/api/admin/people/${ids.user('viewer@demo.cellwright.test')}`, {});
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/name|isAdmin|labId|disabled/);
  });

  it('GET /api/curves/:id with one bound of the window gives a valid window; a reversed window is a 400', async () => {
    const row = h.ctx.db.$client.prepare("select c.id from curves c where c.kind = 'durability' limit 1").get() as { id: number };
    const from = await h.as.viewer.get(`/api/curves/${row.id}?fromHours=10`);
    expect(from.status).toBe(200);
    expect(from.body.points.tHours[0]).toBeGreaterThanOrEqual(10);
    const to = await h.as.viewer.get(`/api/curves/${row.id}?toHours=10`);
    expect(to.status).toBe(200);
    expect(to.body.points.tHours.at(-1)).toBeLessThanOrEqual(10);
    const reversed = await h.as.viewer.get(`/api/curves/${row.id}?fromHours=20&toHours=10`);
    expect(reversed.status).toBe(400);
    const beyond = await h.as.viewer.get(`/api/curves/${row.id}?fromHours=1e9`);
    expect(beyond.status).toBeLessThan(500);
  });
});

describe('crashes leave nothing behind', () => {
  it('temporary upload files left by a killed process are removed at start-up', async () => {
    const first = await createHarness({ seed: false });
    const tmp = path.join(first.ctx.env.uploadsDir, 'tmp');
    fs.mkdirSync(tmp, { recursive: true });
    for (let k = 0; k < 3; k++) fs.writeFileSync(path.join(tmp, `left-over-${k}`), 'partial upload');
    // a second start on the same folders, as after kill -9
    const again = createContext({ DATABASE_PATH: first.ctx.env.databasePath, UPLOADS_DIR: first.ctx.env.uploadsDir, LOG_LEVEL: 'silent', SEED_DEMO: 'never' });
    try {
      expect(fs.readdirSync(tmp)).toEqual([]);
    } finally {
      again.db.$client.close();
      first.close();
    }
  });

  it('and by age while running (files older than the limit go, fresh ones stay)', () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-sweep-'));
    try {
      fs.writeFileSync(path.join(dir, 'old'), 'x');
      fs.writeFileSync(path.join(dir, 'fresh'), 'y');
      const hourAgo = new Date(Date.now() - 3600_000);
      fs.utimesSync(path.join(dir, 'old'), hourAgo, hourAgo);
      expect(sweepTemporaryUploads(dir, 30 * 60_000)).toEqual({ removed: 1, bytes: 1 });
      expect(fs.readdirSync(dir)).toEqual(['fresh']);
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });

  it('the audit entry of an upload is written in the curve’s transaction: when it fails, no curve is stored', async () => {
    const h = await createHarness();
    try {
      const ids = demoIds(h.ctx);
      const sqlite = h.ctx.db.$client;
      const curvesBefore = (sqlite.prepare('select count(*) as n from curves').get() as { n: number }).n;
      sqlite.exec("create trigger refuse_upload_audit before insert on audit_log when new.action = 'upload' begin select raise(abort, 'audit refused'); end");
      const res = await h.as.researcher.upload(`/api/builds/${ids.build('C-014')}/curves`, { name: 'audited.csv', content: CSV + '0.5,0.47,0.12\n' });
      expect(res.status, JSON.stringify(res.body)).toBe(500);
      expect((sqlite.prepare('select count(*) as n from curves').get() as { n: number }).n).toBe(curvesBefore);
      expect(sqlite.prepare("select count(*) as n from files where original_name = 'audited.csv'").get()).toEqual({ n: 0 });
    } finally {
      h.close();
    }
  });
});
