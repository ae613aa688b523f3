// Helpers shared by the benchmark scripts: child processes, a signed-in fetch, RSS sampling.
import { spawn } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const BENCH_DIR = path.dirname(fileURLToPath(import.meta.url));
export const ROOT = path.resolve(BENCH_DIR, '..');

/** Runs a bench script in its own Node process (so its memory and CPU are its own) and returns its last JSON line. */
export function runChild<T>(script: string, args: string[] = [], options: { timeoutMs?: number; env?: Record<string, string> } = {}): Promise<T> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--expose-gc', '--import', 'tsx', path.join(BENCH_DIR, script), ...args], { cwd: ROOT, stdio: ['ignore', 'pipe', 'inherit'], env: { ...process.env, LOG_LEVEL: 'silent', ...options.env } });
    let out = '';
    child.stdout.on('data', (chunk: Buffer) => { out += chunk.toString(); });
    const timer = setTimeout(() => { child.kill('SIGKILL'); reject(new Error(`${script} took longer than ${options.timeoutMs} ms`)); }, options.timeoutMs ?? 180_000);
    child.on('error', reject);
    child.on('exit', (code) => {
      clearTimeout(timer);
      const last = out.trim().split('\n').filter((l) => l.startsWith('{')).pop();
      if (code !== 0 || !last) return reject(new Error(`${script} exited with ${code}: ${out.slice(-2000)}`));
      resolve(JSON.parse(last) as T);
    });
  });
}

/** Starts a bench script that serves HTTP; resolves with the JSON line it prints once listening, and a stop function. */
export function startChildServer<T>(script: string, args: string[] = []): Promise<{ info: T; stop: () => Promise<void> }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', path.join(BENCH_DIR, script), ...args], { cwd: ROOT, stdio: ['pipe', 'pipe', 'inherit'], env: { ...process.env, LOG_LEVEL: 'silent' } });
    let out = '';
    let started = false;
    const timer = setTimeout(() => { if (!started) { child.kill('SIGKILL'); reject(new Error(`${script} did not start within 120 s`)); } }, 120_000);
    child.stdout.on('data', (chunk: Buffer) => {
      out += chunk.toString();
      const line = out.split('\n').find((l) => l.startsWith('{'));
      if (line && !started) {
        started = true;
        clearTimeout(timer);
        resolve({
          info: JSON.parse(line) as T,
          stop: () => new Promise((done) => { child.once('exit', () => done()); child.stdin.end(); setTimeout(() => child.kill('SIGKILL'), 5000).unref(); }),
        });
      }
    });
    child.on('exit', (code) => { if (!started) reject(new Error(`${script} exited with ${code} before listening: ${out.slice(-2000)}`)); });
  });
}

/** Keeps the process alive until its parent closes stdin, then runs the cleanup and exits. */
export function exitWhenParentCloses(cleanup: () => void) {
  process.stdin.resume();
  process.stdin.on('end', () => { cleanup(); process.exit(0); });
}

/** Samples resident memory every few ms; `peak` is the highest seen (plus the kernel's own max RSS). */
export function rssSampler(everyMs = 5) {
  let peak = process.memoryUsage.rss();
  const timer = setInterval(() => { const rss = process.memoryUsage.rss(); if (rss > peak) peak = rss; }, everyMs);
  return {
    stop() {
      clearInterval(timer);
      const rss = process.memoryUsage.rss();
      if (rss > peak) peak = rss;
      return peak;
    },
  };
}

/** Signs in through the real API and returns the headers a browser would send (cookie + CSRF). */
export async function signIn(baseUrl: string, email: string, password = 'demo-password') {
  const res = await fetch(`${baseUrl}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password }) });
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${await res.text()}`);
  const body = (await res.json()) as { csrfToken: string };
  const cookies = res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
  return { cookie: cookies, csrf: body.csrfToken };
}

export const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
};
