// Journey: a PI imports a published reference curve with its provenance and makes it the benchmark,
// sees it on a build's polarization plot (and hides it), reads the builds table as differences from
// it, then makes a build the benchmark from its page; a partner sees the benchmark but cannot set it.
import assert from 'node:assert/strict';
import path from 'node:path';
import { checkPage } from './lib.mjs';

// an invented reference curve (digitised from an invented report)
const REFERENCE = 'Current density (A/cm2),Voltage (V)\n0,0.97\n0.05,0.73\n0.1,0.68\n0.2,0.61\n0.3,0.56\n0.4,0.51\n0.6,0.43\n';

async function traceNames(page) {
  return page.locator('.js-plotly-plot').first().evaluate((el) => (el.data ?? []).map((t) => t.name));
}

export default async function ({ url, browser, signIn, artifacts }) {
  const page = await browser.newPage();
  await page.setViewportSize({ width: 1400, height: 1000 });
  await signIn(page, 'pi');
  await page.getByRole('heading', { name: /Good to see you/ }).waitFor();
  const { projects } = await (await page.request.get(`${url}/api/projects`)).json();
  const cathode = projects.find((p) => /PGM-free cathode/.test(p.name));
  const builds = await (await page.request.get(`${url}/api/projects/${cathode.id}/builds?limit=500`)).json();
  const list = Array.isArray(builds) ? builds : builds.builds ?? builds.items;
  const c010 = list.find((b) => b.code === 'C-010');

  // The benchmark page: the demo's benchmark build, and the invented round-robin curve.
  await page.goto(`${url}/projects/${cathode.id}/benchmark`);
  await page.getByRole('heading', { name: 'Benchmark', exact: true }).waitFor();
  await page.getByText('Benchmark: C-001').first().waitFor();
  await page.getByText('Round-robin cathode MEA (invented)').waitFor();

  // Import a reference curve with its provenance and make it the benchmark.
  const form = page.getByRole('form', { name: 'Reference curve form' });
  await form.getByLabel('Curve file').setInputFiles({ name: 'published-cathode.csv', mimeType: 'text/csv', buffer: Buffer.from(REFERENCE) });
  await form.getByLabel('Name on plots').fill('Published cathode, invented journal');
  await form.getByLabel('Source (provenance)').fill('Invented journal of electrodes, 2025, figure 2');
  await form.getByLabel('Date of the source').fill('2025-04-02');
  await form.getByLabel('Cell temperature (°C)').fill('160');
  await form.getByLabel('Catalyst loading (mg/cm²)').fill('3');
  await form.getByLabel('Make it the project’s benchmark').check();
  await page.getByRole('button', { name: 'Import reference curve' }).click();
  await page.getByText('Benchmark: Published cathode, invented journal').first().waitFor();
  assert.match(await page.locator('main').innerText(), /Invented journal of electrodes, 2025, figure 2/);
  await checkPage(page, 'benchmark page');
  await page.screenshot({ path: path.join(artifacts, 'benchmark-page.png'), fullPage: true });

  // A build's plot shows the benchmark, on by default; the switch hides it.
  await page.goto(`${url}/projects/${cathode.id}/builds/${c010.id}`);
  await page.locator('.js-plotly-plot').first().waitFor();
  await page.waitForFunction(() => (document.querySelector('.js-plotly-plot')?.data ?? []).some((t) => /^Benchmark: /.test(t.name)));
  assert.ok((await traceNames(page)).includes('Benchmark: Published cathode, invented journal'));
  await page.getByLabel('Show benchmark').uncheck();
  await page.waitForFunction(() => !(document.querySelector('.js-plotly-plot')?.data ?? []).some((t) => /^Benchmark: /.test(t.name)));

  // The builds table as differences from the benchmark: C-010's row shows its V at j_ref less the benchmark's
  await page.goto(`${url}/projects/${cathode.id}`);
  await page.getByRole('table', { name: 'Builds' }).waitFor();
  await page.getByLabel(/Values as difference from benchmark/).check();
  await page.getByRole('columnheader', { name: /Δ V at j_ref/ }).waitFor();
  const bench = (await (await page.request.get(`${url}/api/projects/${cathode.id}/benchmark`)).json()).benchmark;
  // derived by hand: the file's step at j_ref = 0.2 A/cm² reads 0.61 V
  assert.ok(Math.abs(bench.values.vAtRef - 0.61) < 0.0015, `the benchmark reads 0.61 V at j_ref (${bench.values.vAtRef})`);
  const row = page.getByRole('row', { name: /^Select C-010 / });
  const expected = Math.round((c010.values.vAtRef - bench.values.vAtRef) * 1000);
  const text = expected === 0 ? '±0' : `${expected > 0 ? '+' : '−'}${Math.abs(expected)}`;
  assert.match(await row.innerText(), new RegExp(text.replace('+', '\\+')));
  await checkPage(page, 'builds table as differences');

  // Make C-010 the benchmark from its page: asked first, then badged.
  await page.goto(`${url}/projects/${cathode.id}/builds/${c010.id}`);
  await page.getByRole('button', { name: 'Mark as benchmark' }).click();
  await page.getByRole('dialog').getByRole('button', { name: 'Make C-010 the benchmark' }).click();
  await page.getByText('Benchmark', { exact: true }).first().waitFor();
  await page.getByRole('button', { name: 'Stop using as benchmark' }).waitFor();
  // its own curve is not drawn twice
  await page.locator('.js-plotly-plot').first().waitFor();
  assert.ok(!(await traceNames(page)).some((n) => /^Benchmark: /.test(n)), 'the benchmark build does not show itself twice');

  // A partner sees the benchmark on the benchmark page but has no way to set it.
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.waitForURL(/\/sign-in/);
  await signIn(page, 'partner');
  await page.goto(`${url}/projects/${cathode.id}/benchmark`);
  await page.getByText('Benchmark: C-010').first().waitFor();
  assert.equal(await page.getByRole('button', { name: 'Make benchmark' }).count(), 0);
  assert.equal(await page.getByRole('form', { name: 'Reference curve form' }).count(), 0);
  await page.close();
}
