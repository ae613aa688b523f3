// First-plot figure: in Debian's Chromium, the time from navigation to the first chart drawn
// (performance mark `cw:first-plot`, set by the plot component) on the build, gains and surface
// pages, cold (a fresh browser profile: nothing cached) and warm (the same page opened again), against
// the same page with its charts left out (`?noplot`: time to `cw:plot-slot`, where the chart
// would go). Prints one JSON line. Needs dist/ (built by scripts/ensure-build.mjs).
import { execFileSync } from 'node:child_process';
import { launchBrowser, signIn, startServer } from '../tests/browser/lib.mjs';

const REPEATS = Number(process.argv[2] ?? 5);
execFileSync(process.execPath, ['scripts/ensure-build.mjs'], { stdio: ['ignore', 'ignore', 'inherit'] });
const server = await startServer();
const median = (values) => { const s = [...values].sort((a, b) => a - b); return s[s.length >> 1]; };

async function timeTo(page, address, mark) {
  await page.goto(address, { waitUntil: 'commit' });
  await page.waitForFunction((name) => performance.getEntriesByName(name).length > 0, mark, { timeout: 60_000, polling: 20 });
  return page.evaluate((name) => performance.getEntriesByName(name)[0].startTime, mark);
}

const result = {};
try {
  // the demo's first project and its first build with a curve of record, found through the pages' own API
  const probe = await launchBrowser();
  const page = await probe.context.newPage();
  await signIn(page, server.url, 'researcher');
  const targets = await page.evaluate(async () => {
    const projects = (await (await fetch('/api/projects')).json()).projects;
    const project = projects[0];
    const builds = (await (await fetch(`/api/projects/${project.id}/builds`)).json()).builds;
    const build = builds.find((b) => b.curveCount > 0);
    return { build: `/projects/${project.id}/builds/${build.id}`, gains: `/projects/${project.id}/gains`, surface: `/projects/${project.id}/surface` };
  });
  await probe.close();
  for (const [name, path] of Object.entries(targets)) {
    const runs = { coldMs: [], warmMs: [], coldWithoutMs: [], warmWithoutMs: [] };
    for (let r = 0; r < REPEATS; r++) {
      for (const without of [false, true]) {
        const browser = await launchBrowser();
        const tab = await browser.context.newPage();
        await signIn(tab, server.url, 'researcher');
        // sign-in loaded the app's entry scripts; clear the cache so the first visit is cold
        const cdp = await browser.context.newCDPSession(tab);
        await cdp.send('Network.clearBrowserCache');
        const address = `${server.url}${path}${without ? '?noplot' : ''}`;
        const mark = without ? 'cw:plot-slot' : 'cw:first-plot';
        const cold = await timeTo(tab, address, mark);
        const warm = await timeTo(tab, address, mark);
        runs[without ? 'coldWithoutMs' : 'coldMs'].push(cold);
        runs[without ? 'warmWithoutMs' : 'warmMs'].push(warm);
        await browser.close();
      }
    }
    result[name] = { path, ...Object.fromEntries(Object.entries(runs).map(([k, v]) => [k, { median: median(v), min: Math.min(...v), max: Math.max(...v) }])) };
  }
} finally {
  await server.stop();
}
console.log(JSON.stringify(result));
