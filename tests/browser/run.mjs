// Runs every tests/browser/*.spec.mjs in Debian's Chromium against its own freshly seeded
// server. Without Chromium the run says so; under CI (CI=true) that is a failure.
import fs from 'node:fs';
import path from 'node:path';
import { execSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { chromiumAvailable, CHROMIUM, startServer, launchBrowser, signIn } from './lib.mjs';

const here = path.dirname(fileURLToPath(import.meta.url));
const filter = process.argv[2];
const specs = fs.readdirSync(here).filter((f) => f.endsWith('.spec.mjs') && (!filter || f.includes(filter))).sort();

if (!chromiumAvailable()) {
  console.log(`Browser tests: Chromium not found at ${CHROMIUM}. Install it with "apt-get install -y chromium" (or set CHROMIUM_PATH).`);
  if (process.env.CI) process.exit(1);
  console.log(`0 passed, 0 failed, ${specs.length} skipped`);
  process.exit(0);
}

// The server serves the built client: build it when missing or stale.
execSync('node scripts/ensure-build.mjs', { stdio: 'inherit' });

let passed = 0;
let failed = 0;
const artifacts = path.join(here, '..', '.artifacts');
fs.mkdirSync(artifacts, { recursive: true });
for (const spec of specs) {
  const started = Date.now();
  const server = await startServer();
  const browser = await launchBrowser();
  const errors = [];
  const pages = [];
  browser.context.on('page', (page) => {
    pages.push(page);
    page.on('pageerror', (e) => errors.push(e.message));
  });
  try {
    const mod = await import(path.join(here, spec));
    await mod.default({ url: server.url, browser: browser.context, signIn: (page, who) => signIn(page, server.url, who), artifacts });
    if (errors.length) throw new Error(`uncaught page errors: ${errors.join(' | ')}`);
    passed++;
    console.log(`✓ ${spec} (${((Date.now() - started) / 1000).toFixed(1)} s)`);
  } catch (error) {
    failed++;
    console.log(`✗ ${spec}: ${error instanceof Error ? error.stack : error}`);
    for (const [i, page] of pages.entries()) {
      try { await page.screenshot({ path: path.join(artifacts, `${spec}-${i}.png`), fullPage: true }); } catch {}
    }
    console.log(server.output().split('\n').slice(-20).join('\n'));
  } finally {
    await browser.close();
    await server.stop();
  }
}
console.log(`Browser tests: ${passed} passed, ${failed} failed`);
process.exit(failed ? 1 : 0);
