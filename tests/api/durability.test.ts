// Durability uploads through the API: rate with its interval from an invented log of known slope,
// break-in editing, user windows, loss fraction, restarts, plot downsampling, processing progress,
// the project comparison, and the size / row limits (a file over them stores nothing).
import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHarness, demoIds, type Harness } from './harness';
import { createContext } from '../../server/bootstrap';
import { createApp } from '../../server/app';
import { generateSyntheticLog, writeDurabilityCsv, type SyntheticLogOptions } from '../../shared/durability';

let h: Harness;
let ids: ReturnType<typeof demoIds>;

// An invented 800 h log at 10-min steps (4,801 rows): 8 µV/h after a 60 h break-in, 1 mV noise.
// 8 µV/h sits in the "improved"–"standard" span the trade reports (common practice in the trade).
const BASE: SyntheticLogOptions = { hours: 800, stepMinutes: 10, v0: 0.6, breakInHours: 60, breakInDropMv: 15, rateUvPerH: 8, noiseMv: 1, currentDensity: 0.2, seed: 7 };
const csvOf = (options: Partial<SyntheticLogOptions> = {}) => writeDurabilityCsv(generateSyntheticLog({ ...BASE, ...options }));
const count = (table: string) => (h.ctx.db.$client.prepare(`select count(*) as n from ${table}`).get() as { n: number }).n;

async function uploadLog(content: string, fields: Record<string, string> = {}) {
  const res = await h.as.researcher.upload(`/api/builds/${ids.build('C-014')}/curves`, { name: 'station-log.csv', content }, { kind: 'durability', ...fields });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.curve as { id: number; kind: string; pointCount: number; metrics: Record<string, number | null>; summary: Record<string, unknown>; options: Record<string, unknown> | null };
}

beforeAll(async () => {
  h = await createHarness();
  ids = demoIds(h.ctx);
});
afterAll(() => h.close());

describe('durability upload', () => {
  it('stores the log and reports the rate with a 95 % interval that holds the true slope', async () => {
    const curve = await uploadLog(csvOf());
    expect(curve.kind).toBe('durability');
    expect(curve.pointCount).toBe(4801); // derived by hand: 800 h × 6 rows/h + 1
    const rate = curve.metrics.degradationRate!;
    const low = Number(curve.summary.degradationLow), high = Number(curve.summary.degradationHigh);
    expect(low).toBeLessThanOrEqual(8); // 8 µV/h: the slope the invented log was made with
    expect(high).toBeGreaterThanOrEqual(8);
    expect(Math.abs(rate - 8)).toBeLessThan(1.5); // tolerance from memory: ±1.5 µV/h is wide for 1 mV noise over 700 h
    expect(curve.metrics.breakInHours).toBeGreaterThan(20); // break-in made to last 60 h (1 % of its size left by then)
    expect(curve.metrics.breakInHours).toBeLessThan(150);
    expect(curve.summary.breakInSource).toBe('detected');
    expect(Number(curve.summary.hoursRun)).toBeCloseTo(800, 3); // derived by hand: first row 0 h, last 800 h
    expect(Number(curve.summary.fitFromHours)).toBeCloseTo(curve.metrics.breakInHours!, 0);
    expect(Number(curve.summary.currentDensity)).toBeCloseTo(0.2, 2); // held at 0.2 A/cm² in the invented log
    // loss over the fit window ≈ rate × hours fitted (derived by hand: µV/h × h / 1000 = mV)
    const fitted = Number(curve.summary.fitToHours) - Number(curve.summary.fitFromHours);
    expect(Number(curve.summary.voltageLossMv)).toBeCloseTo((rate * fitted) / 1000, 0);
  });

  it('reads time in minutes and seconds the same as hours', async () => {
    const log = generateSyntheticLog({ ...BASE, seed: 9 });
    const lines = ['Elapsed (min),Current density (A/cm2),Voltage (V)'];
    for (let i = 0; i < log.v.length; i++) lines.push(`${(log.tHours![i] * 60).toFixed(2)},${log.j[i].toFixed(5)},${log.v[i].toFixed(6)}`);
    const curve = await uploadLog(lines.join('\n') + '\n');
    expect(Number(curve.summary.hoursRun)).toBeCloseTo(800, 2); // derived by hand: 48,000 min / 60
  });

  it('finds a restart and fits the segments apart instead of through the step', async () => {
    const curve = await uploadLog(csvOf({ restartAtHours: 400, restartShiftMv: 8, seed: 11 }));
    const interruptions = JSON.parse(String(curve.summary.interruptions)) as { kind: string; startHours: number }[];
    const restart = interruptions.find((i) => i.kind === 'restart');
    expect(restart).toBeDefined();
    expect(restart!.startHours).toBeGreaterThan(398); // the invented stop is at 400 h
    expect(restart!.startHours).toBeLessThan(402);
    expect(JSON.parse(String(curve.summary.segments)).length).toBe(2);
    // fitted through the +8 mV step the rate would be far off; split, it stays near 8 µV/h
    expect(Math.abs(curve.metrics.degradationRate! - 8)).toBeLessThan(2); // tolerance from memory
  });

  it('an open-circuit hold reports its voltage loss the same way', async () => {
    const res = await h.as.researcher.upload(`/api/builds/${ids.build('C-014')}/curves`, { name: 'ocv-hold.csv', content: csvOf({ currentDensity: 0, v0: 0.95, rateUvPerH: 40, hours: 200, breakInHours: 10, seed: 3 }) }, { kind: 'hold' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.curve.kind).toBe('hold');
    expect(Math.abs(res.body.curve.metrics.degradationRate - 40)).toBeLessThan(6); // invented at 40 µV/h; tolerance from memory
    expect(res.body.curve.summary.voltageLossMv).toBeGreaterThan(0);
  });
});

describe('durability options (PATCH)', () => {
  it('takes a break-in set by hand, and goes back to the detected one on null', async () => {
    const curve = await uploadLog(csvOf({ seed: 21 }));
    const set = await h.as.researcher.patch(`/api/curves/${curve.id}`, { breakInHours: 200 });
    expect(set.status, JSON.stringify(set.body)).toBe(200);
    expect(set.body.curve.metrics.breakInHours).toBe(200);
    expect(set.body.curve.summary.breakInSource).toBe('user');
    expect(set.body.curve.summary.fitFromHours).toBeGreaterThanOrEqual(200);
    const back = await h.as.researcher.patch(`/api/curves/${curve.id}`, { breakInHours: null });
    expect(back.status).toBe(200);
    expect(back.body.curve.summary.breakInSource).toBe('detected');
    expect(back.body.curve.metrics.breakInHours).toBeCloseTo(curve.metrics.breakInHours!, 6);
    expect(back.body.curve.options.breakInHours).toBeUndefined();
  });

  it('reports rates over user windows and hours to a chosen loss', async () => {
    const curve = await uploadLog(csvOf({ seed: 22 }));
    const res = await h.as.researcher.patch(`/api/curves/${curve.id}`, { windows: [{ fromHours: 100, toHours: 400 }, { fromHours: 400, toHours: 800 }], lossFraction: 0.01 });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const windows = JSON.parse(res.body.curve.summary.windows) as { fromHours: number; toHours: number; rate: number; low: number; high: number }[];
    expect(windows).toHaveLength(2);
    for (const w of windows) {
      expect(w.low).toBeLessThan(w.high);
      expect(Math.abs(w.rate - 8)).toBeLessThan(4); // 8 µV/h invented; a 300–400 h window is noisier (from memory)
    }
    expect(res.body.curve.summary.lossFraction).toBe(0.01);
    // 1 % of ≈0.6 V is 6 mV; at 8 µV/h that takes ≈750 h after break-in (derived by hand: 6000 µV / 8 µV/h),
    // past the end of this 800 h run → either reached late or projected
    const reached = res.body.curve.summary.hoursToLoss, projected = res.body.curve.summary.projectedHoursToLoss;
    expect(reached ?? projected).toBeGreaterThan(500);
    const far = await h.as.researcher.patch(`/api/curves/${curve.id}`, { lossFraction: 0.1 });
    expect(far.body.curve.summary.hoursToLoss).toBeNull(); // 60 mV at 8 µV/h is ≈7,500 h: not reached in 800 h
    expect(far.body.curve.summary.projectedHoursToLoss).toBeGreaterThan(5000);
  });

  it('refuses a window that ends before it starts, a loss fraction of 1, and options on a polarization curve', async () => {
    const curve = await uploadLog(csvOf({ seed: 23 }));
    const bad = await h.as.researcher.patch(`/api/curves/${curve.id}`, { windows: [{ fromHours: 300, toHours: 100 }] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/windows/);
    const fraction = await h.as.researcher.patch(`/api/curves/${curve.id}`, { lossFraction: 1 });
    expect(fraction.status).toBe(400);
    const detail = await h.as.researcher.get(`/api/builds/${ids.build('C-001')}`);
    const polarization = detail.body.curves.find((c: { kind: string }) => c.kind === 'polarization');
    const wrong = await h.as.pi.patch(`/api/curves/${polarization.id}`, { breakInHours: 10 });
    expect(wrong.status).toBe(400);
  });

  it('a viewer cannot change the break-in', async () => {
    const curve = await uploadLog(csvOf({ seed: 24 }));
    const res = await h.as.viewer.patch(`/api/curves/${curve.id}`, { breakInHours: 10 });
    expect(res.status).toBe(403);
  });
});

describe('plot points', () => {
  it('downsamples the log for the browser and returns finer detail for a zoomed range', async () => {
    const curve = await uploadLog(csvOf({ seed: 31 }));
    const whole = await h.as.viewer.get(`/api/curves/${curve.id}?maxPoints=500`);
    expect(whole.status).toBe(200);
    expect(whole.body.points.downsampled).toBe(true);
    expect(whole.body.points.tHours.length).toBeLessThanOrEqual(500);
    expect(whole.body.points.total).toBe(4801);
    const zoom = await h.as.viewer.get(`/api/curves/${curve.id}?maxPoints=500&fromHours=100&toHours=120`);
    const t = zoom.body.points.tHours as number[];
    expect(t.length).toBe(121); // derived by hand: 20 h × 6 rows/h + 1, under maxPoints so every row
    expect(Math.min(...t)).toBeGreaterThanOrEqual(100);
    expect(Math.max(...t)).toBeLessThanOrEqual(120);
  });
});

describe('a log refused while it is mapped (in the worker pool)', () => {
  it('names the line and column of an impossible value, and the lines of a log too short to measure; nothing is stored', async () => {
    const before = count('curves');
    const lines = csvOf({ seed: 71 }).trim().split('\n');
    lines[1234] = lines[1234]!.replace(/,[^,]*$/, ',7.5'); // 7.5 V: no cell reaches it
    const bad = await h.as.researcher.upload(`/api/builds/${ids.build('C-014')}/curves`, { name: 'bad-volt.csv', content: lines.join('\n') + '\n' }, { kind: 'durability' });
    expect(bad.status).toBe(422);
    expect(bad.body.error.message).toContain('line 1235, column "Voltage (V)"'); // row 1234 below the header is the file's line 1235
    const short = await h.as.researcher.upload(`/api/builds/${ids.build('C-014')}/curves`, { name: 'short.csv', content: `${lines[0]}\n${lines[1]}\n${lines[2]}\n` }, { kind: 'durability' });
    expect(short.status).toBe(422);
    // the lines come from the table's line numbers, which went to the worker with its columns and came back
    expect(short.body.error.message).toMatch(/^short\.csv: lines 2–3, column "Time \(h\)": a durability log needs at least 20 readings/);
    expect(count('curves')).toBe(before);
  });
});

describe('a long log in storage', () => {
  it('is kept in pieces of about 1 MB, read back exactly as the file wrote it, and its pieces go with it', async () => {
    // 3,000 h at 1-min steps: 180,001 rows, three columns of 1,440,008 bytes → 4.3 MB, over the 4 MiB kept in one blob
    const csv = csvOf({ hours: 3000, stepMinutes: 1, seed: 61 });
    const curve = await uploadLog(csv);
    expect(curve.pointCount).toBe(180001); // derived by hand: 3,000 h × 60 rows/h + 1
    const pieces = () => (h.ctx.db.$client.prepare('select count(*) as n from curve_point_chunks where curve_id = ?').get(curve.id) as { n: number }).n;
    expect(pieces()).toBe(6); // derived by hand: each column 1,440,008 bytes = one 1 MiB piece + the rest; 3 columns
    const head = h.ctx.db.$client.prepare('select length(points) as n from curves where id = ?').get(curve.id) as { n: number };
    expect(head.n).toBe(16);
    // a zoom of one hour is every row, the numbers the file holds (Float64 read from its text)
    const zoom = await h.as.viewer.get(`/api/curves/${curve.id}?maxPoints=500&fromHours=2999&toHours=3000`);
    expect(zoom.status).toBe(200);
    const rows = csv.trim().split('\n').slice(-61).map((line) => line.split(',').map(Number));
    expect(zoom.body.points.tHours).toEqual(rows.map((r) => r[0]));
    expect(zoom.body.points.v).toEqual(rows.map((r) => r[2]));
    expect((await h.as.pi.delete(`/api/curves/${curve.id}`)).status).toBe(200);
    expect(pieces()).toBe(0);
  });
});

describe('processing progress', () => {
  it('reports done with the curve id to the sender, and nothing to anyone else', async () => {
    const uploadId = 'test-progress-0001';
    const curve = await uploadLog(csvOf({ seed: 41 }), { uploadId });
    const mine = await h.as.researcher.get(`/api/uploads/${uploadId}/progress`);
    expect(mine.status).toBe(200);
    expect(mine.body.progress).toMatchObject({ phase: 'done', fraction: 1, curveId: curve.id, known: true });
    expect(mine.body.progress.bytesParsed).toBe(mine.body.progress.bytesTotal);
    const theirs = await h.as.pi.get(`/api/uploads/${uploadId}/progress`);
    expect(theirs.body.progress).toMatchObject({ phase: 'receiving', known: false, curveId: null });
  });

  it('streams the same as server-sent events', async () => {
    const uploadId = 'test-progress-sse1';
    await uploadLog(csvOf({ seed: 42, hours: 100 }), { uploadId });
    const res = await h.as.researcher.get(`/api/uploads/${uploadId}/progress`).set('Accept', 'text/event-stream').buffer(true).parse((r, done) => { let text = ''; r.on('data', (c: Buffer) => { text += c.toString(); }); r.on('end', () => done(null, text)); });
    expect(res.headers['content-type']).toMatch(/text\/event-stream/);
    expect(String(res.body)).toMatch(/event: progress\ndata: .*"phase":"done"/);
  });

  it('reports the reason when the upload fails, and refuses a malformed id', async () => {
    const uploadId = 'test-progress-fail';
    const res = await h.as.researcher.upload(`/api/builds/${ids.build('C-014')}/curves`, { name: 'words.csv', content: 'just,some\nwords,here\n' }, { uploadId });
    expect(res.status).toBe(422);
    const progress = await h.as.researcher.get(`/api/uploads/${uploadId}/progress`);
    expect(progress.body.progress.phase).toBe('error');
    expect(progress.body.progress.message).toMatch(/words\.csv/);
    const bad = await h.as.researcher.get('/api/uploads/no%20spaces/progress');
    expect(bad.status).toBe(400);
  });
});

describe('project durability comparison', () => {
  it('lists the seeded logs with rates in the range the trade reports and their conditions', async () => {
    const res = await h.as.viewer.get(`/api/projects/${ids.project('C')}/durability`);
    expect(res.status).toBe(200);
    expect(res.body.typicalBand).toEqual({ standard: [10, 15], improved: 5 }); // common practice in the trade
    const seeded = (res.body.curves as { code: string; degradationRate: number; low: number; high: number; hoursRun: number; temperatureC: number | null; currentDensity: number | null }[]).filter((c) => c.hoursRun >= 1500);
    expect(seeded.length).toBeGreaterThanOrEqual(1);
    for (const c of seeded) {
      expect(c.degradationRate).toBeGreaterThan(1); // the trade reports about 1–15 µV/h (common practice in the trade)
      expect(c.degradationRate).toBeLessThan(20);
      expect(c.low).toBeLessThan(c.high);
      expect(c.temperatureC).not.toBeNull();
      expect(c.currentDensity).toBeGreaterThan(0);
    }
  });
});

describe('upload limits', () => {
  async function limitedApp(limits: Record<string, string>) {
    const ctx = createContext({ DATABASE_PATH: h.ctx.env.databasePath, UPLOADS_DIR: h.ctx.env.uploadsDir, LOG_LEVEL: 'silent', SEED_DEMO: 'never', LOGIN_RATE_LIMIT: '1000', ...limits });
    const app = createApp(ctx, { serveClient: false });
    const agent = request.agent(app);
    const login = await agent.post('/api/auth/login').send({ email: 'researcher@demo.cellwright.test', password: 'demo-password' });
    return { ctx, agent, csrf: login.body.csrfToken as string };
  }
  const storedFiles = () => fs.readdirSync(h.ctx.env.uploadsDir, { recursive: true }).filter((f) => !String(f).startsWith('tmp') && fs.statSync(path.join(h.ctx.env.uploadsDir, String(f))).isFile()).length;

  it('refuses a file over UPLOAD_MAX_BYTES with 413 naming the limit, and stores nothing', async () => {
    const { ctx, agent, csrf } = await limitedApp({ UPLOAD_MAX_BYTES: '20000' });
    const before = { curves: count('curves'), files: count('files'), disk: storedFiles() };
    const res = await agent.post(`/api/builds/${ids.build('C-014')}/curves`).set('X-CSRF-Token', csrf).field('kind', 'durability').attach('file', Buffer.from(csvOf({ seed: 51 })), 'big.csv');
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('too-large');
    expect(res.body.error.message).toMatch(/UPLOAD_MAX_BYTES/);
    expect(res.body.error.message).toMatch(/19\.5 kB/); // derived by hand: 20,000 / 1024 = 19.53
    expect({ curves: count('curves'), files: count('files'), disk: storedFiles() }).toEqual(before);
    expect(fs.readdirSync(path.join(h.ctx.env.uploadsDir, 'tmp'))).toEqual([]);
    ctx.db.$client.close();
  });

  it('refuses a log too short after its break-in with 422, and stores nothing (the raw file was on its way to the store meanwhile)', async () => {
    const before = { curves: count('curves'), files: count('files'), disk: storedFiles() };
    // 2 h of readings: fewer than the 3 h after break-in a short log needs (shared/curves/check-enough-data.ts)
    const res = await h.as.researcher.upload(`/api/builds/${ids.build('C-014')}/curves`, { name: 'short-after-break-in.csv', content: csvOf({ hours: 2, stepMinutes: 1, breakInHours: 0.5, seed: 53 }) }, { kind: 'durability' });
    expect(res.status, JSON.stringify(res.body)).toBe(422);
    expect(res.body.error.message).toMatch(/short-after-break-in\.csv.*after break-in/);
    expect({ curves: count('curves'), files: count('files'), disk: storedFiles() }).toEqual(before);
    expect(fs.readdirSync(path.join(h.ctx.env.uploadsDir, 'tmp'))).toEqual([]);
  });

  it('refuses a file over UPLOAD_MAX_ROWS with 422 naming the limit, and stores nothing', async () => {
    const { ctx, agent, csrf } = await limitedApp({ UPLOAD_MAX_ROWS: '1000' });
    const before = { curves: count('curves'), files: count('files'), disk: storedFiles() };
    const res = await agent.post(`/api/builds/${ids.build('C-014')}/curves`).set('X-CSRF-Token', csrf).field('kind', 'durability').attach('file', Buffer.from(csvOf({ seed: 52 })), 'long.csv');
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('too-many-rows');
    expect(res.body.error.message).toMatch(/UPLOAD_MAX_ROWS/);
    expect(res.body.error.message).toMatch(/1,000/);
    expect({ curves: count('curves'), files: count('files'), disk: storedFiles() }).toEqual(before);
    ctx.db.$client.close();
  });
});
