// `npm start` builds the client first when dist/ is missing or older than the sources.
import { existsSync, statSync, readdirSync } from 'node:fs';
import { execSync } from 'node:child_process';
import path from 'node:path';

function newest(dir) {
  let t = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, entry.name);
    t = Math.max(t, entry.isDirectory() ? newest(p) : statSync(p).mtimeMs);
  }
  return t;
}

const built = 'dist/index.html';
const stale = !existsSync(built) || statSync(built).mtimeMs < Math.max(newest('src'), newest('shared'), statSync('index.html').mtimeMs);
if (stale) {
  console.log('Building the client (dist/ is missing or older than src/)…');
  execSync('npx vite build', { stdio: 'inherit' });
}
