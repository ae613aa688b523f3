// Import profiles cannot hijack a lab's uploads: only complete profiles are saved or applied,
// only a lab's members and the project's PIs may save one for the lab, and a profile that does
// not fit a file falls back to detection and says so.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHarness, demoIds, type Harness } from './harness';

// a plain polarization curve from the semi-empirical fixture shape: headers state their units
const CSV = 'Current density (A/cm2),Voltage (V),HFR (Ohm cm2)\n0,0.98,0.12\n0.05,0.74,0.12\n0.1,0.69,0.12\n0.2,0.62,0.12\n0.3,0.57,0.12\n0.4,0.52,0.12\n';
const COMPLETE = { current: { header: 'Current density (A/cm2)', unit: 'A/cm2' }, voltage: { header: 'Voltage (V)', unit: 'V' } };

let h: Harness;
let ids: ReturnType<typeof demoIds>;
let project: number;
let kestrel: number;
let northgate: number;

beforeAll(async () => {
  h = await createHarness();
  ids = demoIds(h.ctx);
  project = ids.project('C');
  kestrel = ids.lab('Kestrel');
  northgate = ids.lab('Northgate');
});
afterAll(() => h.close());

const save = (who: 'pi' | 'researcher' | 'partner' | 'admin', body: object) => h.as[who].post(`/api/projects/${project}/import-profiles`, body);
const profileCount = () => (h.ctx.db.$client.prepare('select count(*) as n from import_profiles').get() as { n: number }).n;

describe('who may save a profile for a lab', () => {
  it('a researcher may save one for their own lab, not for a partner lab', async () => {
    expect((await save('researcher', { name: 'Northgate station', labId: northgate, mapping: COMPLETE })).status).toBe(201);
    const refused = await save('researcher', { name: 'Kestrel takeover', labId: kestrel, mapping: COMPLETE });
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toMatch(/own lab|PI/);
  });

  it('a partner saves for its own lab whatever it asks; another lab is refused', async () => {
    const own = await save('partner', { name: 'Kestrel station', mapping: COMPLETE });
    expect(own.status).toBe(201);
    expect(own.body.profile.labId).toBe(kestrel);
    expect((await save('partner', { name: 'Northgate takeover', labId: northgate, mapping: COMPLETE })).status).toBe(403);
  });

  it('the project’s PI (and an admin) may save for any lab, or for builds without a lab', async () => {
    expect((await save('pi', { name: 'PI for Kestrel', labId: kestrel, mapping: COMPLETE })).status).toBe(201);
    expect((await save('pi', { name: 'PI, no lab', labId: null, mapping: COMPLETE })).status).toBe(201);
    expect((await save('admin', { name: 'Admin for Kestrel', labId: kestrel, mapping: COMPLETE })).status).toBe(201);
    expect((await save('researcher', { name: 'Researcher, no lab', labId: null, mapping: COMPLETE })).status).toBe(403);
  });

  it('removing a profile follows the same rule', async () => {
    const pis = await save('pi', { name: 'PI-made Kestrel profile', labId: kestrel, mapping: COMPLETE });
    expect((await h.as.researcher.delete(`/api/import-profiles/${pis.body.profile.id}`)).status).toBe(403);
    expect((await h.as.partner.delete(`/api/import-profiles/${pis.body.profile.id}`)).status).toBe(200);
  });
});

describe('only complete profiles are saved', () => {
  it('a polarization profile without a current column is a 400 naming what is missing; nothing is saved', async () => {
    const before = profileCount();
    const res = await save('partner', { name: 'Voltage only', mapping: { voltage: { header: 'Voltage (V)', unit: 'V' } } });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/current/);
    expect(profileCount()).toBe(before);
  });

  it('a durability profile needs the time column too', async () => {
    const res = await save('partner', { name: 'No time', kind: 'durability', mapping: { voltage: { header: 'Voltage (V)', unit: 'V' }, current: { header: 'j', unit: 'A/cm2' } } });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/time/);
  });

  it('an upload that asks to save an incomplete mapping as a profile is refused before anything is stored', async () => {
    const curves = (h.ctx.db.$client.prepare('select count(*) as n from curves').get() as { n: number }).n;
    const res = await h.as.partner.upload(`/api/builds/${ids.build('C-014')}/curves`, { name: 'dur.csv', content: 'Voltage (V),Current density (A/cm2)\n0.65,0.2\n0.64,0.2\n0.64,0.2\n' }, { kind: 'hold', mapping: JSON.stringify({ voltage: { column: 0, unit: 'V' } }), saveProfileAs: 'hold without time' });
    expect(res.status, JSON.stringify(res.body)).toBeGreaterThanOrEqual(400);
    expect(res.status).toBeLessThan(500);
    expect((h.ctx.db.$client.prepare('select count(*) as n from curves').get() as { n: number }).n).toBe(curves);
    expect(h.ctx.db.$client.prepare("select count(*) as n from import_profiles where name = 'hold without time'").get()).toEqual({ n: 0 });
  });

  it('a researcher cannot save a profile for a partner lab through an upload either', async () => {
    const res = await h.as.researcher.upload(`/api/builds/${ids.build('C-014')}/curves`, { name: 'pol.csv', content: CSV }, { saveProfileAs: 'sneaky' });
    expect(res.status).toBe(403);
    expect(h.ctx.db.$client.prepare("select count(*) as n from import_profiles where name = 'sneaky'").get()).toEqual({ n: 0 });
  });
});

describe('a profile that does not fit falls back to detection and says so', () => {
  it('a partial profile stored before this rule is never applied: the lab’s valid upload is measured from detection', async () => {
    // the attack as it was: only a voltage column, in the wrong unit, for the partner lab
    h.ctx.db.$client.prepare("insert into import_profiles (lab_id, project_id, name, mapping, kind) values (?, ?, 'hijack', ?, 'polarization')").run(kestrel, project, JSON.stringify({ voltage: { header: 'Voltage (V)', unit: 'mV' } }));
    const res = await h.as.partner.upload(`/api/builds/${ids.build('C-015')}/curves`, { name: 'pol.csv', content: CSV });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.curve.metrics.vAtRef).toBeCloseTo(0.62, 6); // the file's own value at 0.2 A/cm²
    // the lab's complete profiles saved above fit, the newer partial one is passed over and named
    expect(res.body.curve.summary.mappingSource).not.toBe('profile hijack');
    expect(res.body.curve.summary.profileNote).toMatch(/"hijack" was not used: it maps no current column/);
  });

  it('a complete profile whose unit contradicts the header is not applied either', async () => {
    h.ctx.db.$client.prepare("insert into import_profiles (lab_id, project_id, name, mapping, kind) values (?, ?, 'rescaler', ?, 'polarization')").run(kestrel, project, JSON.stringify({ current: { header: 'Current density (A/cm2)', unit: 'mA/cm2' }, voltage: { header: 'Voltage (V)', unit: 'V' } }));
    const res = await h.as.partner.upload(`/api/builds/${ids.build('C-015')}/curves`, { name: 'pol.csv', content: CSV });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.curve.metrics.vAtRef).toBeCloseTo(0.62, 6);
    expect(res.body.curve.summary.profileNote).toMatch(/rescaler.*A\/cm2/);
  });

  it('a profile chosen by id that does not fit the file: detection is used and the answer says why', async () => {
    const other = await save('partner', { name: 'Other station', mapping: { current: { header: 'I (mA/cm2)', unit: 'mA/cm2' }, voltage: { header: 'E (mV)', unit: 'mV' } } });
    const res = await h.as.partner.upload(`/api/builds/${ids.build('C-015')}/curves`, { name: 'pol.csv', content: CSV }, { profileId: String(other.body.profile.id) });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.curve.summary.mappingSource).toBe('detected');
    expect(res.body.curve.summary.profileNote).toMatch(/Other station.*I \(mA\/cm2\)/);
  });

  it('a complete, fitting profile is applied', async () => {
    const fitting = await save('partner', { name: 'Kestrel plain', mapping: COMPLETE });
    const res = await h.as.partner.upload(`/api/builds/${ids.build('C-015')}/curves`, { name: 'pol.csv', content: CSV }, { profileId: String(fitting.body.profile.id) });
    expect(res.status).toBe(201);
    expect(res.body.curve.summary.mappingSource).toBe('profile Kestrel plain');
  });
});
