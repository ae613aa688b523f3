// Browser-test plumbing: start Cellwright on a free port with a fresh seeded database, launch
// Debian's Chromium through playwright-core, sign in as a demo person.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import net from 'node:net';
import { chromium } from 'playwright-core';

export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

export function chromiumAvailable() {
  return fs.existsSync(CHROMIUM);
}

async function freePort() {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address();
      server.close(() => resolve(port));
    });
    server.on('error', reject);
  });
}

export async function startServer({ seed = true } = {}) {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-browser-'));
  const port = await freePort();
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    env: { ...process.env, PORT: String(port), DATABASE_PATH: path.join(dir, 'db.sqlite'), UPLOADS_DIR: path.join(dir, 'uploads'), LOG_LEVEL: 'warn', SEED_DEMO: seed ? 'auto' : 'never', LOGIN_RATE_LIMIT: '1000' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout.on('data', (d) => (output += d));
  child.stderr.on('data', (d) => (output += d));
  const url = `http://127.0.0.1:${port}`;
  const deadline = Date.now() + 60_000;
  for (;;) {
    if (child.exitCode != null) throw new Error(`server exited early:\n${output}`);
    try {
      const r = await fetch(`${url}/api/health`);
      if (r.ok) break;
    } catch {}
    if (Date.now() > deadline) throw new Error(`server did not start in 60 s:\n${output}`);
    await new Promise((r) => setTimeout(r, 250));
  }
  return {
    url,
    dir,
    output: () => output,
    async stop() {
      child.kill('SIGTERM');
      await new Promise((r) => child.once('exit', r));
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}

export async function launchBrowser({ args = [] } = {}) {
  const profile = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM,
    headless: true,
    viewport: { width: 1440, height: 900 },
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage', ...args],
  });
  return {
    context,
    async close() {
      await context.close();
      fs.rmSync(profile, { recursive: true, force: true });
    },
  };
}

export async function signIn(page, url, who) {
  await page.goto(`${url}/sign-in`);
  await page.getByLabel('E-mail').fill(`${who}@demo.cellwright.test`);
  await page.getByLabel('Password').fill('demo-password');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
}

// ---- page checks every spec runs on every page it visits

import { AxeBuilder } from '@axe-core/playwright';

/**
 * Runs axe-core on the page as it is now and fails on any serious or critical violation, naming
 * the rule, its help text and the first offending elements. `label` names the page in the message.
 */
export async function checkA11y(page, label, { exclude = [] } = {}) {
  await page.waitForLoadState('networkidle').catch(() => {});
  let builder = new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'best-practice']);
  for (const selector of exclude) builder = builder.exclude(selector);
  const result = await builder.analyze();
  const bad = result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  if (bad.length) {
    const text = bad.map((v) => `  [${v.impact}] ${v.id}: ${v.help}\n${v.nodes.slice(0, 4).map((n) => `      ${n.target.join(' ')} — ${n.failureSummary?.split('\n').slice(0, 2).join(' ')}`).join('\n')}`).join('\n');
    throw new Error(`accessibility (${label}): ${bad.length} serious or critical violation${bad.length > 1 ? 's' : ''}\n${text}`);
  }
  return result;
}

/** Words that look like camelCase but are units or trade terms. */
const CAMEL_ALLOWED = new Set(['kPa', 'hPa', 'mPa', 'mAh', 'kHz', 'mHz']);

/**
 * Fails when any visible text node reads "undefined" or "NaN", or holds a camelCase word (an
 * internal key such as vAtRef or activationTemp). Text inside <code> is a deliberate identifier
 * (API keys on the settings page) and is skipped, as are form controls' values.
 */
export async function checkNoDeveloperText(page, label) {
  const found = await page.evaluate((allowed) => {
    const problems = [];
    const walker = document.createTreeWalker(document.body, NodeFilter.SHOW_TEXT);
    for (let node = walker.nextNode(); node; node = walker.nextNode()) {
      // addresses (an invitation link in an e-mail) are not words
      const text = (node.nodeValue ?? '').replace(/https?:\/\/\S+|(?<!\S)\/\S+/g, ' ');
      if (!text.trim()) continue;
      const parent = node.parentElement;
      if (!parent || parent.closest('code, kbd, script, style, noscript, textarea, option, [hidden], [data-identifier]')) continue;
      const style = getComputedStyle(parent);
      if (style.display === 'none' || style.visibility === 'hidden') continue;
      if (/\bundefined\b/.test(text)) problems.push(`"undefined" in “${text.trim().slice(0, 80)}”`);
      if (/\bNaN\b/.test(text)) problems.push(`"NaN" in “${text.trim().slice(0, 80)}”`);
      for (const word of text.match(/\b[a-z][a-z0-9]*[A-Z][A-Za-z0-9]*\b/g) ?? []) {
        if (!/[A-Z][a-z]/.test(word) || allowed.includes(word)) continue;
        problems.push(`camelCase "${word}" in “${text.trim().slice(0, 80)}”`);
      }
    }
    return [...new Set(problems)];
  }, [...CAMEL_ALLOWED]);
  if (found.length) throw new Error(`developer text on screen (${label}):\n  ${found.slice(0, 12).join('\n  ')}`);
}

/**
 * Every chart on the page: the plotting library's toolbar is not shown, nothing in it links to
 * another site, and each axis title and plot title lies inside its chart (none clipped).
 */
export async function checkPlots(page, label) {
  const problems = await page.evaluate(() => {
    const out = [];
    const visible = (el) => { const r = el.getBoundingClientRect(); return r.width > 0 && r.height > 0 && getComputedStyle(el).visibility !== 'hidden' && getComputedStyle(el).display !== 'none'; };
    for (const bar of document.querySelectorAll('.modebar, .modebar-container')) if (visible(bar)) out.push('the plotting library\'s toolbar is shown');
    for (const a of document.querySelectorAll('a[href]')) {
      const href = new URL(a.getAttribute('href'), location.href);
      if (href.origin !== location.origin && href.protocol.startsWith('http')) out.push(`link to another site: ${href.href}`);
    }
    for (const plot of document.querySelectorAll('.js-plotly-plot')) {
      const svg = plot.querySelector('.main-svg');
      if (!svg) continue;
      const box = svg.getBoundingClientRect();
      for (const title of plot.querySelectorAll('.g-gtitle text, .g-xtitle text, .g-ytitle text, .g-y2title text, .g-x2title text')) {
        if (!title.textContent.trim()) continue;
        const r = title.getBoundingClientRect();
        if (r.left < box.left - 1 || r.right > box.right + 1 || r.top < box.top - 1 || r.bottom > box.bottom + 1) {
          out.push(`title “${title.textContent.trim().slice(0, 60)}” runs outside its ${Math.round(box.width)} px chart`);
        }
      }
    }
    return [...new Set(out)];
  });
  if (problems.length) throw new Error(`charts (${label}):\n  ${problems.join('\n  ')}`);
}

/**
 * All checks, for a page that has finished loading. `reportOnly` prints the problems instead of
 * failing (for a page another branch is rebuilding, until it is merged).
 */
export async function checkPage(page, label, { reportOnly = false, ...options } = {}) {
  for (const check of [() => checkA11y(page, label, options), () => checkNoDeveloperText(page, label), () => checkPlots(page, label)]) {
    try {
      await check();
    } catch (error) {
      if (!reportOnly) throw error;
      console.log(`  (reported, not failed) ${error.message}`);
    }
  }
}
