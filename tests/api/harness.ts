// API test harness: a fresh database in a temp folder, the demo seed, and a signed-in
// supertest agent per demo role (cookie session + CSRF token, as the browser does).
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll } from 'vitest';
import type { Express } from 'express';
import { createContext } from '../../server/bootstrap';
import { createApp } from '../../server/app';
import { seedDemo } from '../../server/seed/seed';
import type { AppContext } from '../../server/context';

export type Who = 'admin' | 'pi' | 'researcher' | 'partner' | 'viewer';
export const EVERYONE: Who[] = ['admin', 'pi', 'researcher', 'partner', 'viewer'];

export interface Client {
  who: Who | 'anonymous';
  get(url: string): request.Test;
  post(url: string, body?: object): request.Test;
  patch(url: string, body?: object): request.Test;
  put(url: string, body?: object): request.Test;
  delete(url: string): request.Test;
  upload(url: string, file: { name: string; content: string | Buffer }, fields?: Record<string, string>): request.Test;
  /** a request with the session and CSRF header but no body yet */
  raw(method: 'get' | 'post' | 'patch' | 'put' | 'delete', url: string): request.Test;
}

export interface Harness {
  /** the temporary folder holding the database and the uploads */
  dir: string;
  ctx: AppContext;
  app: Express;
  as: Record<Who, Client>;
  anonymous: Client;
  close(): void;
}

function client(app: Express, who: Client['who'], agent: request.Agent, csrf: string | null): Client {
  const withCsrf = (t: request.Test) => (csrf ? t.set('X-CSRF-Token', csrf) : t);
  return {
    who,
    get: (url) => agent.get(url),
    post: (url, body) => withCsrf(agent.post(url)).send(body ?? {}),
    patch: (url, body) => withCsrf(agent.patch(url)).send(body ?? {}),
    put: (url, body) => withCsrf(agent.put(url)).send(body ?? {}),
    delete: (url) => withCsrf(agent.delete(url)),
    raw: (method, url) => withCsrf(agent[method](url)),
    upload: (url, file, fields = {}) => {
      let t = withCsrf(agent.post(url));
      for (const [k, v] of Object.entries(fields)) t = t.field(k, v);
      return t.attach('file', Buffer.isBuffer(file.content) ? file.content : Buffer.from(file.content), file.name);
    },
  };
}

export async function createHarness(options: { seed?: boolean; env?: Record<string, string | undefined> } = {}): Promise<Harness> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-api-'));
  const ctx = createContext({ DATABASE_PATH: path.join(dir, 'db.sqlite'), UPLOADS_DIR: path.join(dir, 'uploads'), BACKUP_DIR: path.join(dir, 'backups'), LOG_LEVEL: 'silent', SEED_DEMO: 'never', LOGIN_RATE_LIMIT: '1000', PUBLIC_URL: 'http://cellwright.test', ...options.env });
  if (options.seed !== false) await seedDemo(ctx);
  const app = createApp(ctx, { serveClient: false });
  const as = {} as Record<Who, Client>;
  if (options.seed !== false) {
    for (const who of EVERYONE) {
      const agent = request.agent(app);
      const res = await agent.post('/api/auth/login').send({ email: `${who}@demo.cellwright.test`, password: 'demo-password' });
      if (res.status !== 200) throw new Error(`login as ${who} failed: ${res.status} ${JSON.stringify(res.body)}`);
      as[who] = client(app, who, agent, res.body.csrfToken);
    }
  }
  return {
    dir,
    ctx,
    app,
    as,
    anonymous: client(app, 'anonymous', request.agent(app), null),
    close() {
      ctx.db.$client.close();
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}

/** Look up demo ids by code / name so tests read like the scenario. */
export function demoIds(ctx: AppContext) {
  const sqlite = ctx.db.$client;
  const project = (prefix: string) => (sqlite.prepare('select id from projects where code_prefix = ?').get(prefix) as { id: number }).id;
  const build = (code: string) => (sqlite.prepare('select id from builds where code = ?').get(code) as { id: number }).id;
  const lab = (name: string) => (sqlite.prepare('select id from labs where name like ?').get(`${name}%`) as { id: number }).id;
  const user = (email: string) => (sqlite.prepare('select id from users where email = ?').get(email) as { id: number }).id;
  return { project, build, lab, user };
}

/**
 * One seeded harness for a whole test file, opened before its tests and closed after them: read
 * `t.h` (the harness) and `t.ids` (demo ids) inside the tests.
 */
export function demoHarness(options: Parameters<typeof createHarness>[0] = {}) {
  const t = {} as { h: Harness; ids: ReturnType<typeof demoIds> };
  beforeAll(async () => {
    t.h = await createHarness(options);
    t.ids = demoIds(t.h.ctx);
  });
  afterAll(() => t.h.close());
  return t;
}
