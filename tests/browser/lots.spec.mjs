// Journey: a researcher records a scale-up lot with its metal content, keeps its certificate with
// it, and makes a build from it: the build form shows the metal loading that follows from the lot.
import assert from 'node:assert/strict';
import { checkPage } from './lib.mjs';

export default async function ({ url, browser, signIn }) {
  const page = await browser.newPage();
  await page.setViewportSize({ width: 1400, height: 1000 });
  await signIn(page, 'researcher');
  await page.getByRole('heading', { name: /Good to see you/ }).waitFor();
  const { projects } = await (await page.request.get(`${url}/api/projects`)).json();
  const cathode = projects.find((p) => /PGM-free cathode/.test(p.name));

  await page.goto(`${url}/projects/${cathode.id}/lots`);
  await page.getByRole('heading', { name: 'Catalyst lots' }).waitFor();
  const form = page.getByRole('form', { name: 'Lot form' });
  await form.getByLabel('Lot name').fill('FNC-26-09');
  await form.getByLabel('Maker (lab or supplier)').fill('own scale-up reactor');
  await form.getByLabel('Batch size (g)').fill('120');
  await form.getByLabel('Metal content (wt %)').fill('1.9');
  await page.getByRole('button', { name: 'Record lot' }).click();
  await page.getByRole('link', { name: 'FNC-26-09' }).click();
  await page.getByRole('heading', { name: 'Lot FNC-26-09' }).waitFor();

  // its certificate, kept with the lot and downloadable
  await page.getByLabel('Add a file to this lot').setInputFiles({ name: 'FNC-26-09-icp.txt', mimeType: 'text/plain', buffer: Buffer.from('ICP-OES (invented): Fe 1.9 wt %\n') });
  await page.getByRole('link', { name: 'FNC-26-09-icp.txt' }).waitFor();
  await checkPage(page, 'lot page with a certificate');

  // a build made from it: metal loading follows from catalyst loading × metal content
  await page.goto(`${url}/projects/${cathode.id}/builds/new`);
  const build = page.getByRole('form', { name: 'Build form' });
  await build.getByLabel('Catalyst lot').selectOption({ label: 'FNC-26-09 · 1.9 wt % metal' });
  await build.getByLabel('Catalyst loading (mg/cm²)').fill('3');
  await build.getByLabel('Metal loading (mg/cm²)').fill('');
  // derived by hand: 3.00 mg/cm² × 1.9 wt % = 0.057 mg/cm²
  await page.getByText('From lot FNC-26-09: 3.00 mg/cm² × 1.9 wt % = 0.057 mg/cm², used unless you enter a measured value.').waitFor();
  await build.getByLabel('Status').selectOption('planned');
  await page.getByRole('button', { name: 'Create build' }).click();
  await page.waitForURL(/\/builds\/\d+$/);
  // the form also has a "Recipe" heading, so wait for the build page's own text, not a heading
  await page.waitForFunction(() => /Catalyst lot\s+FNC-26-09/.test(document.querySelector('main')?.innerText ?? ''));
  assert.match(await page.locator('main').innerText(), /Catalyst lot\s+FNC-26-09/);
  await page.close();
}
