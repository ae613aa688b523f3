// Reads under an upload burst: p99 latency of builds-list and curve reads while several large
// files (durability logs as CSV and as .xlsx) are uploaded at once, against the p99 of the same reads with no uploads, measured in
// the same run on the same server. Run as `tsx bench/reads-under-upload.ts serve` it is the
// server (demo seed, the real app on a loopback port); imported, it drives the load from the
// bench's own process so the client's work does not land on the server's event loop.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import { exitWhenParentCloses, signIn, startChildServer } from './lib';

interface ServerInfo {
  url: string;
  cookie: string;
  csrf: string;
  projectId: number;
  buildId: number;
  curveIds: number[];
}

export interface ReadsUnderUploadResult {
  idle: { p50: number; p99: number; reads: number };
  loaded: { p50: number; p99: number; reads: number };
  uploads: { done: number; failed: number; bytesEach: number; workbookBytes: number; concurrent: number; medianMs: number };
  ratio: number;
}

const quantile = (values: number[], q: number) => {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))] ?? NaN;
};

async function serve(): Promise<void> {
  const { createContext } = await import('../server/bootstrap');
  const { createApp } = await import('../server/app');
  const { seedDemo } = await import('../server/seed/seed');
  const { parsePool } = await import('../server/uploads/parse-runner');
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-bench-reads-'));
  const ctx = createContext({ DATABASE_PATH: path.join(dir, 'db.sqlite'), UPLOADS_DIR: path.join(dir, 'uploads'), LOG_LEVEL: 'silent', SEED_DEMO: 'never', LOGIN_RATE_LIMIT: '100000' });
  parsePool(ctx.env).warm();
  await seedDemo(ctx);
  const app = createApp(ctx, { serveClient: false });
  const server = app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const auth = await signIn(url, 'researcher@demo.cellwright.test');
  const sqlite = ctx.db.$client;
  const projectId = (sqlite.prepare("select id from projects where code_prefix = 'C'").get() as { id: number }).id;
  const buildId = (sqlite.prepare("select id from builds where code = 'C-014'").get() as { id: number }).id;
  const curveIds = (sqlite.prepare("select c.id from curves c join builds b on b.id = c.build_id where b.project_id = ? order by c.id").all(projectId) as { id: number }[]).map((r) => r.id);
  exitWhenParentCloses(() => {
    server.close();
    ctx.db.$client.close();
    fs.rmSync(dir, { recursive: true, force: true });
  });
  console.log(JSON.stringify({ url, cookie: auth.cookie, csrf: auth.csrf, projectId, buildId, curveIds } satisfies ServerInfo));
}

/** `connections` loops reading for `seconds`: alternately one page of the builds list and one curve. */
async function readLoad(info: ServerInfo, seconds: number, connections: number): Promise<number[]> {
  const latencies: number[] = [];
  const until = performance.now() + seconds * 1000;
  let k = 0;
  await Promise.all(
    Array.from({ length: connections }, async () => {
      while (performance.now() < until) {
        const n = k++;
        const target = n % 2 === 0 ? `${info.url}/api/projects/${info.projectId}/builds?limit=100` : `${info.url}/api/curves/${info.curveIds[n % info.curveIds.length]}`;
        const started = performance.now();
        const res = await fetch(target, { headers: { cookie: info.cookie } });
        await res.arrayBuffer();
        if (res.status !== 200) throw new Error(`read ${target} answered ${res.status}`);
        latencies.push(performance.now() - started);
      }
    }),
  );
  return latencies;
}

export async function benchReadsUnderUpload(options: { seconds?: number; connections?: number; uploaders?: number; rows?: number } = {}): Promise<ReadsUnderUploadResult> {
  const seconds = options.seconds ?? 8;
  const connections = options.connections ?? 8;
  const uploaders = options.uploaders ?? 3;
  const { generateSyntheticLog, writeDurabilityCsv } = await import('../shared/durability');
  // a long durability log from the synthetic model: ~200,000 rows, ~5 MB of CSV …
  const log = generateSyntheticLog({ hours: 3300, stepMinutes: 1, v0: 0.66, breakInHours: 60, breakInDropMv: 15, rateUvPerH: 9, noiseMv: 1, currentDensity: 0.2 });
  const csv = Buffer.from(writeDurabilityCsv(log));
  // … and the first 40,000 rows of it as a workbook, for the uploader that sends .xlsx
  const { workbook } = await import('../tests/api/xlsx-fixtures');
  const sheet: (string | number)[][] = [['Time (h)', 'Current density (A/cm2)', 'Voltage (V)']];
  for (let i = 0; i < 40_000; i++) sheet.push([Number(log.tHours![i]!.toFixed(4)), Number(log.j[i]!.toFixed(5)), Number(log.v[i]!.toFixed(6))]);
  const xlsx = workbook([{ name: 'Log', rows: sheet }]);
  const { info, stop } = await startChildServer<ServerInfo>('reads-under-upload.ts', ['serve']);
  try {
    await readLoad(info, 1, connections); // warm-up
    const idle = await readLoad(info, seconds, connections);
    let running = true;
    const uploadMs: number[] = [];
    let done = 0;
    let failed = 0;
    const burst = Promise.all(
      Array.from({ length: uploaders }, async (_, u) => {
        while (running) {
          const form = new FormData();
          form.set('kind', 'durability');
          // one uploader sends workbooks, the others text logs
          if (u === 0) form.set('file', new Blob([new Uint8Array(xlsx)]), `burst-${u}-${done}.xlsx`);
          else form.set('file', new Blob([csv], { type: 'text/csv' }), `burst-${u}-${done}.csv`);
          const started = performance.now();
          const res = await fetch(`${info.url}/api/builds/${info.buildId}/curves`, { method: 'POST', headers: { cookie: info.cookie, 'x-csrf-token': info.csrf }, body: form });
          await res.arrayBuffer();
          if (res.status === 201) {
            done++;
            uploadMs.push(performance.now() - started);
          } else failed++;
        }
      }),
    );
    // let the first files reach the server before the reads are timed
    await new Promise((r) => setTimeout(r, 300));
    const loaded = await readLoad(info, seconds, connections);
    running = false;
    await burst;
    const summary = (values: number[]) => ({ p50: quantile(values, 0.5), p99: quantile(values, 0.99), reads: values.length });
    const idleSummary = summary(idle);
    const loadedSummary = summary(loaded);
    return {
      idle: idleSummary,
      loaded: loadedSummary,
      uploads: { done, failed, bytesEach: csv.length, workbookBytes: xlsx.length, concurrent: uploaders, medianMs: quantile(uploadMs, 0.5) },
      ratio: loadedSummary.p99 / idleSummary.p99,
    };
  } finally {
    await stop();
  }
}

if (process.argv[2] === 'serve') await serve();
