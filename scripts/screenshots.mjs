// Takes screenshots of the main pages for a person to look at: node scripts/screenshots.mjs [outDir]
import { startServer, launchBrowser, signIn } from '../tests/browser/lib.mjs';
import fs from 'node:fs';

const out = process.argv[2] ?? '.tmp/shots';
const only = process.argv[3];
fs.mkdirSync(out, { recursive: true });
const server = await startServer();
const browser = await launchBrowser();
const page = await browser.context.newPage();
page.on('pageerror', (e) => console.log('PAGE ERROR', e.message));
page.on('console', (m) => { if (m.type() === 'error') console.log('CONSOLE', m.text()); });
try {
  await signIn(page, server.url, process.env.WHO ?? 'pi');
  const shots = [
    ['home', '/'],
    ['builds', '/projects/1'],
    ['build', '/projects/1/builds/10'],
    ['build-durability', '/projects/1/builds/7'],
    ['build-new', '/projects/1/builds/new?parent=10'],
    ['compare', '/projects/1/compare?builds=1,4,6,7,10'],
    ['upload', '/projects/1/upload'],
    ['settings', '/projects/1/settings'],
    ['gains', '/projects/1/gains'],
    ['benchmark', '/projects/1/benchmark'],
    ['lots', '/projects/1/lots'],
    ['lot', '/lots/2'],
    ['lineage', '/projects/1/lineage'],
    ['durability', '/projects/1/durability'],
    ['series', '/projects/2/series'],
    ['durability-anode', '/projects/2/durability'],
    ['account', '/account'],
    ['surface', '/projects/1/surface'],
    ['plan', '/projects/1/plan'],
    ['admin-people', '/admin/people'],
    ['admin-outbox', '/admin/outbox'],
    ['admin-audit', '/admin/audit'],
  ];
  for (const [name, route] of shots) {
    if (only && !only.split(',').includes(name)) continue;
    await page.goto(server.url + route);
    await page.waitForLoadState('networkidle');
    await page.waitForTimeout(1200);
    await page.screenshot({ path: `${out}/${name}.png`, fullPage: true });
    console.log('shot', name);
  }
} finally {
  await browser.close();
  await server.stop();
}
