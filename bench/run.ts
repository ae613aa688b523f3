// `npm run bench`: every figure is a ratio against a baseline measured in the same run, plus the
// absolute numbers. Writes bench/results.json and prints a table. Heavy parts run in their own
// processes so memory and CPU figures are theirs. Bounded: about 8–10 minutes on 2 cores (five
// interleaved ingest runs, the Chromium first-plot runs).
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import zlib from 'node:zlib';
import { execFileSync } from 'node:child_process';
import autocannon from 'autocannon';
import { BENCH_DIR, ROOT, runChild, startChildServer } from './lib';

interface Figure {
  figure: string;
  measured: string;
  baseline: string;
  ratio: number | null;
  /** the target this figure is held to, and whether this run met it */
  aim: string;
  met: boolean | null;
  details: Record<string, unknown>;
}

const figures: Figure[] = [];
const started = performance.now();
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-bench-'));
const round = (value: number, digits = 2) => Number(value.toFixed(digits));
const MB = 1024 * 1024;
const log = (text: string) => process.stderr.write(`· ${text}\n`);

// 1 and 2: ingest of a 1,000,000-row log, then reading it back for a plot
{
  const file = path.join(tmp, 'log-1M.csv');
  log('writing the 1,000,000-row log');
  const generated = await runChild<{ rows: number; bytes: number }>('generate-log.ts', [file, '1000024']);
  log('parsing it with plain CSV parsers (baselines)');
  const parse = await runChild<Record<string, { ms: number; rows: number; peakDeltaBytes: number }>>('parse-baseline.ts', [file]);
  // Ingest and uDSV's typed parse of the same bytes, interleaved five times: each run's ratio is
  // taken against the uDSV parse just before it, so a busy moment on the machine hits both.
  type Ingest = { ingest: Record<string, number> & { phasesSeen: string[] }; readBack: Record<string, number> };
  const runs: { udsvMs: number; ingest: Ingest }[] = [];
  for (let run = 0; run < 5; run++) {
    log(`uDSV parse, then the upload through the API (run ${run + 1} of 5)`);
    const udsv = await runChild<{ udsvTyped: { ms: number } }>('parse-baseline.ts', [file, 'udsv']);
    runs.push({ udsvMs: udsv.udsvTyped.ms, ingest: await runChild<Ingest>('ingest.ts', [file]) });
  }
  const spread = (values: number[]) => { const sorted = [...values].sort((a, b) => a - b); return { median: sorted[Math.floor(sorted.length / 2)]!, min: sorted[0]!, max: sorted[sorted.length - 1]! }; };
  const ratios = spread(runs.map((r) => r.udsvMs / r.ingest.ingest.ms));
  const memory = spread(runs.map((r) => (r.ingest.ingest.peakRssBytes - r.ingest.ingest.idleRssBytes) / r.ingest.ingest.bytes));
  const stalls = spread(runs.map((r) => r.ingest.ingest.longestStallMs));
  const ingestMs = spread(runs.map((r) => r.ingest.ingest.ms));
  const udsvMs = spread(runs.map((r) => r.udsvMs));
  const ingest = runs[Math.floor(runs.length / 2)]!.ingest;
  const papaparse = parse.papaparseFast!;
  const splitLoop = parse.splitLoop;
  const i = ingest.ingest;
  figures.push({
    figure: '1a ingest 1M-row log (upload → stored metrics) vs uDSV typed parse',
    measured: `${round(ingestMs.median / 1000)} s for ${i.rows.toLocaleString('en-US')} rows (${round(i.bytes / MB, 1)} MB); runs ${round(ingestMs.min / 1000)}–${round(ingestMs.max / 1000)} s`,
    baseline: `uDSV typed columns ${round(udsvMs.median / 1000)} s (${round(udsvMs.min / 1000)}–${round(udsvMs.max / 1000)} s)`,
    ratio: round(ratios.median),
    aim: '≥ 1.0× uDSV (median of 5 interleaved runs)',
    met: ratios.median >= 1,
    details: { ratioSpread: [round(ratios.min), round(ratios.max)], ingestMs: runs.map((r) => round(r.ingest.ingest.ms, 0)), udsvMs: runs.map((r) => round(r.udsvMs, 0)), baselines: Object.fromEntries(Object.entries(parse).map(([k, v]) => [k, round(v.ms, 0)])), phasesSeen: i.phasesSeen, worstProgressPollMs: round(i.worstProgressPollMs, 0), degradationRateUvPerH: round(i.degradationRate, 2), intervalUvPerH: [round(i.low, 2), round(i.high, 2)], breakInHours: i.breakInHours, interruptions: i.interruptions, generatedRows: generated.rows },
  });
  figures.push({
    figure: "1a' ingest vs papaparse's string parse (the earlier baseline)",
    measured: `${round(ingestMs.median / 1000)} s`,
    baseline: `papaparse fast mode ${round(papaparse.ms / 1000)} s (best of 3)`,
    ratio: round(papaparse.ms / ingestMs.median),
    aim: 'context only',
    met: null,
    details: splitLoop ? { splitLoopMs: round(splitLoop.ms, 0) } : {},
  });
  figures.push({
    figure: '1b ingest peak memory',
    measured: `${round((i.peakRssBytes - i.idleRssBytes) / MB, 0)} MB over idle (peak RSS ${round(i.peakRssBytes / MB, 0)} MB); multiples ${round(memory.min)}–${round(memory.max)}`,
    baseline: `file size ${round(i.bytes / MB, 1)} MB`,
    ratio: round(memory.median),
    aim: '≤ 2× the file size (median of 5)',
    met: memory.median <= 2,
    details: { multiples: runs.map((r) => round((r.ingest.ingest.peakRssBytes - r.ingest.ingest.idleRssBytes) / r.ingest.ingest.bytes)), plainParserPeakDeltaMB: Object.fromEntries(Object.entries(parse).map(([k, v]) => [k, round(v.peakDeltaBytes / MB, 0)])) },
  });
  figures.push({
    figure: '1c longest event-loop stall during the ingest',
    measured: `${round(stalls.median, 0)} ms (runs ${round(stalls.min, 0)}–${round(stalls.max, 0)} ms)`,
    baseline: 'the 100 ms a waiting request may be held',
    ratio: round(100 / stalls.median),
    aim: '≤ 100 ms',
    met: stalls.median <= 100,
    details: { stallsMs: runs.map((r) => round(r.ingest.ingest.longestStallMs, 0)) },
  });
  const r = ingest.readBack;
  figures.push({
    figure: '2 read stored 1M-point curve, downsampled for a plot',
    measured: `${round(r.httpMedianMs, 1)} ms over HTTP (${r.plotPoints} points); ${round(r.serviceMedianMs, 1)} ms in-process`,
    baseline: `raw blob select ${round(r.rawBlobMedianMs, 1)} ms`,
    ratio: round(r.rawBlobMedianMs / r.httpMedianMs),
    aim: '< 100 ms',
    met: r.httpMedianMs < 100,
    details: { httpMedianMs: round(r.httpMedianMs, 1), zoomHttpMedianMs: round(r.httpZoomMedianMs, 1), serviceMedianMs: round(r.serviceMedianMs, 1), rawBlobMedianMs: round(r.rawBlobMedianMs, 1), blobMB: round(r.blobBytes / MB, 1) },
  });
}

// 3: builds list with 10,000 builds, 50 connections, real app vs a bare Express route
{
  log('seeding 10,000 builds and starting both servers');
  const { info, stop } = await startChildServer<{ realUrl: string; bareUrl: string; projectId: number; builds: number; seedMs: number; cookie: string }>('serve-builds.ts', ['10000']);
  const cannon = (url: string, headers: Record<string, string>, duration: number) =>
    autocannon({ url, connections: 50, duration, headers }) as unknown as Promise<{ requests: { average: number }; latency: { p99: number; p50: number }; errors: number; non2xx: number; throughput: { average: number } }>;
  try {
    for (const [label, query, duration] of [['full list (10,000 builds)', '', 10], ['one page (?limit=100)', '?limit=100', 8]] as const) {
      log(`autocannon: ${label}`);
      const realPath = `${info.realUrl}/api/projects/${info.projectId}/builds${query}`;
      const size = (await (await fetch(realPath, { headers: { cookie: info.cookie } })).text()).length;
      const bareSize = (await (await fetch(`${info.bareUrl}/builds${query}`)).text()).length;
      const real = await cannon(realPath, { cookie: info.cookie }, duration);
      const bare = await cannon(`${info.bareUrl}/builds${query}`, {}, duration);
      const ratio = real.requests.average / bare.requests.average;
      figures.push({
        figure: `3 builds list, ${label}, 50 connections`,
        measured: `${round(real.requests.average, 1)} req/s, p99 ${real.latency.p99} ms`,
        baseline: `bare Express + better-sqlite3 ${round(bare.requests.average, 1)} req/s, p99 ${bare.latency.p99} ms`,
        ratio: round(ratio),
        aim: '≥ 0.5× the bare route, p99 < 50 ms',
        met: ratio >= 0.5 && real.latency.p99 < 50,
        details: { builds: info.builds, seedMs: round(info.seedMs, 0), responseKB: round(size / 1024, 0), bareResponseKB: round(bareSize / 1024, 0), realP50: real.latency.p50, bareP50: bare.latency.p50, errors: real.errors + real.non2xx, durationS: duration },
      });
    }
  } finally {
    await stop();
  }
}

// 4: the fit + proposals figure of the surface work, when its bench file exists
{
  const file = path.join(BENCH_DIR, 'fit-proposals.ts');
  if (fs.existsSync(file)) {
    log('fit + proposals');
    const { benchFitProposals } = (await import('./fit-proposals')) as { benchFitProposals: (o?: { repeats?: number }) => Promise<{ name: string; medianMs: number; baselineMedianMs: number; ratio: number; details: Record<string, number | string> }> };
    const result = await benchFitProposals();
    figures.push({ figure: `4 ${result.name}`, measured: `${round(result.medianMs, 1)} ms`, baseline: `${round(result.baselineMedianMs, 1)} ms`, ratio: round(result.ratio), aim: 'whole call < 100 ms', met: result.medianMs < 100, details: result.details });
  } else {
    figures.push({ figure: '4 fit + proposals', measured: 'skipped', baseline: '—', ratio: null, aim: '—', met: null, details: { note: 'bench/fit-proposals.ts is not there yet' } });
  }
}

// 5: the first page's JavaScript (gzip) and the plot chunk
{
  log('vite build (to a temp folder)');
  const outDir = path.join(tmp, 'dist');
  execFileSync(process.execPath, [path.join(ROOT, 'node_modules/vite/bin/vite.js'), 'build', '--outDir', outDir, '--emptyOutDir', '--logLevel', 'error'], { cwd: ROOT, stdio: ['ignore', 'ignore', 'inherit'] });
  const html = fs.readFileSync(path.join(outDir, 'index.html'), 'utf8');
  const entry = [...html.matchAll(/<(?:script[^>]*\ssrc|link[^>]*rel="modulepreload"[^>]*\shref)="\/?([^"]+\.js)"/g)].map((m) => m[1]!);
  const gz = (file: string) => zlib.gzipSync(fs.readFileSync(path.join(outDir, file)), { level: 9 }).length;
  const entryGzip = entry.reduce((sum, f) => sum + gz(f), 0);
  const assets = fs.readdirSync(path.join(outDir, 'assets'));
  const plotFile = assets.filter((f) => /plotly/i.test(f) && f.endsWith('.js')).sort((a, b) => fs.statSync(path.join(outDir, 'assets', b)).size - fs.statSync(path.join(outDir, 'assets', a)).size)[0];
  const plotGzip = plotFile ? gz(`assets/${plotFile}`) : null;
  figures.push({
    figure: '5 first page JavaScript (gzip) vs plot chunk',
    measured: `${round(entryGzip / 1024, 1)} kB gzip in ${entry.length} file(s) loaded by index.html`,
    baseline: plotGzip ? `plot chunk ${plotFile} ${round(plotGzip / 1024, 1)} kB gzip (lazy)` : 'no plot chunk found',
    ratio: plotGzip ? round(entryGzip / plotGzip) : null,
    aim: 'plot chunk kept out of the first page',
    met: plotFile ? !entry.some((f) => f.includes(plotFile)) : null,
    details: { entryFiles: entry, entryGzipBytes: entryGzip, plotChunk: plotFile ?? null, plotGzipBytes: plotGzip, plotRawBytes: plotFile ? fs.statSync(path.join(outDir, 'assets', plotFile)).size : null },
  });
}

// 6: a simulated campaign — builds until one is within 1 % of the optimum, against one factor
// at a time and random builds on the same invented function and noise
{
  log('simulated campaign (15 seeds)');
  const { benchCampaign } = await import('./campaign');
  const c = benchCampaign({ seeds: 15 });
  const show = (m: number | null, budget: number) => (m === null ? `not within ${budget}` : `${m} builds`);
  figures.push({
    figure: `6 ${c.name}`,
    measured: `Cellwright median ${show(c.product.median, 40)} (incl. the 10-build start; ${c.product.perSeed.filter((v) => v === null).length} of ${c.seeds} seeds not within 40)`,
    baseline: `one factor at a time ${show(c.oneFactor.median, c.oneFactor.budget)}; random ${show(c.random.median, c.random.budget)}`,
    ratio: c.product.median !== null && c.random.median !== null ? round(c.random.median / c.product.median, 1) : null,
    aim: '≤ 20 builds; every proposal inside the trust region or labelled exploratory',
    met: c.product.median !== null && c.product.median <= 20 && c.product.unlabelledOutside === 0 && c.product.unflaggedLimit === 0,
    details: {
      seeds: c.seeds,
      optimumMv: round(c.optimumV * 1000, 1),
      targetMv: round(c.targetV * 1000, 1),
      productPerSeed: c.product.perSeed,
      oneFactorPerSeed: c.oneFactor.perSeed,
      randomPerSeed: c.random.perSeed,
      proposals: c.product.proposals,
      exploratoryProposals: c.product.exploratory,
      unlabelledOutsideTrustRegion: c.product.unlabelledOutside,
      unflaggedPastPhysicalLimit: c.product.unflaggedLimit,
      modelsChosenSeed1: c.product.models[0],
      productMs: round(c.product.ms, 0),
    },
  });
}

// 7: p99 of list and curve reads during a burst of large uploads, against the same reads without uploads
{
  log('reads under an upload burst');
  const { benchReadsUnderUpload } = await import('./reads-under-upload');
  const r = await benchReadsUnderUpload();
  figures.push({
    figure: '7 p99 of list + curve reads during a burst of large uploads',
    measured: `p99 ${round(r.loaded.p99, 0)} ms (p50 ${round(r.loaded.p50, 0)} ms) with ${r.uploads.concurrent} uploads at a time (${round(r.uploads.bytesEach / MB, 1)} MB CSV, ${round(r.uploads.workbookBytes / MB, 1)} MB .xlsx)`,
    baseline: `same reads without uploads: p99 ${round(r.idle.p99, 0)} ms (p50 ${round(r.idle.p50, 0)} ms)`,
    ratio: round(r.ratio),
    aim: 'p99 under uploads ≤ 3× the p99 without',
    met: r.ratio <= 3,
    details: { idle: r.idle, loaded: r.loaded, uploads: r.uploads },
  });
}

// 8: the first chart drawn in Chromium on the build, gains and surface pages, against the same page without its charts
{
  log('first plot in Chromium (build, gains, surface; cold and warm)');
  type Timing = { median: number; min: number; max: number };
  type PageTimes = { path: string; coldMs: Timing; warmMs: Timing; coldWithoutMs: Timing; warmWithoutMs: Timing };
  let pages: Record<string, PageTimes> | null = null;
  try {
    pages = JSON.parse(execFileSync(process.execPath, [path.join(BENCH_DIR, 'first-plot.mjs'), '5'], { cwd: ROOT, encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'], timeout: 15 * 60_000 }).trim().split('\n').pop()!) as Record<string, PageTimes>;
  } catch (error) {
    figures.push({ figure: '8 first plot', measured: 'skipped', baseline: '—', ratio: null, aim: '—', met: null, details: { note: `Chromium run failed: ${String(error).slice(0, 200)}` } });
  }
  for (const [name, t] of Object.entries(pages ?? {})) {
    const extra = t.warmMs.median / t.warmWithoutMs.median;
    figures.push({
      figure: `8 first plot, ${name} page (warm)`,
      measured: `${round(t.warmMs.median, 0)} ms warm (${round(t.warmMs.min, 0)}–${round(t.warmMs.max, 0)}), ${round(t.coldMs.median, 0)} ms cold`,
      baseline: `same page without its charts: ${round(t.warmWithoutMs.median, 0)} ms warm, ${round(t.coldWithoutMs.median, 0)} ms cold`,
      ratio: round(extra),
      aim: name === 'build' ? 'first plot ≤ 1.0 s warm and ≤ 2× the page without it' : '≤ 2× the page without it',
      met: extra <= 2 && (name !== 'build' || t.warmMs.median <= 1000),
      details: t,
    });
  }
}

fs.rmSync(tmp, { recursive: true, force: true });
const results = { ranAt: new Date().toISOString(), node: process.version, cpus: os.cpus().length, totalSeconds: round((performance.now() - started) / 1000, 1), figures };
fs.writeFileSync(path.join(BENCH_DIR, 'results.json'), JSON.stringify(results, null, 2) + '\n');

const rows = figures.map((f) => [f.figure, f.measured, f.baseline, f.ratio == null ? '—' : `${f.ratio}×`, f.aim, f.met == null ? '—' : f.met ? 'met' : 'MISSED']);
const widths = [0, 1, 2, 3, 4, 5].map((c) => Math.max(...[['figure', 'measured', 'baseline', 'ratio', 'aim', ''], ...rows].map((r) => r[c]!.length)));
const line = (r: string[]) => r.map((cell, c) => cell.padEnd(widths[c]!)).join(' | ');
console.log(line(['figure', 'measured', 'baseline', 'ratio', 'aim', '']));
console.log(widths.map((w) => '-'.repeat(w)).join('-|-'));
for (const r of rows) console.log(line(r));
console.log(`\n${results.totalSeconds} s in all; written to bench/results.json`);
