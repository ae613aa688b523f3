// The curve of record through the API: the first curve of a kind becomes it, a later upload never
// replaces it without an explicit choice, choosing sends a reviewed build back to review with a
// notice to the PIs and an audit entry, deleting the record hands over to the oldest remaining
// curve, and the migration keeps the values existing databases show today.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { createHarness, demoIds, type Harness } from './harness';

// An invented higher-performing repeat: V at the 0.2 A/cm² row is 0.700 V (read off the file).
const BETTER = 'Current density (A/cm2),Voltage (V),HFR (Ohm cm2)\n0,1.00,0.10\n0.05,0.82,0.10\n0.1,0.77,0.10\n0.2,0.700,0.10\n0.3,0.65,0.10\n0.4,0.60,0.10\n';
const PI = 'pi@demo.cellwright.test';

let h: Harness;
let ids: ReturnType<typeof demoIds>;

function mailTo(email: string): { subject: string; text: string }[] {
  return h.ctx.db.$client.prepare('select subject, text from outbox where "to" = ? order by id').all(email) as { subject: string; text: string }[];
}

function auditOf(action: string, entity: string, afterId: number) {
  return h.ctx.db.$client
    .prepare(`select user_id as userId, action, entity, entity_id as entityId, before, after from audit_log where action = ? and entity = ? and id > ? order by id`)
    .all(action, entity, afterId) as { userId: number; action: string; entity: string; entityId: number; before: string; after: string }[];
}

const lastAuditId = () => (h.ctx.db.$client.prepare('select coalesce(max(id), 0) as n from audit_log').get() as { n: number }).n;

async function detail(code: string) {
  return (await h.as.pi.get(`/api/builds/${ids.build(code)}`).expect(200)).body as {
    build: { status: string; values: Record<string, number | null>; recordCurveIds: Record<string, number> };
    curves: { id: number; kind: string; isRecord: boolean; label: string; metrics: Record<string, number | null> }[];
  };
}

async function listed(code: string) {
  const list = await h.as.pi.get(`/api/projects/${ids.project('C')}/builds`).expect(200);
  return list.body.builds.find((b: { code: string }) => b.code === code) as { values: Record<string, number | null>; recordCurveIds: Record<string, number>; status: string };
}

beforeAll(async () => {
  h = await createHarness();
  ids = demoIds(h.ctx);
});
afterAll(() => h.close());

describe('the seeded demo', () => {
  it('has exactly one curve of record per build and kind', () => {
    const groups = h.ctx.db.$client
      .prepare('select build_id, kind, count(*) as n, sum(is_record) as records from curves group by build_id, kind')
      .all() as { n: number; records: number }[];
    expect(groups.length).toBeGreaterThan(20);
    for (const g of groups) expect(g.records).toBe(1);
  });

  it('lists each build’s record ids and marks the record among its curves', async () => {
    const d = await detail('C-001');
    const pol = d.curves.filter((c) => c.kind === 'polarization');
    expect(pol.filter((c) => c.isRecord).map((c) => c.id)).toEqual([d.build.recordCurveIds.polarization]);
    expect(d.build.recordCurveIds.durability).toBe(d.curves.find((c) => c.kind === 'durability')!.id);
    const record = pol.find((c) => c.isRecord)!;
    expect(d.build.values.vAtRef).toBe(record.metrics.vAtRef);
  });
});

describe('a later upload never replaces the record by itself', () => {
  it('stores the new curve beside the record; values, list, home, gains and lineage keep the old value', async () => {
    const code = 'C-010'; // demo data: reviewed, the home lab's build
    const before = await detail(code);
    const beforeList = await listed(code);
    const beforeHome = (await h.as.pi.get('/api/home').expect(200)).body.projects.find((p: { id: number }) => p.id === ids.project('C'));
    const beforeLineage = await h.as.pi.get(`/api/projects/${ids.project('C')}/lineage?response=vAtRef`).expect(200);
    const chain = ['C-001', 'C-004', 'C-006', 'C-007', code].map((c) => ids.build(c)).join(',');
    const gains = async () => (await h.as.pi.get(`/api/projects/${ids.project('C')}/gains?response=vAtRef&builds=${chain}`).expect(200)).body.steps.map((s: { value: number }) => s.value);
    const beforeGains = await gains();
    const lineageValue = (body: { nodes: { members: { id: number }[]; value: unknown }[] }) => JSON.stringify(body.nodes.find((n) => n.members.some((m) => m.id === ids.build(code)))!.value);

    const res = await h.as.researcher.upload(`/api/builds/${ids.build(code)}/curves`, { name: 'C-010-repeat.csv', content: BETTER }).expect(201);
    expect(res.body.curve.isRecord).toBe(false);
    expect(res.body.curve.metrics.vAtRef).toBeCloseTo(0.7, 9); // the file's 0.2 A/cm² row, read by hand
    expect(res.body.recordCurve.id).toBe(before.build.recordCurveIds.polarization);
    expect(res.body.recordCurve.isRecord).toBe(true);

    const after = await detail(code);
    expect(after.build.status).toBe('reviewed');
    expect(after.build.recordCurveIds).toEqual(before.build.recordCurveIds);
    expect(after.build.values.vAtRef).toBe(before.build.values.vAtRef);
    expect((await listed(code)).values).toEqual(beforeList.values);
    const home = (await h.as.pi.get('/api/home').expect(200)).body.projects.find((p: { id: number }) => p.id === ids.project('C'));
    expect(home.best).toEqual(beforeHome.best); // the new 0.700 V would top the project if it were read
    const lineage = await h.as.pi.get(`/api/projects/${ids.project('C')}/lineage?response=vAtRef`).expect(200);
    expect(lineageValue(lineage.body)).toBe(lineageValue(beforeLineage.body));
    expect(await gains()).toEqual(beforeGains);
  });

  it('keeps the record when the reference point moves and every curve is re-measured', async () => {
    const code = 'C-010';
    const before = await detail(code);
    const project = (await h.as.pi.get(`/api/projects/${ids.project('C')}`).expect(200)).body.project;
    await h.as.pi.patch(`/api/projects/${ids.project('C')}`, { settings: { ...project.settings, refCurrentDensity: 0.1 } }).expect(200);
    const moved = await detail(code);
    expect(moved.build.recordCurveIds).toEqual(before.build.recordCurveIds);
    const record = moved.curves.find((c) => c.id === before.build.recordCurveIds.polarization)!;
    expect(moved.build.values.vAtRef).toBe(record.metrics.vAtRef);
    await h.as.pi.patch(`/api/projects/${ids.project('C')}`, { settings: project.settings }).expect(200);
  });

  it('the PI’s upload notice says the values are unchanged', async () => {
    const mails = mailTo(PI).length;
    await h.as.partner.upload(`/api/builds/${ids.build('C-014')}/curves`, { name: 'kestrel-repeat.csv', content: BETTER }).expect(201);
    const inbox = mailTo(PI);
    expect(inbox.length).toBe(mails + 1);
    expect(inbox.at(-1)!.text).toContain('not the polarization curve of record');
  });
});

describe('choosing the record', () => {
  it('moves the values, sends the reviewed build back to review, notifies the PI and is audited', async () => {
    const code = 'C-010';
    const before = await detail(code);
    const repeat = before.curves.find((c) => c.label === 'C-010-repeat.csv')!;
    const mails = mailTo(PI).length;
    const mark = lastAuditId();

    const res = await h.as.researcher.put(`/api/builds/${ids.build(code)}/record`, { kind: 'polarization', curveId: repeat.id }).expect(200);
    expect(res.body.record).toMatchObject({ kind: 'polarization', fromCurveId: before.build.recordCurveIds.polarization, toCurveId: repeat.id, changed: true, status: { from: 'reviewed', to: 'tested' } });
    expect(res.body.record.message).toContain('back to review');
    expect(res.body.build.status).toBe('tested');
    expect(res.body.build.values.vAtRef).toBeCloseTo(0.7, 9); // the chosen file's 0.2 A/cm² row
    expect(res.body.curves.filter((c: { isRecord: boolean; kind: string }) => c.isRecord && c.kind === 'polarization').map((c: { id: number }) => c.id)).toEqual([repeat.id]);

    expect((await listed(code)).values.vAtRef).toBeCloseTo(0.7, 9);
    const home = (await h.as.pi.get('/api/home').expect(200)).body;
    expect(home.projects.find((p: { id: number }) => p.id === ids.project('C')).best).toMatchObject({ code, vAtRef: expect.closeTo(0.7, 9) });
    expect(home.awaitingReview.map((b: { code: string }) => b.code)).toContain(code);

    const inbox = mailTo(PI);
    expect(inbox.length).toBe(mails + 1);
    expect(inbox.at(-1)!.subject).toContain(`${code}: curve of record changed`);
    expect(inbox.at(-1)!.text).toContain('C-010-repeat.csv');
    expect(inbox.at(-1)!.text).toContain(`/projects/${ids.project('C')}/builds/${ids.build(code)}`);

    const record = auditOf('record', 'curve', mark);
    expect(record).toHaveLength(1);
    expect(record[0]!.userId).toBe(ids.user('researcher@demo.cellwright.test'));
    expect(JSON.parse(record[0]!.before)).toMatchObject({ kind: 'polarization', curveId: before.build.recordCurveIds.polarization });
    expect(JSON.parse(record[0]!.after)).toMatchObject({ kind: 'polarization', curveId: repeat.id, cause: 'chosen' });
    const status = auditOf('update', 'build', mark);
    expect(status.map((s) => [JSON.parse(s.before).status, JSON.parse(s.after).status])).toEqual([['reviewed', 'tested']]);

    const trail = await h.as.viewer.get(`/api/builds/${ids.build(code)}/audit`).expect(200);
    expect(trail.body.entries.some((e: { summary: string }) => e.summary === 'made “C-010-repeat.csv” the polarization curve of record')).toBe(true);
  });

  it('choosing the curve that already is the record changes nothing and is not a write', async () => {
    const d = await detail('C-010');
    const mark = lastAuditId();
    const res = await h.as.pi.put(`/api/builds/${ids.build('C-010')}/record`, { curveId: d.build.recordCurveIds.polarization }).expect(200);
    expect(res.body.record).toMatchObject({ changed: false, status: null });
    expect(lastAuditId()).toBe(mark);
  });

  it('a PI on the daily digest gets the notice in the digest instead', async () => {
    await h.as.pi.put(`/api/projects/${ids.project('C')}/notify`, { notify: true, digest: true }).expect(200);
    const code = 'C-004'; // demo data: reviewed
    const up = await h.as.researcher.upload(`/api/builds/${ids.build(code)}/curves`, { name: 'C-004-repeat.csv', content: BETTER }).expect(201);
    const mails = mailTo(PI).length;
    await h.as.researcher.put(`/api/builds/${ids.build(code)}/record`, { curveId: up.body.curve.id }).expect(200);
    expect(mailTo(PI).length).toBe(mails);
    const waiting = h.ctx.db.$client.prepare('select subject from pending_notices where user_id = ? and sent_at is null').all(ids.user(PI)) as { subject: string }[];
    expect(waiting.map((w) => w.subject)).toContain(`${code}: curve of record changed — back to review (PGM-free cathode for 180 °C stacks)`);
    await h.as.pi.put(`/api/projects/${ids.project('C')}/notify`, { notify: true, digest: false }).expect(200);
  });

  it('a PI who turned notices off gets none', async () => {
    await h.as.pi.put(`/api/projects/${ids.project('C')}/notify`, { notify: false }).expect(200);
    const code = 'C-006'; // demo data: reviewed
    const up = await h.as.researcher.upload(`/api/builds/${ids.build(code)}/curves`, { name: 'C-006-repeat.csv', content: BETTER }).expect(201);
    const mails = mailTo(PI).length;
    const pending = () => (h.ctx.db.$client.prepare('select count(*) as n from pending_notices where user_id = ?').get(ids.user(PI)) as { n: number }).n;
    const waiting = pending();
    const res = await h.as.researcher.put(`/api/builds/${ids.build(code)}/record`, { curveId: up.body.curve.id }).expect(200);
    expect(res.body.record.status).toEqual({ from: 'reviewed', to: 'tested' });
    expect(mailTo(PI).length).toBe(mails);
    expect(pending()).toBe(waiting);
    await h.as.pi.put(`/api/projects/${ids.project('C')}/notify`, { notify: true, digest: false }).expect(200);
  });

  it('the acting PI is not told of their own choice', async () => {
    const code = 'C-009'; // demo data: tested; the PI reviews it first
    await h.as.pi.post(`/api/builds/${ids.build(code)}/verdict`, { verdict: 'approved', body: 'Fine.' }).expect(201);
    const up = await h.as.researcher.upload(`/api/builds/${ids.build(code)}/curves`, { name: 'C-009-repeat.csv', content: BETTER }).expect(201);
    const mails = mailTo(PI).length;
    const res = await h.as.pi.put(`/api/builds/${ids.build(code)}/record`, { curveId: up.body.curve.id }).expect(200);
    expect(res.body.record.status).toEqual({ from: 'reviewed', to: 'tested' });
    expect(mailTo(PI).length).toBe(mails);
  });

  it('refuses a curve of another build, a wrong kind and a bad body with a 400 naming the field', async () => {
    const other = await detail('C-001');
    const wrongBuild = await h.as.pi.put(`/api/builds/${ids.build('C-010')}/record`, { curveId: other.build.recordCurveIds.polarization });
    expect(wrongBuild.status).toBe(400);
    expect(wrongBuild.body.error.message).toContain('curveId');
    expect(wrongBuild.body.error.message).toContain('C-010');
    const wrongKind = await h.as.pi.put(`/api/builds/${ids.build('C-001')}/record`, { kind: 'polarization', curveId: other.build.recordCurveIds.durability });
    expect(wrongKind.status).toBe(400);
    expect(wrongKind.body.error.details.fields[0].path).toBe('kind');
    const bad = await h.as.pi.put(`/api/builds/${ids.build('C-001')}/record`, { curveId: 'x' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.fields[0].path).toBe('curveId');
    expect((await detail('C-001')).build.recordCurveIds).toEqual(other.build.recordCurveIds);
  });

  it('partners choose for their own lab’s builds only; viewers never', async () => {
    const up = await h.as.partner.upload(`/api/builds/${ids.build('C-015')}/curves`, { name: 'kestrel-second.csv', content: BETTER }).expect(201);
    expect((await h.as.viewer.put(`/api/builds/${ids.build('C-015')}/record`, { curveId: up.body.curve.id })).status).toBe(403);
    const ok = await h.as.partner.put(`/api/builds/${ids.build('C-015')}/record`, { curveId: up.body.curve.id }).expect(200);
    expect(ok.body.record.changed).toBe(true);
    expect(ok.body.record.status).toBeNull(); // C-015 was tested, not reviewed
  });
});

describe('deleting the curve of record', () => {
  it('hands the record to the oldest remaining curve, says so, audits it and reopens review', async () => {
    const code = 'C-007'; // demo data: reviewed, one polarization curve and a durability log
    const first = await h.as.researcher.upload(`/api/builds/${ids.build(code)}/curves`, { name: 'C-007-second.csv', content: BETTER }).expect(201);
    const third = await h.as.researcher.upload(`/api/builds/${ids.build(code)}/curves`, { name: 'C-007-third.csv', content: BETTER.replace('0.700', '0.690') }).expect(201);
    const before = await detail(code);
    expect(before.build.status).toBe('reviewed');
    const mark = lastAuditId();
    const res = await h.as.pi.delete(`/api/curves/${before.build.recordCurveIds.polarization}`).expect(200);
    expect(res.body.record).toMatchObject({ kind: 'polarization', fromCurveId: before.build.recordCurveIds.polarization, toCurveId: first.body.curve.id, status: { from: 'reviewed', to: 'tested' } });
    expect(res.body.record.message).toContain('“C-007-second.csv”');
    const after = await detail(code);
    expect(after.build.recordCurveIds.polarization).toBe(first.body.curve.id);
    expect(after.build.recordCurveIds.durability).toBe(before.build.recordCurveIds.durability);
    expect(after.build.values.vAtRef).toBeCloseTo(0.7, 9); // C-007-second.csv's 0.2 A/cm² row
    expect(auditOf('delete', 'curve', mark)).toHaveLength(1);
    expect(JSON.parse(auditOf('record', 'curve', mark)[0]!.after)).toMatchObject({ curveId: first.body.curve.id, cause: 'deleted' });
    // removing a curve that is not the record changes no value
    const quiet = await h.as.pi.delete(`/api/curves/${third.body.curve.id}`).expect(200);
    expect(quiet.body.record).toBeNull();
    expect((await detail(code)).build.values.vAtRef).toBeCloseTo(0.7, 9);
  });

  it('the last curve of a kind removed: no record of that kind, the values go empty', async () => {
    const made = await h.as.researcher.post(`/api/projects/${ids.project('C')}/builds`, { status: 'built', factors: { binder: 25, activationTemp: 340, activationTime: 2, gdl: 'woven carbon', cellTemp: 160 }, loadingMgCm2: 3, areaCm2: 25 }).expect(201);
    const up = await h.as.researcher.upload(`/api/builds/${made.body.build.id}/curves`, { name: 'only.csv', content: BETTER }).expect(201);
    expect(up.body.curve.isRecord).toBe(true); // the first curve of a kind becomes the record
    expect(up.body.recordCurve.id).toBe(up.body.curve.id);
    const res = await h.as.pi.delete(`/api/curves/${up.body.curve.id}`).expect(200);
    expect(res.body.record).toMatchObject({ toCurveId: null });
    const after = await h.as.pi.get(`/api/builds/${made.body.build.id}`).expect(200);
    expect(after.body.build.recordCurveIds).toEqual({});
    expect(after.body.build.values.vAtRef).toBeUndefined();
  });
});

describe('durability comparison', () => {
  it('marks each build’s durability log of record', async () => {
    const res = await h.as.viewer.get(`/api/projects/${ids.project('C')}/durability`).expect(200);
    const rows = res.body.curves as { buildId: number; kind: string; isRecord: boolean }[];
    expect(rows.length).toBeGreaterThan(0);
    for (const buildId of new Set(rows.map((r) => r.buildId))) {
      expect(rows.filter((r) => r.buildId === buildId && r.kind === 'durability' && r.isRecord)).toHaveLength(1);
    }
  });
});

describe('the migration for existing databases', () => {
  it('makes the curve that gives today’s value the record: latest polarization at the current reference point, latest log of each kind', () => {
    const folder = path.resolve(__dirname, '../../drizzle');
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-migrate-'));
    try {
      // the migrations before this one, as an existing database has them
      const journal = JSON.parse(fs.readFileSync(path.join(folder, 'meta/_journal.json'), 'utf8')) as { entries: { tag: string }[] };
      const mine = journal.entries.findIndex((e) => e.tag.endsWith('curve-of-record'));
      expect(mine).toBeGreaterThan(0);
      const older = path.join(dir, 'older');
      fs.mkdirSync(path.join(older, 'meta'), { recursive: true });
      for (const e of journal.entries.slice(0, mine)) fs.copyFileSync(path.join(folder, `${e.tag}.sql`), path.join(older, `${e.tag}.sql`));
      fs.writeFileSync(path.join(older, 'meta/_journal.json'), JSON.stringify({ ...journal, entries: journal.entries.slice(0, mine) }));
      const sqlite = new Database(path.join(dir, 'db.sqlite'));
      const db = drizzle(sqlite);
      migrate(db, { migrationsFolder: older });

      sqlite.prepare(`insert into projects (id, name, settings, metrics_version) values (1, 'Invented', '{}', 2)`).run();
      for (const b of [1, 2, 3, 4]) sqlite.prepare(`insert into builds (id, project_id, code, factor_values, test_conditions, response_values) values (?, 1, ?, '{}', '{}', '{}')`).run(b, `X-00${b}`);
      const curve = sqlite.prepare(`insert into curves (id, build_id, kind, point_count, points, metrics, metric_notes, method, summary, metrics_version) values (?, ?, ?, 0, x'', '{}', '{}', '{}', '{}', ?)`);
      // [id, build, kind, metrics version]
      const rows: [number, number, string, number][] = [
        [1, 1, 'polarization', 1], [2, 1, 'polarization', 2], [3, 1, 'polarization', 1], // build 1: curve 2 is the one read today
        [4, 2, 'polarization', 1], [5, 2, 'polarization', 1], // build 2: none at the current version: the latest
        [6, 3, 'durability', 1], [7, 3, 'durability', 1], [8, 3, 'hold', 1], [9, 3, 'polarization', 2],
        [10, 4, 'polarization', 2], [11, 4, 'polarization', 2],
      ];
      for (const r of rows) curve.run(...r);

      migrate(db, { migrationsFolder: folder });
      const records = (sqlite.prepare('select id from curves where is_record = 1 order by id').all() as { id: number }[]).map((r) => r.id);
      expect(records).toEqual([2, 5, 7, 8, 9, 11]);
      expect(() => sqlite.prepare('update curves set is_record = 1 where id = 1').run()).toThrow(/UNIQUE/); // one record per build and kind
      sqlite.close();
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});
