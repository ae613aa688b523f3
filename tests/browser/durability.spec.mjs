// Journey: a researcher uploads a long durability log (120,000 rows, invented) on a build page,
// sees it stored, opens it, and reads the degradation rate with its interval beside a drawn plot;
// then sets the break-in by hand and sees the rate recomputed.
import assert from 'node:assert/strict';
import { checkPage } from './lib.mjs';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

export default async function ({ url, browser, signIn }) {
  // 2,000 h at one row per minute, 8 µV/h after a 50 h break-in, small noise (invented log)
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-durability-'));
  const file = path.join(dir, 'C-012_long-log.csv');
  const lines = ['Time (h),Current density (A/cm2),Voltage (V)'];
  let seed = 7;
  const noise = () => { seed = (seed * 1103515245 + 12345) % 2147483648; return (seed / 2147483648 - 0.5) * 0.0016; };
  for (let i = 0; i < 120000; i++) {
    const h = i / 60;
    const v = 0.6 - 8e-6 * h - 0.015 * Math.exp(-h / 11) + noise();
    lines.push(`${h.toFixed(4)},0.2000,${v.toFixed(5)}`);
  }
  fs.writeFileSync(file, lines.join('\n') + '\n');

  const page = await browser.newPage();
  await signIn(page, 'researcher');
  await page.goto(`${url}/projects/1/builds/12`);
  await page.getByRole('heading', { name: /C-012/ }).waitFor();
  await checkPage(page, 'build C-012');
  await page.getByLabel('Choose curve files').setInputFiles(file);
  const results = page.getByRole('list', { name: 'Upload results' });
  await results.getByText('✓ stored').waitFor({ timeout: 60000 });
  assert.match(await results.innerText(), /durability curve, 120,000 points/);

  await page.reload();
  await page.getByRole('tab', { name: /durability/i }).click();
  await page.getByText(/showing 2,000 of 120,000 points/).waitFor();
  await page.locator('.js-plotly-plot .scatterlayer path.js-line').first().waitFor();
  const panel = await page.getByText(/µV\/h \(95 %/).first().innerText();
  const rate = Number(panel.match(/([\d.]+) µV\/h/)[1]);
  assert.ok(rate > 7 && rate < 9, `rate ${rate} µV/h should be near the invented 8 µV/h`);
  await checkPage(page, 'durability log on the build page');

  await page.getByLabel('Break-in ends at (h)').fill('200');
  await page.getByRole('button', { name: 'Set break-in' }).click();
  await page.getByText('(set by hand)').waitFor();
  await checkPage(page, 'durability log with a break-in set by hand');
  fs.rmSync(dir, { recursive: true, force: true });
}
