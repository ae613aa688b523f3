// Journey: a researcher opens the anode project's series page, gets the temperature series the
// recipe diff proposes (160/180/200 °C) with Eₐ, its 95 % interval and the Arrhenius plot, switches
// to the pressure series, then opens a build with an impedance spectrum and reads HFR and R_ct
// beside the Nyquist and Bode plots and the fit table.
import assert from 'node:assert/strict';
import path from 'node:path';
import { checkPage } from './lib.mjs';

export default async function ({ url, browser, signIn, artifacts }) {
  const page = await browser.newPage();
  await signIn(page, 'researcher');
  const projects = await (await page.request.get(`${url}/api/projects`)).json();
  const anode = (projects.projects ?? projects).find((p) => p.codePrefix === 'A');
  assert.ok(anode, 'the demo has an anode project');

  await page.goto(`${url}/projects/${anode.id}/series`);
  await page.getByRole('heading', { name: 'Series', exact: true }).waitFor();
  const result = page.getByTestId('series-result');
  await result.waitFor();
  const text = await result.innerText();
  const ea = Number(text.match(/([\d.]+) kJ\/mol/)[1]);
  assert.ok(ea > 50 && ea < 60, `Eₐ ${ea} kJ/mol should be near the invented 55 kJ/mol`);
  assert.match(text, /95 % interval [\d.]+ to [\d.]+ kJ\/mol/);
  await page.locator('.js-plotly-plot .scatterlayer path.js-line').first().waitFor();
  await page.getByRole('link', { name: 'A-010' }).first().waitFor();
  await checkPage(page, 'series page, temperature');
  await page.screenshot({ path: path.join(artifacts, 'series-temperature.png'), fullPage: true });

  await page.waitForLoadState('networkidle');
  await page.getByLabel('Series variable').selectOption('pressure');
  await page.getByText('Apparent reaction order').waitFor();
  await page.getByText(/depends on pressure: the interval|no dependence within noise: the interval/).waitFor();
  await checkPage(page, 'series page, pressure');
  await page.screenshot({ path: path.join(artifacts, 'series-pressure.png'), fullPage: true });

  const builds = await (await page.request.get(`${url}/api/projects/${anode.id}/builds`)).json();
  const a010 = (builds.builds ?? builds).find((b) => b.code === 'A-010');
  await page.goto(`${url}/projects/${anode.id}/builds/${a010.id}`);
  await page.getByRole('heading', { name: /A-010/ }).waitFor();
  // let the polarization plot finish drawing before its tab is left
  await page.locator('.js-plotly-plot .scatterlayer path.js-line').first().waitFor();
  await page.getByRole('tab', { name: /impedance/i }).click();
  await page.getByRole('figure', { name: /Nyquist plot/ }).waitFor();
  await page.locator('figure[aria-label^="Nyquist"] .js-plotly-plot .scatterlayer path.js-line').first().waitFor();
  const metrics = await page.getByRole('list', { name: 'Impedance metrics' }).innerText();
  assert.match(metrics, /HFR \(spectrum\)\s+\d+ mΩ·cm²/);
  assert.match(metrics, /R_ct\s+\d+ mΩ·cm²/);
  assert.match(await page.getByTestId('hfr-comparison').innerText(), /agree within 5 mΩ·cm²/);
  assert.match(await page.getByRole('table', { name: 'Equivalent-circuit fit' }).innerText(), /charge-transfer resistance R_ct/);
  const economy = await page.getByRole('list', { name: 'Precious-metal economy' }).innerText();
  assert.match(economy, /0\.400 mg\/cm²/); // the build's measured metal loading (invented)
  assert.match(economy, /[\d.]+ g\/kW/);
  assert.match(economy, /[\d.]+ EUR\/kW/);
  assert.match(economy, /price of 02 Nov 2026/);
  await checkPage(page, 'build page, impedance spectrum');
  await page.screenshot({ path: path.join(artifacts, 'build-impedance.png'), fullPage: true });

  // the builds table shows g/kW and cost per kW beside every build; the PI's settings hold the prices
  await page.goto(`${url}/projects/${anode.id}`);
  await page.getByRole('columnheader', { name: /Precious metal/ }).waitFor();
  await checkPage(page, 'builds table with the metal economy');
  await page.goto(`${url}/projects/${anode.id}/settings`);
  await page.getByRole('heading', { name: 'Precious-metal prices' }).waitFor();
  await checkPage(page, 'settings with metal prices (researcher, read only)');

  // the durability page compares the open-circuit holds and the time to failure onset
  await page.goto(`${url}/projects/${anode.id}/durability`);
  await page.getByRole('heading', { name: 'Open-circuit holds' }).waitFor();
  assert.match(await page.getByRole('list', { name: 'Builds that reached each milestone' }).innerText(), /reached 1000 h/);
  await page.locator('.js-plotly-plot .scatterlayer path.js-line').first().waitFor();
  await checkPage(page, 'durability page with holds and survival');
  // a viewport shot: resizing the page for a full-length one can fire a plot's resize handler after it left the page
  await page.screenshot({ path: path.join(artifacts, 'durability-holds-survival.png') });
}
