// Journey: the PI reviews a partner lab's build; the partner uploads a second, better curve to it
// from a phone; the PI's home card keeps the old best value because nobody has chosen the new
// curve; the partner then makes it the curve of record on the build page (also at phone width),
// which sends the build back to review, moves the home card, and puts a notice in the outbox.
// Last, a build opened under another project's address moves to its own project (or is not found).
import assert from 'node:assert/strict';
import path from 'node:path';

// invented repeat run: V at the 0.2 A/cm² row is 0.700 V, above every seeded demo build
const CSV = 'Current density (A/cm2),Voltage (V),HFR (Ohm cm2)\n0,1.00,0.10\n0.05,0.82,0.10\n0.1,0.77,0.10\n0.2,0.700,0.10\n0.3,0.65,0.10\n0.4,0.60,0.10\n';
const PROJECT = /PGM-free cathode for 180 °C stacks/;
const PHONE = { width: 390, height: 844 };

async function signOut(page) {
  // on a phone the rail opens from the top bar
  const menu = page.getByRole('button', { name: 'Menu' });
  if (await menu.isVisible()) await menu.click();
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.waitForURL(/\/sign-in/);
}

async function bestOnHome(page) {
  await page.getByRole('heading', { name: /Good to see you/ }).waitFor();
  const card = page.getByRole('link', { name: PROJECT }).filter({ hasText: 'Best V at j_ref' }).first();
  const text = await card.innerText();
  const match = /Best V at j_ref\s*([^\n]+)/.exec(text);
  assert.ok(match, `no best value on the home card: ${text}`);
  return match[1].trim();
}

async function noSideScroll(page, where) {
  const width = await page.evaluate(() => document.documentElement.scrollWidth);
  assert.ok(width <= PHONE.width, `${where}: page is ${width} px wide at ${PHONE.width} px`);
}

export default async function ({ url, browser, signIn, artifacts }) {
  const page = await browser.newPage();

  // The PI notes the home card and reviews the partner's build C-015.
  await signIn(page, 'pi');
  const before = await bestOnHome(page);
  assert.doesNotMatch(before, /C-015/);
  await page.getByRole('link', { name: PROJECT }).first().click();
  await page.waitForURL(/\/projects\/\d+$/);
  await page.getByRole('table', { name: 'Builds' }).getByRole('link', { name: 'C-015' }).click();
  await page.waitForURL(/\/builds\/\d+$/);
  const buildPath = new URL(page.url()).pathname;
  const projectPath = buildPath.replace(/\/builds\/\d+$/, '');
  await page.getByLabel('Comment or verdict').fill('Partner check agrees with our baseline trend.');
  await page.getByRole('button', { name: 'Approve' }).click();
  // the next waiting build opens; C-015 is reviewed
  await page.getByRole('status').getByText('This is the next build waiting for your review.').waitFor();
  await page.goBack();
  await page.getByRole('heading', { name: /C-015/ }).getByText('reviewed').waitFor();
  await signOut(page);

  // The partner uploads a second curve to C-015 from the Upload page, at phone width.
  await page.setViewportSize(PHONE);
  await signIn(page, 'partner');
  await page.goto(`${url}${projectPath}/upload`);
  await page.getByRole('heading', { name: 'Upload curves' }).waitFor();
  await page.getByLabel('Choose curve files').setInputFiles({ name: 'C-015_repeat.csv', mimeType: 'text/csv', buffer: Buffer.from(CSV) });
  assert.notEqual(await page.getByLabel('Build for C-015_repeat.csv').inputValue(), '');
  await page.getByRole('button', { name: /Upload 1 file/ }).click();
  const result = page.getByRole('group', { name: 'Result for C-015_repeat.csv' });
  await result.waitFor();
  const shown = await result.innerText();
  assert.match(shown, /C-015 already has a polarization curve of record/);
  assert.match(shown, /700 mV/); // the new curve's V at j_ref, beside the record's
  assert.match(shown, /Curve of record/);
  await result.getByRole('button', { name: 'Make this the curve of record' }).waitFor();
  await result.getByRole('link', { name: 'Open C-015' }).waitFor();
  await noSideScroll(page, 'upload result');
  await page.screenshot({ path: path.join(artifacts, 'record-upload-390.png'), fullPage: true });
  await signOut(page); // no choice made

  // Nobody chose: the PI's home card keeps the old value and C-015 is not back for review.
  await page.setViewportSize({ width: 1440, height: 900 });
  await signIn(page, 'pi');
  assert.equal(await bestOnHome(page), before);
  const waiting = page.locator('section', { hasText: 'Waiting for my review' });
  assert.equal(await waiting.getByRole('link', { name: 'C-015' }).count(), 0);
  await signOut(page);

  // The partner chooses on the build page, at phone width: the build goes back to review.
  await page.setViewportSize(PHONE);
  await signIn(page, 'partner');
  await page.goto(`${url}${buildPath}`);
  await page.getByRole('heading', { name: /C-015/ }).waitFor();
  const list = page.getByRole('list', { name: 'Polarization curves of C-015' });
  await list.waitFor();
  assert.match(await list.innerText(), /C-015_repeat\.csv[\s\S]*uploaded/);
  await noSideScroll(page, 'build page curve tabs');
  await page.screenshot({ path: path.join(artifacts, 'record-build-390.png'), fullPage: true });
  await list.getByRole('button', { name: 'Make C-015_repeat.csv the curve of record' }).click();
  const dialog = page.getByRole('dialog');
  await dialog.waitFor();
  assert.match(await dialog.innerText(), /goes back to review/);
  await dialog.getByRole('button', { name: 'Make it the curve of record' }).click();
  await page.getByRole('status').getByText(/back to review/).waitFor();
  await page.getByRole('heading', { name: /C-015/ }).getByText('tested').waitFor();
  assert.match(await list.innerText(), /C-015_repeat\.csv\s*curve of record/);
  await noSideScroll(page, 'build page after the choice');
  await signOut(page);

  // The PI's home card now reads the chosen curve, and C-015 waits for review again.
  await page.setViewportSize({ width: 1440, height: 900 });
  await signIn(page, 'pi');
  assert.match(await bestOnHome(page), /700 mV \(C-015\)/);
  await page.locator('section', { hasText: 'Waiting for my review' }).getByRole('link', { name: 'C-015' }).waitFor();
  await signOut(page);

  // The notice to the PI is in the outbox.
  await signIn(page, 'admin');
  await page.goto(`${url}/admin/outbox`);
  const notice = page.getByRole('list', { name: 'Messages' }).locator('li', { hasText: 'pi@demo.cellwright.test' }).filter({ hasText: 'curve of record changed' });
  await notice.first().waitFor();
  assert.match(await notice.first().innerText(), /C-015/);

  // A build opened under another project's address moves to its own project's address...
  const projects = (await (await page.request.get(`${url}/api/projects`)).json()).projects;
  const anode = projects.find((p) => p.codePrefix === 'A');
  const cathode = projects.find((p) => p.codePrefix === 'C');
  const a001 = (await (await page.request.get(`${url}/api/projects/${anode.id}/builds`)).json()).builds.find((b) => b.code === 'A-001');
  await page.goto(`${url}/projects/${cathode.id}/builds/${a001.id}`);
  await page.waitForURL(`${url}/projects/${anode.id}/builds/${a001.id}`);
  await page.getByRole('heading', { name: /A-001/ }).waitFor();
  await page.goto(`${url}/projects/${cathode.id}/builds/${a001.id}/edit`);
  await page.waitForURL(`${url}/projects/${anode.id}/builds/${a001.id}/edit`);
  await signOut(page);
  // ...and is not found for someone outside that project (the partner is in the cathode project only).
  await signIn(page, 'partner');
  await page.goto(`${url}/projects/${cathode.id}/builds/${a001.id}`);
  await page.getByRole('heading', { name: 'Build not found' }).waitFor();
  assert.equal(new URL(page.url()).pathname, `/projects/${cathode.id}/builds/${a001.id}`);
}
