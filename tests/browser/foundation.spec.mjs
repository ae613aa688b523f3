// Journey: a researcher signs in, opens a project, creates a build through the form (an
// out-of-bounds value is refused inline first), and finds it in the builds table.
import assert from 'node:assert/strict';
import { checkPage } from './lib.mjs';

export default async function ({ url, browser, signIn }) {
  const page = await browser.newPage();
  await signIn(page, 'researcher');
  await page.getByRole('heading', { name: /Good to see you/ }).waitFor();
  await checkPage(page, 'home');
  await page.getByRole('link', { name: /PGM-free cathode for 180 °C stacks/ }).first().click();
  await page.waitForURL(/\/projects\/\d+$/);
  const table = page.getByRole('table', { name: 'Builds' });
  await table.waitFor();
  assert.ok(await table.getByRole('link', { name: 'C-010' }).isVisible());
  await checkPage(page, 'builds table');

  await page.getByRole('link', { name: 'New build' }).click();
  await page.waitForURL(/builds\/new/);
  await page.getByLabel('Parent build').waitFor();
  await checkPage(page, 'new build');
  await page.getByLabel('Parent build').selectOption({ label: 'C-010 — cell at 180 °C' });
  await page.getByLabel('Change note').fill('binder 30 → 45 wt %');
  await page.getByLabel('PTFE binder (wt %)').fill('45');
  await page.getByRole('button', { name: 'Create build' }).click();
  // 45 wt % is outside the factor's 10–40 bounds: the form says so beside the field.
  await page.getByText('PTFE binder: 45 is outside 10–40 wt %').waitFor();
  await page.getByLabel('PTFE binder (wt %)').fill('35');
  await page.getByLabel('Change note').fill('binder 30 → 35 wt %');
  await page.getByRole('button', { name: 'Create build' }).click();
  await page.waitForURL(/builds\/\d+$/);
  await page.getByRole('heading', { name: /C-024/ }).waitFor();
  await page.getByText('binder 30 → 35 wt %').first().waitFor();
  await checkPage(page, 'build C-024');

  await page.getByRole('link', { name: 'PGM-free cathode for 180 °C stacks' }).first().click();
  await page.waitForURL(/\/projects\/\d+$/);
  await page.getByLabel('Search builds').fill('C-024');
  const row = page.getByRole('row').filter({ hasText: 'C-024' });
  await row.waitFor();
  assert.match(await row.innerText(), /35/);
  assert.match(await row.innerText(), /C-010/);
}
