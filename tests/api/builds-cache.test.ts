// The builds list is served from a cache of its JSON; the cache follows the database's own data
// version, so every write invalidates it — also one that writes no audit entry, or goes round
// the services entirely.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { createHarness, demoIds, type Harness } from './harness';
import { builds } from '../../server/db/schema';
import { dataVersion } from '../../server/db/data-version';

let h: Harness;
let ids: ReturnType<typeof demoIds>;
beforeAll(async () => {
  h = await createHarness();
  ids = demoIds(h.ctx);
});
afterAll(() => h.close());

const noteOf = async (code: string) => {
  const res = await h.as.viewer.get(`/api/projects/${ids.project('C')}/builds`);
  expect(res.status).toBe(200);
  return (res.body.builds as { code: string; changeNote: string | null }[]).find((b) => b.code === code)!.changeNote;
};

describe('builds list cache', () => {
  it('answers the same text twice while nothing changes', async () => {
    const first = await h.as.viewer.get(`/api/projects/${ids.project('C')}/builds`);
    const version = dataVersion(h.ctx.db);
    const second = await h.as.viewer.get(`/api/projects/${ids.project('C')}/builds`);
    expect(second.text).toBe(first.text);
    expect(dataVersion(h.ctx.db)).toBe(version); // a read moves nothing
  });

  it('shows a write that wrote no audit entry, made straight through Drizzle', async () => {
    const before = await noteOf('C-004');
    const audits = (h.ctx.db.$client.prepare('select count(*) as n from audit_log').get() as { n: number }).n;
    h.ctx.db.update(builds).set({ changeNote: 'written without an audit entry' }).where(eq(builds.id, ids.build('C-004'))).run();
    expect((h.ctx.db.$client.prepare('select count(*) as n from audit_log').get() as { n: number }).n).toBe(audits);
    expect(await noteOf('C-004')).toBe('written without an audit entry');
    expect(before).not.toBe('written without an audit entry');
  });

  it('shows a raw SQL write too', async () => {
    await noteOf('C-006'); // cached now
    h.ctx.db.$client.prepare('update builds set change_note = ? where code = ?').run('raw write', 'C-006');
    expect(await noteOf('C-006')).toBe('raw write');
  });

  it('shows a change made through the API at once', async () => {
    await noteOf('C-007');
    const res = await h.as.pi.patch(`/api/builds/${ids.build('C-007')}`, { changeNote: 'edited through the API' });
    expect(res.status).toBe(200);
    expect(await noteOf('C-007')).toBe('edited through the API');
  });
});

describe('compressed answers', () => {
  it('sends a raw uploaded file as stored, never re-encoded', async () => {
    const build = await h.as.viewer.get(`/api/builds/${ids.build('C-004')}`);
    const fileId = (build.body.curves as { fileId: number }[])[0]!.fileId;
    const raw = await h.as.viewer.get(`/api/files/${fileId}/raw`).set('accept-encoding', 'gzip');
    expect(raw.status).toBe(200);
    expect(raw.headers['content-encoding']).toBeUndefined();
  });

  it('gzips a JSON list for a client that accepts it, and the text is the same', async () => {
    const plain = await h.as.viewer.get(`/api/projects/${ids.project('C')}/builds`).set('Accept-Encoding', 'identity');
    const zipped = await h.as.viewer.get(`/api/projects/${ids.project('C')}/builds`).set('Accept-Encoding', 'gzip');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(zipped.headers['content-encoding']).toBe('gzip');
    expect(zipped.headers.vary).toMatch(/Accept-Encoding/i);
    // supertest inflates the body: the list arrives whole
    expect(zipped.text).toBe(plain.text);
  });

  it('leaves a small answer as it is (below the 1 kB threshold)', async () => {
    const res = await h.anonymous.get('/api/health').set('Accept-Encoding', 'gzip');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBeUndefined();
  });
});

describe('the list a page at a time', () => {
  it('answers one page with how many builds the whole list holds', async () => {
    const whole = await h.as.viewer.get(`/api/projects/${ids.project('C')}/builds`);
    const n = whole.body.builds.length;
    expect(whole.body.total).toBe(n);
    const page = await h.as.viewer.get(`/api/projects/${ids.project('C')}/builds?limit=5&offset=5`);
    expect(page.body.builds.map((b: { id: number }) => b.id)).toEqual(whole.body.builds.slice(5, 10).map((b: { id: number }) => b.id));
    expect(page.body.total).toBe(n);
    const planned = await h.as.viewer.get(`/api/projects/${ids.project('C')}/builds?status=planned&limit=1`);
    expect(planned.body.total).toBe(whole.body.builds.filter((b: { status: string }) => b.status === 'planned').length);
  });

  it('answers the brief view for pickers: the same builds with only what a picker shows, far fewer bytes', async () => {
    const whole = await h.as.viewer.get(`/api/projects/${ids.project('C')}/builds`);
    const brief = await h.as.viewer.get(`/api/projects/${ids.project('C')}/builds?view=brief`);
    expect(brief.status).toBe(200);
    expect(brief.body.total).toBe(whole.body.total);
    expect(brief.body.builds.map((b: { id: number }) => b.id)).toEqual(whole.body.builds.map((b: { id: number }) => b.id));
    for (const [i, b] of (brief.body.builds as Record<string, unknown>[]).entries()) {
      expect(Object.keys(b).sort()).toEqual(['changeNote', 'code', 'curveCount', 'id', 'labId', 'parentId', 'recordCurveIds', 'status']);
      const full = whole.body.builds[i];
      expect(b).toEqual({ id: full.id, code: full.code, changeNote: full.changeNote, status: full.status, labId: full.labId, parentId: full.parentId, curveCount: full.curveCount, recordCurveIds: full.recordCurveIds });
    }
    expect(JSON.stringify(brief.body).length * 4).toBeLessThan(JSON.stringify(whole.body).length);
    const bad = await h.as.viewer.get(`/api/projects/${ids.project('C')}/builds?view=everything`);
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body.error)).toMatch(/view/);
  });
});
