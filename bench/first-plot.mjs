// First-plot figure: in Chromium, the time from navigation to the first chart drawn (the app's
// `cw:first-plot` mark) on the build, gains and surface pages, cold (HTTP cache cleared) and warm
// (the same page opened just before), against the same page with its charts left out
// (`?noplot=1`, the `cw:plot-slot` mark: the page has its data and shows where the chart goes).
// Prints one JSON line: per page and cache state, the median of REPEATS runs with its range.
// Usage: node bench/first-plot.mjs [repeats]
import { execSync } from 'node:child_process';
import { startServer, launchBrowser, signIn } from '../tests/browser/lib.mjs';

const REPEATS = Number(process.argv[2] ?? 3);
execSync('node scripts/ensure-build.mjs', { stdio: ['ignore', 'ignore', 'inherit'] });

const spread = (values) => {
  const s = values.filter((v) => v != null).sort((a, b) => a - b);
  return s.length ? { median: s[s.length >> 1], min: s[0], max: s[s.length - 1], runs: values } : { median: null, min: null, max: null, runs: values };
};

const server = await startServer();
const browser = await launchBrowser();
const page = await browser.context.newPage();
const cdp = await browser.context.newCDPSession(page);
const results = {};
try {
  await signIn(page, server.url, 'pi');
  const { projects } = await (await page.request.get(`${server.url}/api/projects`)).json();
  const p = `/projects/${projects.find((x) => /PGM-free cathode/.test(x.name)).id}`;
  const pages = (process.env.FIRST_PLOT_PAGES ? (x) => x.filter(([n]) => process.env.FIRST_PLOT_PAGES.split(",").includes(n)) : (x) => x)([['build', `${p}/builds/10`], ['gains', `${p}/gains`], ['surface', `${p}/surface`]]);

  /** navigation → the mark, in ms (the mark's startTime is measured from the navigation's start) */
  async function timeTo(route, mark) {
    await page.goto(server.url + route, { waitUntil: 'commit' });
    try {
      await page.waitForFunction((name) => performance.getEntriesByName(name).length > 0, mark, { timeout: 30_000, polling: 20 });
    } catch {
      return null;
    }
    return page.evaluate((name) => performance.getEntriesByName(name)[0].startTime, mark);
  }

  for (const [name, route] of pages) {
    const out = {};
    for (const [variant, suffix, mark] of [['plot', '', 'cw:first-plot'], ['noplot', '?noplot=1', 'cw:plot-slot']]) {
      const cold = [];
      const warm = [];
      // interleaved: a cold open, then a warm one, REPEATS times
      for (let r = 0; r < REPEATS; r++) {
        await cdp.send('Network.clearBrowserCache');
        cold.push(await timeTo(route + suffix, mark));
        warm.push(await timeTo(route + suffix, mark));
      }
      out[variant] = { cold: spread(cold), warm: spread(warm) };
    }
    results[name] = out;
  }
} finally {
  await browser.close();
  await server.stop();
}
console.log(JSON.stringify(results));
