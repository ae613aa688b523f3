// Journey: a researcher drops a partner's file on a build page; the file states 180 °C, oxygen
// and a gauge back-pressure while the build records otherwise. The differences show under the
// curve, the researcher says the file's temperature is right, and the build's test conditions
// take it. A file with volts under a mV header asks once, proposing V, and goes in as confirmed.
import assert from 'node:assert/strict';

export default async function ({ url, browser, signIn }) {
  const page = await browser.newPage();
  await signIn(page, 'researcher');
  // C-021: 185 °C, H2/air, 0 kPa(g) in the demo lab
  await page.goto(`${url}/projects/1/builds/21`);
  await page.getByRole('heading', { name: /Curves and metrics/ }).waitFor();
  await page.getByLabel('Choose curve files').setInputFiles(['tests/fixtures/curves/shape-conditions-mismatch.csv', 'tests/fixtures/curves/shape-volts-under-mV.csv']);
  const results = page.getByRole('list', { name: 'Upload results' });
  await results.getByText('✓ stored').waitFor();
  const differ = results.getByText(/The file and the build’s record differ \(3 to settle\)/);
  await differ.waitFor();
  const text = await results.innerText();
  assert.match(text, /file: 180 °C/);
  assert.match(text, /build record: 185 °C/);
  assert.match(text, /50 kPag \(151\.3 kPa absolute\)/);
  assert.match(text, /active area 25 cm² from the dimensions "5 cm x 5 cm"/);

  // the mV file asks once: its reason is listed in the confirmation, not repeated above it
  await results.getByText('? confirm columns').waitFor();
  const reasons = await results.getByText(/the highest value is 0\.95 mV/).count();
  assert.equal(reasons, 1);
  assert.equal(await page.getByLabel('Cell voltage unit').inputValue(), 'V');
  await page.getByRole('button', { name: 'Use these columns' }).click();
  await page.waitForFunction(() => [...document.querySelectorAll('[aria-label="Upload results"] li')].filter((li) => li.textContent.includes('✓ stored')).length === 2);

  // settle the temperature on the upload result: the build's record takes the file's 180 °C
  await results.getByRole('button', { name: 'The file is right' }).first().click();
  await results.getByText('The build record now holds the file’s value.').waitFor();
  await page.reload();
  await page.getByRole('heading', { name: 'Test conditions' }).waitFor();
  // the panel's "Cell temperature" entry: the dt, then its value
  const panel = page.locator('section').filter({ has: page.getByRole('heading', { name: 'Test conditions', exact: true }) });
  const entry = panel.locator('dt', { hasText: 'Cell temperature' }).locator('xpath=following-sibling::dd[1]');
  assert.equal((await entry.innerText()).trim(), '180 °C');
  await page.close();
}
