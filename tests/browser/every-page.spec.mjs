// Journey: the PI and the site administrator open every page of the product in turn (also the
// sign-in page and an invitation) and each page must pass axe-core with no serious or critical
// violation, show no developer text ("undefined", "NaN", camelCase keys), show no plotting-library
// toolbar or outside link, and show something useful when it opens. At phone width (390 px) the
// axis titles of the build and gains plots stay inside their plots.
import assert from 'node:assert/strict';
import { checkA11y, checkPage, checkPlots } from './lib.mjs';

/** Pages another branch is rebuilding: visited and checked, problems printed but not failed. */
const REPORT_ONLY = new Set();

async function projectIds(page, url) {
  const { projects } = await (await page.request.get(`${url}/api/projects`)).json();
  const cathode = projects.find((p) => /PGM-free cathode/.test(p.name));
  assert.ok(cathode, 'the demo cathode project exists');
  const builds = await (await page.request.get(`${url}/api/projects/${cathode.id}/builds?limit=500`)).json();
  const list = Array.isArray(builds) ? builds : builds.builds ?? builds.items;
  const withCurves = list.filter((b) => b.curveCount > 0);
  const polarization = withCurves.find((b) => b.code === 'C-010') ?? withCurves[0];
  let durability = null;
  for (const b of withCurves) {
    const detail = await (await page.request.get(`${url}/api/builds/${b.id}`)).json();
    if (detail.curves.some((c) => c.kind === 'durability')) { durability = b; break; }
  }
  return { projectId: cathode.id, buildId: polarization.id, durabilityBuildId: durability?.id ?? polarization.id };
}

/** Waits until the page has settled and its main landmark shows more than a spinner. */
async function opened(page, name) {
  await page.waitForLoadState('networkidle');
  await page.locator('main, form, [role="main"]').first().waitFor();
  await page.waitForFunction(() => !document.querySelector('[role="status"] .animate-spin'), null, { timeout: 20_000 }).catch(() => {});
  const text = (await page.locator('body').innerText()).trim();
  assert.ok(text.length > 80, `${name}: the page shows almost nothing when it opens`);
  await page.locator('h1').first().waitFor();
}

async function visit(page, url, route, name, extra) {
  await page.goto(url + route);
  await opened(page, name);
  if (extra) await extra();
  await checkPage(page, name, { reportOnly: REPORT_ONLY.has(name) });
}

export default async function ({ url, browser, signIn }) {
  const page = await browser.newPage();

  // Sign-in page, signed out
  await page.goto(`${url}/sign-in`);
  await page.getByRole('heading', { name: 'Sign in' }).waitFor();
  await checkPage(page, 'sign-in');

  await signIn(page, 'pi');
  await page.getByRole('heading', { name: /Good to see you/ }).waitFor();
  const { projectId, buildId, durabilityBuildId } = await projectIds(page, url);
  const p = `/projects/${projectId}`;
  const pages = [
    ['home', '/'],
    ['builds table', p],
    ['build', `${p}/builds/${buildId}`, async () => { await page.locator('.js-plotly-plot').first().waitFor(); }],
    ['build with a durability log', `${p}/builds/${durabilityBuildId}`],
    ['new build', `${p}/builds/new?parent=${buildId}`],
    ['edit build', `${p}/builds/${buildId}/edit`],
    ['upload', `${p}/upload`],
    ['gains', `${p}/gains`, async () => { await page.locator('.js-plotly-plot').first().waitFor(); }],
    ['compare', `${p}/compare`, async () => { await page.locator('.js-plotly-plot').first().waitFor(); }],
    ['lineage', `${p}/lineage`],
    ['benchmark', `${p}/benchmark`, async () => { await page.locator('.js-plotly-plot').first().waitFor(); }],
    ['durability', `${p}/durability`, async () => { await page.locator('.js-plotly-plot').first().waitFor(); }],
    ['series', `${p}/series`, async () => { await page.getByRole('heading', { name: 'Series', exact: true }).waitFor(); await page.waitForLoadState('networkidle'); }],
    ['surface', `${p}/surface`],
    ['plan', `${p}/plan`],
    ['settings', `${p}/settings`],
    ['account', '/account'],
    ['new project', '/projects/new'],
    ['page not found', '/no-such-page'],
  ];
  for (const [name, route, extra] of pages) await visit(page, url, route, name, extra);

  // Compare opens with the lineage's best path already chosen
  await page.goto(`${url}${p}/compare`);
  await page.getByText(/best path/i).first().waitFor();
  assert.ok(await page.getByRole('checkbox', { checked: true }).count() >= 2, 'compare pre-selects the best path');

  // A destructive action asks in our own dialog: Esc closes it and nothing changes
  await page.goto(`${url}${p}/builds/${buildId}`);
  await page.getByRole('button', { name: 'Discard' }).click();
  const dialog = page.getByRole('dialog');
  await dialog.waitFor();
  assert.match(await dialog.innerText(), /Discard/);
  await checkA11y(page, 'discard dialog');
  // focus starts on the safe choice and stays inside the dialog however far one tabs
  assert.equal(await page.evaluate(() => document.activeElement?.textContent), 'Cancel');
  for (let i = 0; i < 5; i++) {
    await page.keyboard.press('Tab');
    assert.ok(await page.evaluate(() => Boolean(document.activeElement?.closest('dialog'))), 'focus stays in the dialog');
  }
  await page.keyboard.press('Escape');
  await dialog.waitFor({ state: 'hidden' });
  assert.equal(await page.getByRole('button', { name: 'Discard' }).count(), 1, 'Esc keeps the build');

  // An invitation for a new person, read back from the outbox as the admin sees it
  const me = await (await page.request.get(`${url}/api/auth/me`)).json();
  const invited = await page.request.post(`${url}/api/projects/${projectId}/invitations`, {
    data: { email: 'new.member@demo.cellwright.test', role: 'viewer' },
    headers: { 'x-csrf-token': me.csrfToken ?? '' },
  });
  assert.equal(invited.status(), 201, await invited.text());
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.waitForURL(/\/sign-in/);

  await signIn(page, 'admin');
  await page.getByRole('heading', { name: /Good to see you/ }).waitFor();
  for (const [name, route] of [['home (admin)', '/'], ['people', '/admin/people'], ['labs', '/admin/labs'], ['outbox', '/admin/outbox'], ['audit log', '/admin/audit'], ['builds table (admin)', p]]) {
    await visit(page, url, route, name);
  }
  const outbox = await (await page.request.get(`${url}/api/admin/outbox`)).json();
  const messages = Array.isArray(outbox) ? outbox : outbox.messages;
  const mail = messages.find((m) => m.to === 'new.member@demo.cellwright.test');
  const token = mail.text.match(/\/invite\/([\w-]+)/)[1];
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.waitForURL(/\/sign-in/);
  await page.goto(`${url}/invite/${token}`);
  await page.getByRole('heading', { name: /Join/ }).waitFor();
  await checkPage(page, 'invitation');

  // Phone width: axis titles inside the plot, the rail folded behind its button
  await signIn(page, 'pi');
  await page.setViewportSize({ width: 390, height: 844 });
  for (const [name, route] of [['build (phone)', `${p}/builds/${buildId}`], ['gains (phone)', `${p}/gains`], ['compare (phone)', `${p}/compare`]]) {
    await page.goto(url + route);
    await page.locator('.js-plotly-plot .main-svg').first().waitFor();
    await page.waitForLoadState('networkidle');
    await checkPlots(page, name);
    await checkA11y(page, name);
  }
  await page.setViewportSize({ width: 1440, height: 900 });
}
