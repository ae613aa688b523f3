// Journey: before a programme review the PI opens the project's review pack, checks it on screen,
// prints it to PDF in Chromium (print stylesheet: no navigation, no buttons, the waterfall inside
// the A4 page) and downloads the server's PDF, which holds the waterfall and the top builds as text.
import assert from 'node:assert/strict';
import fs from 'node:fs';
import path from 'node:path';
import { checkPage } from './lib.mjs';
import { pdfText } from './pdf-text.mjs';

export default async function ({ browser, signIn, artifacts }) {
  const page = await browser.newPage();
  await signIn(page, 'pi');
  await page.getByRole('link', { name: /PGM-free cathode for 180 °C stacks/ }).first().click();
  await page.getByRole('link', { name: 'Review pack' }).click();
  await page.getByRole('heading', { name: 'Review pack' }).waitFor();
  await page.getByRole('heading', { name: 'Waterfall of V at j_ref' }).waitFor();
  await page.locator('.js-plotly-plot .main-svg').first().waitFor();
  for (const title of ['Top builds', 'Durability', 'Waiting for a verdict']) await page.getByRole('heading', { name: title }).waitFor();
  await checkPage(page, 'review pack');

  // print: the rail and the buttons go, the chart fits the paper
  await page.emulateMedia({ media: 'print' });
  assert.equal(await page.locator('#main-rail').isVisible(), false, 'the navigation rail prints');
  assert.equal(await page.getByRole('button', { name: 'Print…' }).isVisible(), false, 'the print button prints');
  const chartWidth = await page.locator('.js-plotly-plot').first().evaluate((el) => el.getBoundingClientRect().width);
  assert.ok(chartWidth <= 703, `the waterfall is ${chartWidth} px wide, more than an A4 page's printable width`);
  const printed = await page.pdf({ format: 'A4', printBackground: true });
  fs.writeFileSync(path.join(artifacts, 'review-pack-print.pdf'), printed);
  assert.equal(printed.subarray(0, 5).toString(), '%PDF-');
  const pages = (printed.toString('latin1').match(/\/Type\s*\/Page[^s]/g) ?? []).length;
  assert.ok(pages >= 1 && pages <= 6, `printed ${pages} pages`);
  await page.emulateMedia({ media: 'screen' });

  // the one-click PDF
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download PDF' }).click()]);
  assert.match(download.suggestedFilename(), /^review-pack-C-\d{4}-\d{2}-\d{2}\.pdf$/);
  const file = path.join(artifacts, 'review-pack.pdf');
  await download.saveAs(file);
  const text = pdfText(fs.readFileSync(file));
  assert.match(text, /Waterfall of V at j_ref/);
  assert.match(text, /Targets/);
  assert.match(text, /Stack-ready voltage/); // a demo target of the cathode project
  assert.match(text, /Top builds/);
  assert.match(text, /C-001/);
  assert.match(text, /PGM-free cathode for 180 .C stacks/);

  // a narrower period: the date fields keep to it (and say so in the subtitle)
  await page.getByLabel('From (tested on or after)').fill('2026-10-01');
  await page.getByText(/Builds from 01 Oct 2026 to today/).waitFor();
  await page.close();
}
