// Journey: a PI opens the gains page and sees the waterfall, then approves a build waiting for
// review; a partner uploads a curve to one of its lab's builds; the PI's notice is in the outbox.
import assert from 'node:assert/strict';
import { checkPage } from './lib.mjs';

const CSV = 'Current density (A/cm2),Voltage (V),HFR (Ohm cm2)\n0,0.98,0.12\n0.05,0.74,0.12\n0.1,0.69,0.12\n0.2,0.62,0.12\n0.3,0.57,0.12\n0.4,0.52,0.12\n';

async function signOut(page) {
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.waitForURL(/\/sign-in/);
}

export default async function ({ url, browser, signIn }) {
  const page = await browser.newPage();
  await signIn(page, 'pi');
  await page.getByRole('heading', { name: /Good to see you/ }).waitFor();
  await checkPage(page, 'home (PI)');

  // Gains: the default chain is the lineage's best path from the baseline.
  await page.getByRole('link', { name: /PGM-free cathode for 180 °C stacks/ }).first().click();
  await page.waitForURL(/\/projects\/\d+$/);
  await page.getByRole('link', { name: 'Gains', exact: true }).click();
  await page.waitForURL(/\/gains/);
  const chart = page.getByRole('figure', { name: /Gains waterfall of V at j_ref from C-001/ });
  await chart.waitFor();
  await chart.locator('.js-plotly-plot').waitFor();
  const steps = page.getByRole('table', { name: 'Gains steps' });
  await steps.waitFor();
  assert.match(await steps.innerText(), /C-001[\s\S]*baseline[\s\S]*Total/);
  assert.ok(await page.getByRole('button', { name: 'Export the waterfall as SVG' }).isVisible());
  await checkPage(page, 'gains');

  // Review: from the home page's waiting list to the build, then approve it.
  await page.getByRole('link', { name: 'Home', exact: true }).click();
  const waiting = page.locator('section', { hasText: 'Waiting for my review' });
  await waiting.getByRole('link', { name: 'C-009' }).click();
  await page.waitForURL(/\/builds\/\d+$/);
  await page.getByRole('heading', { name: /C-009/ }).waitFor();
  await checkPage(page, 'build C-009 waiting for review');
  await page.getByLabel('Comment or verdict').fill('GDL swap costs a few mV; keep woven carbon.');
  await page.getByRole('button', { name: 'Approve' }).click();
  // the next build waiting for a verdict opens at once; back to C-009 to read its thread
  await page.getByRole('status').getByText('This is the next build waiting for your review.').waitFor();
  assert.equal(await page.getByRole('heading', { name: /C-009/ }).count(), 0);
  await checkPage(page, 'next build waiting for review');
  await page.goBack();
  await page.getByRole('heading', { name: /C-009/ }).waitFor();
  // the verdict stands: approving again is not offered
  assert.equal(await page.getByRole('button', { name: 'Approved' }).isDisabled(), true);
  const thread = page.getByRole('list', { name: 'Review thread' });
  await thread.getByText('GDL swap costs a few mV; keep woven carbon.').waitFor();
  await page.getByRole('heading', { name: /C-009/ }).getByText('reviewed').waitFor();
  await page.getByRole('button', { name: 'Show history' }).click();
  await page.getByRole('table', { name: 'Build history' }).getByText('tested → reviewed').waitFor();
  await checkPage(page, 'build C-009 reviewed, with its history');
  await signOut(page);

  // A partner uploads a curve to its own lab's build.
  await signIn(page, 'partner');
  await page.getByRole('heading', { name: /Good to see you/ }).waitFor();
  // A build planned for the partner's lab shows on its home with what it still needs.
  await page.evaluate(async () => {
    const me = await (await fetch('/api/auth/me')).json();
    const projects = (await (await fetch('/api/projects')).json()).projects;
    const cathode = projects.find((p) => p.name.startsWith('PGM-free cathode'));
    const res = await fetch(`/api/projects/${cathode.id}/builds`, { method: 'POST', headers: { 'content-type': 'application/json', 'x-csrf-token': me.csrfToken }, body: JSON.stringify({ status: 'planned', factors: {}, changeNote: 'round-robin repeat' }) });
    if (res.status !== 201) throw new Error(`planning a build failed: ${res.status}`);
  });
  await page.reload();
  const waitingData = page.locator('section', { hasText: 'Builds of your lab waiting for data' });
  await waitingData.getByText('round-robin repeat').waitFor();
  await waitingData.getByText(/needs a polarization curve/).waitFor();
  await checkPage(page, 'partner home with a build waiting for data');
  await page.getByRole('link', { name: /PGM-free cathode for 180 °C stacks/ }).first().click();
  await page.waitForURL(/\/projects\/\d+$/);
  await page.getByRole('table', { name: 'Builds' }).getByRole('link', { name: 'C-015' }).click();
  await page.waitForURL(/\/builds\/\d+$/);
  await page.getByRole('heading', { name: /C-015/ }).waitFor();
  await checkPage(page, 'build C-015 as a partner');
  await page.getByLabel('Choose curve files').setInputFiles({ name: 'kestrel-recheck.csv', mimeType: 'text/csv', buffer: Buffer.from(CSV) });
  await page.getByText('✓ stored').waitFor();
  // partners may comment but not give verdicts
  await page.getByLabel('Comment', { exact: true }).waitFor();
  assert.equal(await page.getByRole('button', { name: 'Approve' }).count(), 0);
  await signOut(page);

  // The PI's notice sits in the outbox, with the build's code and the file.
  await signIn(page, 'admin');
  await page.goto(`${url}/admin/outbox`);
  const messages = page.getByRole('list', { name: 'Messages' });
  const notice = messages.locator('li', { hasText: 'pi@demo.cellwright.test' }).filter({ hasText: 'C-015' });
  await notice.first().waitFor();
  assert.match(await notice.first().innerText(), /new curves uploaded/);
  await checkPage(page, 'outbox');
}
