// Journey: a researcher opens the plan page on its queue, plans a face-centred central
// composite design (the factors it leaves out held at chosen values), then opens the surface
// page, which shows a fit without a click — the effects chart and the quality sentence — and
// plans proposals: one inside the builds' support directly, one exploratory only with a reason,
// which the planned build then shows. No text on either page reads "undefined" or a factor key.
import assert from 'node:assert/strict';
import { checkPage } from './lib.mjs';

const KEY_LIKE = /\b[a-z]{2,}[A-Z][a-z]+/;

async function textNodes(page) {
  return page.evaluate(() => {
    const walker = document.createTreeWalker(document.body, NodeFilter.SHOW_TEXT);
    const out = [];
    let node;
    while ((node = walker.nextNode())) {
      const text = node.textContent.trim();
      if (text) out.push(text);
    }
    return out;
  });
}

async function assertNoDeveloperText(page, keys, where) {
  const texts = await textNodes(page);
  const bad = texts.filter((t) => t.includes('undefined') || KEY_LIKE.test(t) || keys.some((k) => /[A-Z]/.test(k) && t.includes(k)));
  assert.deepEqual(bad, [], `${where}: developer text on screen`);
}

export default async function ({ url, browser, signIn, artifacts }) {
  const page = await browser.newPage();
  await signIn(page, 'researcher');
  await page.getByRole('heading', { name: /Good to see you/ }).waitFor();
  await page.getByRole('link', { name: /PGM-free cathode for 180 °C stacks/ }).first().click();
  await page.waitForURL(/\/projects\/(\d+)$/);
  const projectId = page.url().match(/projects\/(\d+)/)[1];
  const factorKeys = (await (await page.request.get(`${url}/api/projects/${projectId}/factors`)).json()).factors.map((f) => f.key);

  // Plan: opens on the queue (the demo's one planned build), then a face-centred CCD over the
  // first three factors (the form's default) with 2 centre points
  await page.goto(`${url}/projects/${projectId}/plan`);
  await page.getByRole('heading', { name: 'Plan', exact: true }).waitFor();
  const queue = page.getByRole('table', { name: 'Planned builds' });
  await queue.getByRole('link', { name: 'C-021' }).waitFor();
  await checkPage(page, 'plan queue');
  await page.getByLabel('Centre points').fill('2');
  await page.getByLabel('Seed').fill('42');
  await page.getByText('Axial builds at the middle of each face').first().waitFor();
  await page.getByRole('button', { name: 'Generate design' }).click();
  const runs = page.getByRole('table', { name: 'Design runs' });
  await runs.waitFor();
  // 3 factors: 8 corners + 6 axial + 2 centre = 16 builds (NIST e-Handbook §5.3.3.6.1)
  assert.equal(await runs.locator('tbody tr').count(), 16);
  await runs.getByRole('cell', { name: 'centre point' }).first().waitFor();
  await page.getByRole('radio', { name: 'Scaled (−1…+1)' }).click();
  await runs.getByRole('cell', { name: '-1', exact: true }).first().waitFor();
  // the factors the design leaves out are held at values the researcher sees and can change
  const held = page.getByRole('group', { name: 'Held in every build (not varied by the design)' });
  await held.getByLabel('Operating temperature (°C)').fill('185');
  await page.getByLabel('Note for every build').fill('activation screen');
  await assertNoDeveloperText(page, factorKeys, 'plan page');
  await page.getByRole('button', { name: 'Plan 16 builds' }).click();
  await page.getByText('16 planned builds').waitFor();
  await queue.getByRole('link', { name: 'C-037' }).waitFor();
  await queue.getByText('design 1: Central composite (face-centred), 16 builds, seed 42').first().waitFor();
  await page.getByRole('list', { name: 'Designs planned so far' }).waitFor();

  // Surface: a fit is there without a click
  await page.goto(`${url}/projects/${projectId}/surface`);
  await page.getByRole('heading', { name: 'Surface', exact: true }).waitFor();
  const effects = page.getByRole('list', { name: 'Effects, largest first' });
  await effects.waitFor({ timeout: 30000 });
  assert.ok((await effects.getByRole('listitem').count()) >= 3);
  await effects.getByText(/PTFE binder 10→40 wt %: [+−]\d+ mV ± \d+/).waitFor();
  await page.locator('.js-plotly-plot').first().waitFor({ timeout: 30000 });
  const quality = page.getByTestId('quality-sentence');
  await quality.waitFor();
  assert.match(await quality.innerText(), /^Predicts a new build to ±\d+(\.\d)? mV \(leave-one-out\); builds of the same recipe vary by ±\d+(\.\d)? mV/);
  await page.getByText('Model chosen automatically:').waitFor();
  await page.getByText(/Our yardstick:/).waitFor();
  // what if: the typed recipe's prediction and whether the builds support it
  const whatIf = page.getByRole('form', { name: 'What-if recipe' });
  await whatIf.getByLabel('PTFE binder (wt %)').fill('12');
  await page.getByText(/Inside the builds' support|Outside the builds' support/).first().waitFor();
  await assertNoDeveloperText(page, factorKeys, 'surface page');

  // proposals: three inside the support, one exploratory
  await page.getByRole('button', { name: 'Propose next builds' }).click();
  const inside = page.getByRole('list', { name: "Proposals inside the builds' support" });
  await inside.waitFor();
  assert.equal(await inside.getByRole('listitem').count(), 3);
  await page.getByRole('note').filter({ hasText: 'safety officer' }).waitFor();
  await inside.getByRole('button', { name: 'Plan this build', exact: true }).first().click();
  await inside.getByRole('status').filter({ hasText: 'Planned as' }).first().waitFor();

  // a flagged proposal cannot be planned without a reason
  const exploratory = page.getByRole('list', { name: 'Exploratory proposals' });
  await exploratory.waitFor();
  await exploratory.getByRole('button', { name: 'Plan this build…' }).click();
  const form = exploratory.getByRole('form', { name: 'Reason for planning a flagged proposal' });
  await form.waitFor();
  const submit = form.getByRole('button', { name: 'Plan with this reason' });
  assert.equal(await submit.isDisabled(), true);
  await form.getByLabel('Why plan it anyway?').fill('short');
  assert.equal(await submit.isDisabled(), true);
  const reason = 'Testing whether the model holds past the builds before the next design.';
  await form.getByLabel('Why plan it anyway?').fill(reason);
  await submit.click();
  const planned = exploratory.getByRole('status').filter({ hasText: 'Planned as' });
  await planned.waitFor();

  // statistics stay closed until opened, then offer a CSV
  await page.getByText('Statistics (term tests', { exact: false }).click();
  await page.getByRole('button', { name: 'Download statistics (CSV)' }).waitFor();
  await page.getByRole('table', { name: /Shape check against repeated recipes/ }).waitFor();
  await assertNoDeveloperText(page, factorKeys, 'surface page with statistics open');
  if (artifacts) await page.screenshot({ path: `${artifacts}/surface-journey.png`, fullPage: true });
  await checkPage(page, 'surface with a fit');

  // the planned build shows the reason in its recipe area
  await planned.getByRole('link').click();
  await page.waitForURL(/builds\/\d+$/);
  await page.getByText(`Reason given: “${reason}”`).waitFor();
}
