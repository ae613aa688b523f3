// The review loop through the API: comments and verdicts by role, the status move to reviewed,
// the home lists, the per-build audit trail, and the notices in the outbox.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHarness, demoIds, type Harness } from './harness';

const CSV = 'Current density (A/cm2),Voltage (V),HFR (Ohm cm2)\n0,0.98,0.12\n0.05,0.74,0.12\n0.1,0.69,0.12\n0.2,0.62,0.12\n0.3,0.57,0.12\n0.4,0.52,0.12\n';
const PI = 'pi@demo.cellwright.test';
const RESEARCHER = 'researcher@demo.cellwright.test';

let h: Harness;
let ids: ReturnType<typeof demoIds>;

function mailTo(email: string): { subject: string; text: string }[] {
  return h.ctx.db.$client.prepare('select subject, text from outbox where "to" = ? order by id').all(email) as { subject: string; text: string }[];
}

/** Notices sent without awaiting (status changes) land a moment after the response. */
async function waitForMail(email: string, count: number) {
  for (let i = 0; i < 50 && mailTo(email).length < count; i++) await new Promise((r) => setTimeout(r, 20));
  return mailTo(email);
}

beforeAll(async () => {
  h = await createHarness();
  ids = demoIds(h.ctx);
});
afterAll(() => h.close());

describe('comments and verdicts', () => {
  it('lets PIs, researchers and partners comment, and refuses viewers', async () => {
    const build = ids.build('C-009');
    await h.as.pi.post(`/api/builds/${build}/reviews`, { body: 'HFR looks high for paper.' }).expect(201);
    await h.as.researcher.post(`/api/builds/${build}/reviews`, { body: 'Paper was compressed more.' }).expect(201);
    await h.as.partner.post(`/api/builds/${build}/reviews`, { body: 'We saw the same at our lab.' }).expect(201);
    const viewer = await h.as.viewer.post(`/api/builds/${build}/reviews`, { body: 'me too' }).expect(403);
    expect(viewer.body.error.code).toBe('forbidden');
    const empty = await h.as.pi.post(`/api/builds/${build}/reviews`, { body: '   ' }).expect(400);
    expect(empty.body.error.details.fields[0].path).toBe('body');
    const thread = await h.as.viewer.get(`/api/builds/${build}/reviews`).expect(200);
    expect(thread.body.reviews.map((r: { body: string }) => r.body)).toEqual(['HFR looks high for paper.', 'Paper was compressed more.', 'We saw the same at our lab.']);
    expect(thread.body.permissions).toEqual({ comment: false, review: false }); // viewer
  });

  it('keeps verdicts to PIs: partners and researchers are refused', async () => {
    const build = ids.build('C-014');
    await h.as.partner.post(`/api/builds/${build}/verdict`, { verdict: 'approved', body: 'fine' }).expect(403);
    await h.as.researcher.post(`/api/builds/${build}/verdict`, { verdict: 'approved', body: 'fine' }).expect(403);
    await h.as.pi.post(`/api/builds/${build}/verdict`, { verdict: 'maybe', body: 'fine' }).expect(400);
    await h.as.pi.post(`/api/builds/${build}/verdict`, { verdict: 'approved' }).expect(400);
    const planned = await h.as.pi.post(`/api/builds/${ids.build('C-021')}/verdict`, { verdict: 'approved', body: 'not yet made' }).expect(409);
    expect(planned.body.error.message).toContain('planned');
  });

  it('a PI’s approval moves the build to reviewed and leaves the waiting list', async () => {
    const build = ids.build('C-009');
    const before = await h.as.pi.get('/api/home').expect(200);
    expect(before.body.awaitingReview.map((b: { code: string }) => b.code)).toContain('C-009');
    const res = await h.as.pi.post(`/api/builds/${build}/verdict`, { verdict: 'approved', body: 'Consistent with the HFR rise; keep woven carbon.' }).expect(201);
    expect(res.body.status).toBe('reviewed');
    expect(res.body.review.verdict).toBe('approved');
    const read = await h.as.viewer.get(`/api/builds/${build}`).expect(200);
    expect(read.body.build.status).toBe('reviewed');
    const after = await h.as.pi.get('/api/home').expect(200);
    expect(after.body.awaitingReview.map((b: { code: string }) => b.code)).not.toContain('C-009');
    // the same verdict clicked twice by the same PI, with no new curve of record: refused, nothing stored
    const threadBefore = await h.as.pi.get(`/api/builds/${build}/reviews`);
    const again = await h.as.pi.post(`/api/builds/${build}/verdict`, { verdict: 'approved', body: 'Consistent with the HFR rise; keep woven carbon.' }).expect(409);
    expect(again.body.error.message).toMatch(/C-009 was already approved/);
    const threadAfter = await h.as.pi.get(`/api/builds/${build}/reviews`);
    expect(threadAfter.body).toEqual(threadBefore.body);
    // only PIs have a waiting list
    const researcherHome = await h.as.researcher.get('/api/home').expect(200);
    expect(researcherHome.body.awaitingReview).toEqual([]);
  });

  it('"needs work" lands on the author’s home and in the author’s mail', async () => {
    const build = ids.build('C-012'); // demo data: made by the researcher
    const mails = mailTo(RESEARCHER).length;
    await h.as.pi.post(`/api/builds/${build}/verdict`, { verdict: 'needs-work', body: 'Repeat at 35 wt % before concluding.' }).expect(201);
    const home = await h.as.researcher.get('/api/home').expect(200);
    const item = home.body.needsWork.find((b: { code: string }) => b.code === 'C-012');
    expect(item).toMatchObject({ buildId: build, projectId: ids.project('C'), comment: 'Repeat at 35 wt % before concluding.' });
    const inbox = mailTo(RESEARCHER);
    expect(inbox.length).toBe(mails + 1);
    expect(inbox.at(-1)!.subject).toContain('C-012 needs work');
    expect(inbox.at(-1)!.text).toContain(`http://cellwright.test/projects/${ids.project('C')}/builds/${build}`);
    // a later approval clears it
    await h.as.pi.post(`/api/builds/${build}/verdict`, { verdict: 'approved', body: 'Repeat agrees.' }).expect(201);
    const later = await h.as.researcher.get('/api/home').expect(200);
    expect(later.body.needsWork.map((b: { code: string }) => b.code)).not.toContain('C-012');
  });

  it('shows the build’s audit trail: who changed what, when', async () => {
    const res = await h.as.viewer.get(`/api/builds/${ids.build('C-009')}/audit`).expect(200);
    const entries = res.body.entries as { action: string; entity: string; userName: string; summary: string; changes: { field: string; from: unknown; to: unknown }[] }[];
    const verdict = entries.find((e) => e.action === 'verdict')!;
    expect(verdict.userName).toBe('Dr. Tobias Renwick'); // demo data: the PI
    expect(verdict.summary).toContain('approved');
    const status = entries.find((e) => e.entity === 'build' && e.action === 'update')!;
    expect(status.changes).toEqual([{ field: 'status', from: 'tested', to: 'reviewed' }]);
    expect(entries.some((e) => e.entity === 'curve' && e.action === 'upload')).toBe(true); // the seeded curve upload
    expect(entries.filter((e) => e.action === 'comment').length).toBe(3);
  });
});

describe('notices to PIs', () => {
  it('a partner upload e-mails the PI with a link to the build', async () => {
    const before = mailTo(PI).length;
    await h.as.partner.upload(`/api/builds/${ids.build('C-015')}/curves`, { name: 'kestrel-run.csv', content: CSV }).expect(201);
    const inbox = mailTo(PI);
    expect(inbox.length).toBe(before + 1);
    expect(inbox.at(-1)!.subject).toContain('C-015');
    expect(inbox.at(-1)!.text).toContain('kestrel-run.csv');
    expect(inbox.at(-1)!.text).toContain(`/projects/${ids.project('C')}/builds/${ids.build('C-015')}`);
  });

  it('a build reaching tested (by upload or by hand) e-mails the PI; the uploader is not told of their own work', async () => {
    const created = await h.as.researcher.post(`/api/projects/${ids.project('C')}/builds`, { status: 'built', factors: { binder: 30, activationTemp: 350, activationTime: 3, gdl: 'woven carbon', cellTemp: 185 }, parentId: ids.build('C-010'), changeNote: 'cell at 185 °C' }).expect(201);
    const before = mailTo(PI).length;
    await h.as.researcher.upload(`/api/builds/${created.body.build.id}/curves`, { name: 'run.csv', content: CSV }).expect(201);
    const inbox = mailTo(PI);
    expect(inbox.length).toBe(before + 1);
    expect(inbox.at(-1)!.subject).toContain('ready for review');

    const manual = await h.as.researcher.post(`/api/projects/${ids.project('C')}/builds`, { status: 'built', factors: { binder: 30, activationTemp: 350, activationTime: 3, gdl: 'woven carbon', cellTemp: 190 } }).expect(201);
    await h.as.researcher.patch(`/api/builds/${manual.body.build.id}`, { status: 'tested' }).expect(200);
    const afterManual = await waitForMail(PI, before + 2);
    expect(afterManual.at(-1)!.subject).toContain(`${manual.body.build.code} is tested`);

    const own = mailTo(PI).length;
    await h.as.pi.upload(`/api/builds/${ids.build('C-016')}/curves`, { name: 'pi-run.csv', content: CSV }).expect(201);
    expect(mailTo(PI).length).toBe(own); // C-016 was already tested and the PI uploaded it
  });

  it('someone who turned notices off for the project gets none', async () => {
    await h.as.pi.put(`/api/projects/${ids.project('C')}/notify`, { notify: false }).expect(200);
    const before = mailTo(PI).length;
    await h.as.partner.upload(`/api/builds/${ids.build('C-015')}/curves`, { name: 'again.csv', content: CSV }).expect(201);
    expect(mailTo(PI).length).toBe(before);
    await h.as.pi.put(`/api/projects/${ids.project('C')}/notify`, { notify: true }).expect(200);
  });

  it('a daily digest collects the notices into one e-mail instead of one each', async () => {
    await h.as.pi.put(`/api/projects/${ids.project('C')}/notify`, { notify: true, digest: true }).expect(200);
    const before = mailTo(PI).length;
    await h.as.partner.upload(`/api/builds/${ids.build('C-015')}/curves`, { name: 'digest-1.csv', content: CSV }).expect(201);
    await h.as.partner.upload(`/api/builds/${ids.build('C-016')}/curves`, { name: 'digest-2.csv', content: CSV }).expect(201);
    expect(mailTo(PI).length).toBe(before); // nothing sent yet: kept for the digest
    const run = await h.as.admin.post('/api/admin/digests/send').expect(200);
    expect(run.body.sent).toBeGreaterThanOrEqual(1);
    const inbox = mailTo(PI);
    expect(inbox.length).toBe(before + 1);
    expect(inbox.at(-1)!.subject).toBe('Cellwright daily digest: 2 notices');
    expect(inbox.at(-1)!.text).toContain('digest-1.csv');
    expect(inbox.at(-1)!.text).toContain('digest-2.csv');
    const again = await h.as.admin.post('/api/admin/digests/send').expect(200);
    expect(mailTo(PI).length).toBe(before + 1); // each notice goes out once
    expect(again.body.sent).toBe(0);
    await h.as.pi.put(`/api/projects/${ids.project('C')}/notify`, { notify: true, digest: false }).expect(200);
  });

  it('refuses the same verdict twice by accident (409), allows it on purpose, and names the next build waiting', async () => {
    const build = ids.build('C-016');
    const home = (await h.as.pi.get('/api/home').expect(200)).body.awaitingReview as { code: string; waitingDays: number | null; vAtRef: number | null; parentCode: string | null; changeFromParent: number | null }[];
    const item = home.find((b) => b.code === 'C-016')!;
    expect(item.waitingDays).toEqual(expect.any(Number));
    if (item.vAtRef != null && item.changeFromParent != null) {
      const parent = (await h.as.pi.get(`/api/builds/${ids.build(item.parentCode!)}`)).body.build.values.vAtRef;
      expect(item.changeFromParent).toBeCloseTo(item.vAtRef - parent, 12); // the difference of the two values of record (derived by hand)
    }
    const first = await h.as.pi.post(`/api/builds/${build}/verdict`, { verdict: 'approved', body: 'Looks right.' }).expect(201);
    expect(first.body.nextWaiting === null || first.body.nextWaiting.buildId !== build).toBe(true);
    if (first.body.nextWaiting) expect(home.map((b) => b.code)).toContain(first.body.nextWaiting.code);
    const twice = await h.as.pi.post(`/api/builds/${build}/verdict`, { verdict: 'approved', body: 'Looks right.' }).expect(409);
    expect(twice.body.error.code).toBe('verdict-already-given');
    expect(twice.body.error.message).toContain('C-016 was already approved by Dr. Tobias Renwick');
    await h.as.pi.post(`/api/builds/${build}/verdict`, { verdict: 'approved', body: 'Confirmed after the meeting.', repeat: true }).expect(201);
    await h.as.pi.post(`/api/builds/${build}/verdict`, { verdict: 'needs-work', body: 'On second thought: repeat it.' }).expect(201); // a change of mind is not a double click
  });
});

describe('a partner’s home', () => {
  it('lists the planned builds of its own lab with what each still needs, and its own uploads with their review status', async () => {
    const made = await h.as.partner.post(`/api/projects/${ids.project('C')}/builds`, { status: 'planned', factors: {}, changeNote: 'repeat at 200 °C for the round robin' }).expect(201);
    const home = (await h.as.partner.get('/api/home').expect(200)).body;
    const waiting = home.waitingForData.find((b: { buildId: number }) => b.buildId === made.body.build.id);
    expect(waiting).toMatchObject({ code: made.body.build.code, status: 'planned', changeNote: 'repeat at 200 °C for the round robin' });
    expect(waiting.needs[0]).toBe('a polarization curve');
    for (const u of home.recentUploads) {
      expect(u.uploadedBy).toBe('Jun Adebayo-Lind'); // demo data: the partner's own uploads only
      expect(['planned', 'built', 'tested', 'reviewed', 'discarded']).toContain(u.buildStatus);
    }
    // the home lab's people see no such list
    expect((await h.as.researcher.get('/api/home').expect(200)).body.waitingForData).toEqual([]);
  });
});
