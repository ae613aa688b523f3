// Records real API answers for the client's component tests: starts a seeded server, signs in
// as each demo role and saves what the pages under test read, so the stubbed fetch in
// tests/unit/client answers exactly what the server answers. Run after an API shape changes:
//   node scripts/client-fixtures.mjs
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { startServer } from '../tests/browser/lib.mjs';

const out = path.join(path.dirname(fileURLToPath(import.meta.url)), '..', 'tests', 'unit', 'client', 'fixtures', 'api-answers.json');
const ROLES = ['pi', 'researcher', 'partner', 'viewer'];

async function session(url, who) {
  const r = await fetch(`${url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: `${who}@demo.cellwright.test`, password: 'demo-password' }) });
  if (!r.ok) throw new Error(`sign-in as ${who}: ${r.status}`);
  const cookie = r.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
  return async (p) => {
    const a = await fetch(`${url}/api${p}`, { headers: { cookie } });
    if (!a.ok) throw new Error(`GET ${p} as ${who}: ${a.status}`);
    return a.json();
  };
}

const server = await startServer();
try {
  const pi = await session(server.url, 'pi');
  const { projects } = await pi('/projects');
  const project = projects[0];
  const pid = project.id;
  const { builds } = await pi(`/projects/${pid}/builds`);
  const home = (await pi('/auth/me')).user.labId;
  // a planned build of the home lab (no curves: the page shows no charts) and a tested one
  const planned = builds.find((b) => b.status === 'planned' && b.labId === home) ?? builds.find((b) => b.status === 'planned');
  const tested = builds.find((b) => b.status === 'tested');
  if (!planned || !tested) throw new Error('the demo has no planned or no tested build');
  const answers = { projectId: pid, plannedBuildId: planned.id, testedBuildId: tested.id, byRole: {} };
  for (const role of ROLES) {
    const get = await session(server.url, role);
    const paths = ['/auth/me', '/labs', `/projects/${pid}`, `/projects/${pid}/factors`, `/projects/${pid}/responses`, `/projects/${pid}/members`, `/projects/${pid}/builds`, `/builds/${planned.id}`, `/builds/${planned.id}/reviews`, `/builds/${tested.id}`, `/builds/${tested.id}/reviews`];
    const byPath = {};
    for (const p of paths) byPath[p] = await get(p);
    // a few builds are enough for a table; the full list only makes the file long
    byPath[`/projects/${pid}/builds`].builds = byPath[`/projects/${pid}/builds`].builds.slice(0, 4);
    answers.byRole[role] = byPath;
  }
  fs.mkdirSync(path.dirname(out), { recursive: true });
  fs.writeFileSync(out, `${JSON.stringify(answers, null, 1)}\n`);
  console.log(`wrote ${path.relative(process.cwd(), out)} (${(fs.statSync(out).size / 1024).toFixed(0)} kB): project ${pid}, planned build ${planned.id}, tested build ${tested.id}`);
} finally {
  await server.stop();
}
