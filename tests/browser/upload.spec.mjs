// Journey: a researcher uploads two files shaped like different labs' exports on the project's
// Upload page; the one without units asks for its columns, the researcher confirms them and
// saves the mapping as an import profile and makes the new curve C-020's curve of record; its
// metrics then show in the table and in the compare view. A bad file is refused with its line and column named.
import assert from 'node:assert/strict';
import { checkPage } from './lib.mjs';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

export default async function ({ url, browser, signIn }) {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-upload-'));
  const good = path.join(dir, 'C-019_lab-c.csv');
  fs.copyFileSync(path.join('tests/fixtures/curves/lab-c-metadata-header.csv'), good);
  const bare = path.join(dir, 'C-020_bare.csv');
  fs.writeFileSync(bare, 'current,voltage\n0,0.95\n50,0.75\n100,0.70\n200,0.62\n400,0.52\n600,0.43\n');
  const bad = path.join(dir, 'C-019_bad.csv');
  fs.copyFileSync(path.join('tests/fixtures/curves/bad-700-volts.csv'), bad);

  const page = await browser.newPage();
  await signIn(page, 'researcher');
  await page.goto(`${url}/projects/1/upload`);
  await page.getByRole('heading', { name: 'Upload curves' }).waitFor();
  await checkPage(page, 'upload');
  await page.getByLabel('Choose curve files').setInputFiles([good, bare, bad]);
  // files named after a build code are matched to it
  assert.equal(await page.getByLabel('Build for C-019_lab-c.csv').inputValue() !== '', true);
  await page.getByRole('button', { name: /Upload 3 files/ }).click();

  const results = page.getByRole('list', { name: 'Upload results' });
  await results.getByText('✓ stored').first().waitFor();
  await results.getByText('? confirm columns').waitFor();
  await results.getByText(/700 V is not a possible cell voltage/).waitFor();
  assert.match(await results.innerText(), /line \d+/);
  await checkPage(page, 'upload results with a column check');

  // confirm the ambiguous file: current is in mA/cm², voltage in V; keep it as a profile
  await page.getByLabel('Current unit').selectOption('mA/cm2');
  await page.getByLabel('Profile name').fill('bare two-column export');
  await page.getByRole('button', { name: 'Use these columns' }).click();
  await page.waitForFunction(() => document.querySelectorAll('[aria-label="Upload results"] li').length === 3 && [...document.querySelectorAll('[aria-label="Upload results"] li')].filter((li) => li.textContent.includes('✓ stored')).length === 2);

  // C-020 already had a polarization curve: the new one is stored beside it, and becomes the
  // build's value only when chosen
  const c020 = page.getByRole('group', { name: 'Result for C-020_bare.csv' });
  assert.match(await c020.innerText(), /already has a polarization curve of record/);
  await c020.getByRole('button', { name: 'Make this the curve of record' }).click();
  await c020.getByRole('status').getByText(/is now the polarization curve of record of C-020/).waitFor();

  // the build now shows its metrics at the reference point
  await page.goto(`${url}/projects/1`);
  await page.getByLabel('Search builds').fill('C-020');
  const row = page.getByRole('row').filter({ hasText: 'C-020' });
  await row.waitFor();
  assert.match(await row.innerText(), /62\d/); // V at 0.2 A/cm² = 0.62 V from the file, in mV
  await checkPage(page, 'builds table after uploads');

  await page.goto(`${url}/projects/1/compare?builds=19,20`);
  await page.getByRole('table').getByText('C-020').waitFor();
  await page.locator('.js-plotly-plot').first().waitFor();
  await checkPage(page, 'compare');
  fs.rmSync(dir, { recursive: true, force: true });
}
