// The JavaScript and CSS each page loads, measured in Chromium: open every page as the demo PI,
// wait until it has drawn, list the scripts and style sheets it fetched (Resource Timing) and
// size them from dist/ as served and gzip-compressed (level 9). The surface page is measured twice:
// as it opens, and after its 3-D view is switched on (the only view that loads the 3-D bundle).
// Usage: node scripts/route-bytes.mjs [--json file]
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import { execSync } from 'node:child_process';
import { startServer, launchBrowser, signIn } from '../tests/browser/lib.mjs';

execSync('node scripts/ensure-build.mjs', { stdio: 'inherit' });
const jsonOut = process.argv.includes('--json') ? process.argv[process.argv.indexOf('--json') + 1] : null;

const sizes = new Map();
function sizeOf(urlPath) {
  if (!sizes.has(urlPath)) {
    const file = path.join('dist', urlPath);
    const bytes = fs.existsSync(file) ? fs.readFileSync(file) : Buffer.alloc(0);
    sizes.set(urlPath, { raw: bytes.length, gzip: zlib.gzipSync(bytes, { level: 9 }).length });
  }
  return sizes.get(urlPath);
}

const server = await startServer();
// software WebGL, so the 3-D view can be drawn (and its bundle loaded) on a machine without a GPU
const browser = await launchBrowser({ args: ['--use-angle=swiftshader', '--enable-unsafe-swiftshader'] });
const page = await browser.context.newPage();
const rows = [];
try {
  await signIn(page, server.url, 'pi');
  const { projects } = await (await page.request.get(`${server.url}/api/projects`)).json();
  const p = `/projects/${projects.find((x) => /PGM-free cathode/.test(x.name)).id}`;
  const routes = [
    ['sign-in', '/sign-in', { signedOut: true }],
    ['home', '/'],
    ['builds table', p],
    ['build (polarization plot)', `${p}/builds/10`, { plot: true }],
    ['upload', `${p}/upload`],
    ['compare', `${p}/compare`, { plot: true }],
    ['gains', `${p}/gains`, { plot: true }],
    ['lineage', `${p}/lineage`],
    ['durability', `${p}/durability`, { plot: true }],
    ['surface (as it opens)', `${p}/surface`],
    ['surface, 3-D view', `${p}/surface`, { threeD: true }],
    ['plan', `${p}/plan`],
    ['settings', `${p}/settings`],
    ['admin: people', '/admin/people'],
  ];
  for (const [name, route, options = {}] of routes) {
    const context = options.signedOut ? (await launchBrowser()).context : null;
    const tab = context ? await context.newPage() : page;
    await tab.goto(server.url + route);
    await tab.waitForLoadState('networkidle');
    if (options.plot) await tab.locator('.js-plotly-plot .main-svg').first().waitFor({ timeout: 30_000 }).catch(() => console.log(`(no plot drawn on ${name})`));
    if (options.threeD) {
      const fit = tab.getByRole('button', { name: /^Fit/ });
      if (await fit.count()) await fit.first().click();
      const toggle = tab.getByRole('radio', { name: /3-D/ });
      await toggle.first().waitFor({ timeout: 30_000 });
      await toggle.first().click();
      await tab.locator('.js-plotly-plot .gl-container, [role="note"]').first().waitFor({ timeout: 60_000 });
    }
    await tab.waitForLoadState('networkidle');
    const urls = await tab.evaluate(() => [...new Set(performance.getEntriesByType('resource').map((e) => new URL(e.name).pathname).filter((u) => /\.(js|css)$/.test(u)))]);
    const files = urls.map((u) => ({ url: u, ...sizeOf(u) }));
    const sum = (k, f = () => true) => files.filter(f).reduce((a, x) => a + x[k], 0);
    const isJs = (x) => x.url.endsWith('.js');
    rows.push({
      page: name,
      jsGzip: sum('gzip', isJs), jsRaw: sum('raw', isJs), cssGzip: sum('gzip', (x) => !isJs(x)),
      plot2d: files.some((x) => /\/plotly-[\w-]+\.js$/.test(x.url) && !/plotly-3d/.test(x.url)),
      plot3d: files.some((x) => /plotly-3d/.test(x.url)),
      files: files.length,
    });
    if (context) await context.close();
  }
} finally {
  await browser.close();
  await server.stop();
}

const kB = (n) => (n / 1000).toFixed(1);
console.log('\n| page | JS gzip (kB) | JS raw (kB) | CSS gzip (kB) | 2-D plot bundle | 3-D plot bundle |');
console.log('| --- | ---: | ---: | ---: | --- | --- |');
for (const r of rows) console.log(`| ${r.page} | ${kB(r.jsGzip)} | ${kB(r.jsRaw)} | ${kB(r.cssGzip)} | ${r.plot2d ? 'loaded' : '—'} | ${r.plot3d ? 'loaded' : '—'} |`);
if (jsonOut) fs.writeFileSync(jsonOut, JSON.stringify({ measuredAt: new Date().toISOString(), rows }, null, 2));
