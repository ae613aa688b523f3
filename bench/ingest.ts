// Ingest figure: a generated 1,000,000-row log uploaded through the real API (multipart → disk, read
// by a worker while received → metrics → stored blob), timed to the 201; peak RSS over the process's idle level;
// progress polled meanwhile (its worst latency shows whether the event loop stayed free).
// Then the read-back figure: the stored curve fetched downsampled for a plot.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import { createContext } from '../server/bootstrap';
import { createApp } from '../server/app';
import { seedDemo } from '../server/seed/seed';
import { curvePoints, loadCurve } from '../server/curves/service';
import { median, rssSampler, signIn } from './lib';

const file = process.argv[2]!;
const bytes = fs.statSync(file).size;
const gc = (globalThis as { gc?: () => void }).gc;
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-bench-ingest-'));
const ctx = createContext({ DATABASE_PATH: path.join(dir, 'db.sqlite'), UPLOADS_DIR: path.join(dir, 'uploads'), LOG_LEVEL: 'silent', SEED_DEMO: 'never', LOGIN_RATE_LIMIT: '1000', UPLOAD_MAX_BYTES: String(512 * 1024 * 1024), ...(process.env.BENCH_PARSE_AFTER_RECEIPT && { UPLOAD_PARSE_WHILE_RECEIVING: 'false' }) });
await seedDemo(ctx);
const app = createApp(ctx, { serveClient: false });
const server = app.listen(0, '127.0.0.1');
await new Promise((r) => server.once('listening', r));
const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
const auth = await signIn(base, 'researcher@demo.cellwright.test');
const buildId = (ctx.db.$client.prepare("select id from builds where code = 'C-014'").get() as { id: number }).id;

// The upload is sent by curl in its own process, so the figure's memory is the server's alone.
import { execFile } from 'node:child_process';
function curlUpload(path: string, name: string, uploadId: string | null): Promise<{ status: number; body: string }> {
  // BENCH_LINE_RATE (e.g. 100M bytes/s, a 1 Gb/s network): the upload sent no faster than a real link
  const args = [...(process.env.BENCH_LINE_RATE ? ['--limit-rate', process.env.BENCH_LINE_RATE] : []), '-s', '-o', '-', '-w', '\n%{http_code}', '-H', `cookie: ${auth.cookie}`, '-H', `x-csrf-token: ${auth.csrf}`, '-F', 'kind=durability', ...(uploadId ? ['-F', `uploadId=${uploadId}`] : []), '-F', `file=@${path};filename=${name}`, `${base}/api/builds/${buildId}/curves`];
  return new Promise((resolve, reject) => execFile('curl', args, { maxBuffer: 1 << 24 }, (error, stdout) => {
    if (error) return reject(error);
    const cut = stdout.lastIndexOf('\n');
    resolve({ status: Number(stdout.slice(cut + 1)), body: stdout.slice(0, cut) });
  }));
}
async function upload(uploadId: string) {
  const res = await curlUpload(file, 'bench-1M.csv', uploadId);
  const body = JSON.parse(res.body) as { curve: { id: number; pointCount: number; metrics: { degradationRate: number | null; breakInHours: number | null }; summary: Record<string, unknown> } };
  if (res.status !== 201) throw new Error(`upload failed: ${res.status} ${res.body.slice(0, 500)}`);
  return body.curve;
}

// warm-up on a small file so JIT and first-request costs are not in the figure
{
  const small = path.join(dir, 'warm.csv');
  fs.writeFileSync(small, fs.readFileSync(file, 'utf8').slice(0, 2_000_000).replace(/\n[^\n]*$/, '\n'));
  for (let w = 0; w < 3; w++) await curlUpload(small, 'warm.csv', null);
}

// `ingest.ts FILE [runs]`: the same upload `runs` times (median reported by the caller), each with
// its own peak memory over idle and the longest event-loop stall: Node's own delay histogram and a
// 5 ms timer probe (the largest gap between ticks beyond its interval), whichever is larger.
const runs = Number(process.argv[3] ?? 1);
const perRun: { ms: number; idleRssBytes: number; peakRssBytes: number; stallMs: number; worstPollMs: number }[] = [];
const phases = new Set<string>();
const phaseStart: Record<string, number> = {};
let curve!: Awaited<ReturnType<typeof upload>>;
for (let run = 0; run < runs; run++) {
  gc?.();
  await new Promise((r) => setTimeout(r, 200));
  const idleRss = process.memoryUsage.rss();
  const sampler = rssSampler(5);
  let worstPollMs = 0;
  let polling = true;
  const uploadId = `bench-${Date.now()}-${run}`;
  const loopDelay = monitorEventLoopDelay({ resolution: 5 });
  let lastTick = performance.now();
  let worstGap = 0;
  const probe = setInterval(() => { const now = performance.now(); worstGap = Math.max(worstGap, now - lastTick - 5); lastTick = now; }, 5);
  loopDelay.enable();
  const poller = (async () => {
    while (polling) {
      const t0 = performance.now();
      const res = await fetch(`${base}/api/uploads/${uploadId}/progress`, { headers: { cookie: auth.cookie } });
      const body = (await res.json()) as { progress: { phase: string } };
      worstPollMs = Math.max(worstPollMs, performance.now() - t0);
      phases.add(body.progress.phase);
      phaseStart[body.progress.phase] ??= performance.now() - t0;
      await new Promise((r) => setTimeout(r, 20));
    }
  })();
  const started = performance.now();
  curve = await upload(uploadId);
  const ms = performance.now() - started;
  const peakRss = sampler.stop();
  loopDelay.disable();
  clearInterval(probe);
  polling = false;
  await poller;
  perRun.push({ ms, idleRssBytes: idleRss, peakRssBytes: peakRss, stallMs: Math.max(loopDelay.max / 1e6, worstGap), worstPollMs });
}
const mid = [...perRun].sort((a, b) => a.ms - b.ms)[perRun.length >> 1]!;
const ingestMs = mid.ms;
const idleRss = mid.idleRssBytes;
const peakRss = mid.peakRssBytes;
const worstPollMs = Math.max(...perRun.map((r) => r.worstPollMs));

// read-back: over HTTP as the browser asks (2,000 points for the whole run), and in-process
const httpMs: number[] = [];
let plotPoints = 0;
for (let i = 0; i < 11; i++) {
  const t0 = performance.now();
  const res = await fetch(`${base}/api/curves/${curve.id}?maxPoints=2000`, { headers: { cookie: auth.cookie } });
  const body = (await res.json()) as { points: { tHours: number[] } };
  httpMs.push(performance.now() - t0);
  plotPoints = body.points.tHours.length;
}
const zoomMs: number[] = [];
for (let i = 0; i < 11; i++) {
  const t0 = performance.now();
  await (await fetch(`${base}/api/curves/${curve.id}?maxPoints=2000&fromHours=1000&toHours=1400`, { headers: { cookie: auth.cookie } })).json();
  zoomMs.push(performance.now() - t0);
}
const serviceMs: number[] = [];
for (let i = 0; i < 11; i++) {
  const t0 = performance.now();
  curvePoints(ctx, loadCurve(ctx, curve.id), { maxPoints: 2000 });
  serviceMs.push(performance.now() - t0);
}
// baseline: the stored bytes alone, straight from better-sqlite3
const rawMs: number[] = [];
// (a long log is stored in pieces of about 1 MB: all of them, in order)
const rawSelect = ctx.db.$client.prepare('select bytes from curve_point_chunks where curve_id = ? order by seq').pluck();
let blobBytes = 0;
for (let i = 0; i < 11; i++) {
  const t0 = performance.now();
  const pieces = rawSelect.all(curve.id) as Buffer[];
  rawMs.push(performance.now() - t0);
  blobBytes = pieces.reduce((sum, piece) => sum + piece.length, 0);
}

server.close();
ctx.db.$client.close();
fs.rmSync(dir, { recursive: true, force: true });
console.log(JSON.stringify({
  ingest: { ms: ingestMs, rows: curve.pointCount, bytes, idleRssBytes: idleRss, peakRssBytes: peakRss, maxRssKb: process.resourceUsage().maxRSS, phasesSeen: [...phases], phaseStartMs: phaseStart, worstProgressPollMs: worstPollMs, runs: perRun, degradationRate: curve.metrics.degradationRate, low: curve.summary.degradationLow, high: curve.summary.degradationHigh, breakInHours: curve.metrics.breakInHours, interruptions: JSON.parse(String(curve.summary.interruptions)).length },
  readBack: { httpMedianMs: median(httpMs), httpZoomMedianMs: median(zoomMs), serviceMedianMs: median(serviceMs), rawBlobMedianMs: median(rawMs), blobBytes, plotPoints },
}));
