// Builds-list figure, server side: a temp database with the demo seed plus 10,000 builds in project C
// (one Drizzle bulk insert in a transaction), the real app on one loopback port and a bare Express
// route answering the same list straight from better-sqlite3 on another. Prints ports and a session.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import express from 'express';
import type { AddressInfo } from 'node:net';
import { createContext } from '../server/bootstrap';
import { createApp } from '../server/app';
import { seedDemo } from '../server/seed/seed';
import { builds } from '../server/db/schema';
import { exitWhenParentCloses, signIn } from './lib';

const count = Number(process.argv[2] ?? 10_000);
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-bench-builds-'));
const ctx = createContext({ DATABASE_PATH: path.join(dir, 'db.sqlite'), UPLOADS_DIR: path.join(dir, 'uploads'), LOG_LEVEL: 'silent', SEED_DEMO: 'never', LOGIN_RATE_LIMIT: '100000' });
await seedDemo(ctx);
const sqlite = ctx.db.$client;
const projectId = (sqlite.prepare("select id from projects where code_prefix = 'C'").get() as { id: number }).id;
const template = sqlite.prepare('select lab_id as labId, operator_id as operatorId, created_by as createdBy from builds where project_id = ? limit 1').get(projectId) as { labId: number; operatorId: number; createdBy: number };
const existing = (sqlite.prepare('select count(*) as n from builds where project_id = ?').get(projectId) as { n: number }).n;

const seedStarted = performance.now();
const gdl = ['carbon cloth', 'carbon paper'];
const rows: (typeof builds.$inferInsert)[] = [];
for (let i = 0; i < count - existing; i++) {
  rows.push({
    projectId, code: `C-B${String(i + 1).padStart(5, '0')}`, changeNote: `bench build ${i + 1}`,
    factorValues: { binder: 10 + (i % 5) * 10, activationTemp: 300 + (i % 7) * 15, activationTime: 1 + (i % 3), gdl: gdl[i % 2], cellTemp: 160 + (i % 3) * 10 },
    loadingMgCm2: 2 + (i % 4) * 0.5, areaCm2: 5, labId: template.labId, operatorId: template.operatorId, createdBy: template.createdBy,
    testConditions: { temperatureC: 160 }, status: i % 4 === 0 ? 'planned' : 'tested', responseValues: {},
  });
}
ctx.db.transaction((tx) => {
  for (let i = 0; i < rows.length; i += 500) tx.insert(builds).values(rows.slice(i, i + 500)).run();
});
const seedMs = performance.now() - seedStarted;

const app = createApp(ctx, { serveClient: false });
const real = app.listen(0, '127.0.0.1');
await new Promise((r) => real.once('listening', r));

// The baseline: no auth, no permissions, no metric merge — one prepared select and res.json.
const bare = express();
const select = sqlite.prepare('select b.id, b.code, b.status, b.parent_id as parentId, b.change_note as changeNote, b.factor_values as factorValues, b.loading_mg_cm2 as loadingMgCm2, b.metal_loading_mg_cm2 as metalLoadingMgCm2, b.area_cm2 as areaCm2, b.catalyst_lot as catalystLot, b.lab_id as labId, b.test_conditions as testConditions, b.built_on as builtOn, b.tested_on as testedOn, b.replicate_of as replicateOf, b.response_values as responseValues, b.created_at as createdAt, b.updated_at as updatedAt from builds b where b.project_id = ? order by b.id limit ? offset ?');
bare.get('/builds', (req, res) => {
  const limit = req.query.limit ? Number(req.query.limit) : -1;
  const list = (select.all(projectId, limit, 0) as Record<string, unknown>[]).map((r) => ({ ...r, factorValues: JSON.parse(String(r.factorValues)), testConditions: JSON.parse(String(r.testConditions)), responseValues: JSON.parse(String(r.responseValues)) }));
  res.json({ builds: list });
});
const bareServer = bare.listen(0, '127.0.0.1');
await new Promise((r) => bareServer.once('listening', r));

const realUrl = `http://127.0.0.1:${(real.address() as AddressInfo).port}`;
const auth = await signIn(realUrl, 'researcher@demo.cellwright.test');
const total = (sqlite.prepare('select count(*) as n from builds where project_id = ?').get(projectId) as { n: number }).n;
exitWhenParentCloses(() => {
  real.close();
  bareServer.close();
  ctx.db.$client.close();
  fs.rmSync(dir, { recursive: true, force: true });
});
console.log(JSON.stringify({ realUrl, bareUrl: `http://127.0.0.1:${(bareServer.address() as AddressInfo).port}`, projectId, builds: total, seedMs, cookie: auth.cookie }));
