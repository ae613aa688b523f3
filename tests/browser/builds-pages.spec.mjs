// Journey: a project of more builds than one page reads its list a page at a time; Next brings
// the next page from the server.
import assert from 'node:assert/strict';
import { checkPage } from './lib.mjs';

export default async function ({ url, browser, signIn }) {
  const page = await browser.newPage();
  await page.setViewportSize({ width: 1400, height: 1000 });
  await signIn(page, 'pi');
  await page.getByRole('heading', { name: /Good to see you/ }).waitFor();
  const me = await (await page.request.get(`${url}/api/auth/me`)).json();
  const headers = { 'x-csrf-token': me.csrfToken ?? '' };
  const made = await page.request.post(`${url}/api/projects`, { data: { name: 'Paging check', settings: { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: false, loadingBasis: 'catalyst' } }, headers });
  const projectId = (await made.json()).project.id;
  for (let k = 1; k <= 130; k++) {
    const res = await page.request.post(`${url}/api/projects/${projectId}/builds`, { data: { code: `P-${String(k).padStart(3, '0')}`, factors: {}, status: 'planned' }, headers });
    assert.equal(res.status(), 201, await res.text());
  }
  const asked = [];
  page.on('request', (r) => { if (r.url().includes(`/api/projects/${projectId}/builds`)) asked.push(new URL(r.url()).search); });
  await page.goto(`${url}/projects/${projectId}`);
  await page.getByRole('table', { name: 'Builds' }).waitFor();
  await page.getByText('Page 1 of 2').waitFor();
  assert.match(await page.locator('main').innerText(), /1–100 of 130 builds/);
  assert.ok(asked.every((q) => /limit=100/.test(q)), `the list is asked for a page at a time (${asked.join(' ')})`);
  await page.getByRole('button', { name: 'Next' }).click();
  await page.getByText('Page 2 of 2').waitFor();
  await page.getByRole('link', { name: 'P-130' }).waitFor();
  assert.match(await page.locator('main').innerText(), /101–130 of 130 builds/);
  await checkPage(page, 'builds table, second page');
  await page.close();
}
