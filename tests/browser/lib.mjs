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

export async function launchBrowser() {
  const profile = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM,
    headless: true,
    viewport: { width: 1440, height: 900 },
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage'],
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
