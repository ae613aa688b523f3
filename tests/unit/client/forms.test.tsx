// @vitest-environment jsdom
// The client's forms check their values with the request schemas the server validates with:
// a bad value shows the schema's message under its field and nothing is sent; a good one sends
// (or hands on) the schema-shaped body. Factors, labs and builds are the server's recorded answers.
import { describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { Build, FactorDef, Lab, ResponseDef, UploadPreview } from '../../../shared/api-types';
import { buildCreateSchema } from '../../../shared/schemas/build';
import { designRequestSchema, planRunsSchema, proposalsRequestSchema, surfaceRequestSchema } from '../../../shared/schemas/doe';
import { generateDesign } from '../../../shared/doe/designs/finish-design';
import BuildNew from '../../../src/app/routes/build-new';
import { DesignForm } from '../../../src/features/plan/components/design-form';
import { PlanRunsPanel } from '../../../src/features/plan/components/plan-runs-panel';
import { FitForm } from '../../../src/features/surface/components/fit-form';
import { MappingConfirm } from '../../../src/features/curves/components/upload-panel';
import { answer, fixtures, renderPage, stubApi } from './render';

const { projectId } = fixtures;
const factors = answer<{ factors: FactorDef[] }>('researcher', `/projects/${projectId}/factors`).factors;
const responses = answer<{ responses: ResponseDef[] }>('researcher', `/projects/${projectId}/responses`).responses;
const labs = answer<{ labs: Lab[] }>('researcher', '/labs').labs;
const builds = answer<{ builds: Build[] }>('researcher', `/projects/${projectId}/builds`).builds;
const factor = (key: string) => factors.find((f) => f.key === key)!;

/** The text of the inline error an input points to (aria-describedby), or null. */
function errorUnder(input: HTMLElement): string | null {
  const id = input.getAttribute('aria-describedby');
  const node = id ? document.getElementById(id) : null;
  return node?.getAttribute('role') === 'alert' ? node.textContent : null;
}

async function retype(input: HTMLElement, text: string) {
  await userEvent.clear(input);
  if (text) await userEvent.type(input, text);
}

describe('build form (new build page)', () => {
  const open = async () => {
    const sent = stubApi('researcher', () => ({ status: 201, body: { build: { ...builds[0], id: 999 } } }));
    renderPage(<BuildNew />, { url: `/projects/${projectId}/builds/new`, pattern: '/projects/:projectId/builds/new' });
    await screen.findByRole('form', { name: 'Build form' });
    return sent;
  };
  const binder = factor('binder');

  it('shows a factor outside its range and a negative loading under their fields, and sends nothing', async () => {
    const sent = await open();
    await retype(screen.getByLabelText(`${binder.label} (${binder.unit})`), '55');
    await retype(screen.getByLabelText('Catalyst loading (mg/cm²)'), '-1');
    await userEvent.click(screen.getByRole('button', { name: 'Create build' }));
    // the range is the project's own (10–40 wt % in the demo); the loading message is the schema's
    await waitFor(() => expect(errorUnder(screen.getByLabelText(`${binder.label} (${binder.unit})`))).toBe(`${binder.label}: 55 is outside ${binder.low}–${binder.high} ${binder.unit}`));
    expect(errorUnder(screen.getByLabelText('Catalyst loading (mg/cm²)'))).toBe('must be above 0 mg/cm²');
    // a built build needs every factor: the empty categorical one is named too
    expect(errorUnder(screen.getByLabelText(factor('gdl').label))).toBe(`${factor('gdl').label}: a value is required`);
    expect(sent).toEqual([]);
  });

  it('sends the schema-shaped build once every factor is in range', async () => {
    const sent = await open();
    const values: Record<string, string> = { binder: '25', activationTemp: '340', activationTime: '2', cellTemp: '180' };
    // the recipe comes before the test conditions, which have a cell temperature of their own
    for (const [key, text] of Object.entries(values)) await retype(screen.getAllByLabelText(`${factor(key).label} (${factor(key).unit})`)[0]!, text);
    await userEvent.selectOptions(screen.getByLabelText(factor('gdl').label), factor('gdl').levels![0]!);
    await retype(screen.getByLabelText('Catalyst loading (mg/cm²)'), '3.5');
    await retype(screen.getByLabelText('Change note'), 'binder 30 → 25 wt %');
    await userEvent.click(screen.getByRole('button', { name: 'Create build' }));
    await waitFor(() => expect(sent).toHaveLength(1));
    const [request] = sent;
    expect(request!.method).toBe('POST');
    expect(request!.path).toBe(`/projects/${projectId}/builds`);
    const body = request!.body as Record<string, unknown>;
    expect(buildCreateSchema.safeParse(body).success).toBe(true);
    expect(body).toMatchObject({
      factors: { binder: 25, activationTemp: 340, activationTime: 2, cellTemp: 180, gdl: factor('gdl').levels![0] },
      loadingMgCm2: 3.5,
      areaCm2: 25,
      status: 'built',
      changeNote: 'binder 30 → 25 wt %',
      testConditions: { temperatureC: 180, anodeGas: 'H2', cathodeGas: 'air' },
    });
    // empty hand-entered responses are left out, not sent as 0 or NaN
    expect(body.responses).toEqual({});
  });

  it('a chosen parent fills the form with its recipe, read on its own; a value typed before it arrived is kept', async () => {
    await open();
    const field = (key: string) => screen.getAllByLabelText(`${factor(key).label} (${factor(key).unit})`)[0] as HTMLInputElement;
    await retype(field('binder'), '33');
    // the parent picker lists the brief builds; C-002's recipe comes from its own recorded answer (/builds/2)
    await userEvent.selectOptions(screen.getByLabelText('Parent build'), '2');
    await waitFor(() => expect(field('activationTemp').value).toBe('320'));
    expect(field('activationTime').value).toBe('1');
    expect(field('binder').value).toBe('33'); // typed by the user: not overwritten by the parent's 20
    expect((screen.getByLabelText('Catalyst loading (mg/cm²)') as HTMLInputElement).value).toBe('3');
  });
});

describe('design form', () => {
  it('shows a fractional centre-point count under its field and hands on nothing', async () => {
    const onSubmit = vi.fn();
    renderPage(<DesignForm factors={factors} busy={false} onSubmit={onSubmit} />);
    await retype(screen.getByLabelText('Centre points'), '2.5');
    await userEvent.click(screen.getByRole('button', { name: 'Generate design' }));
    await waitFor(() => expect(errorUnder(screen.getByLabelText('Centre points'))).toBe('must be a whole number'));
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it('hands on the schema-shaped request', async () => {
    const onSubmit = vi.fn();
    renderPage(<DesignForm factors={factors} busy={false} onSubmit={onSubmit} />);
    await retype(screen.getByLabelText('Seed'), '42');
    await userEvent.click(screen.getByRole('button', { name: 'Generate design' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalledTimes(1));
    const body = onSubmit.mock.calls[0]![0];
    expect(designRequestSchema.parse(body)).toEqual(body);
    expect(body).toEqual({ kind: 'central-composite', factors: ['binder', 'activationTemp', 'activationTime'], centerPoints: 3, replicates: 1, blocks: 1, seed: 42, randomize: true, variant: 'face-centred' });
  });
});

describe('plan-runs panel', () => {
  // a 2² design over binder and activation temperature: the other factors are held
  const design = generateDesign({ kind: 'full-factorial-2', factors: [{ key: 'binder', kind: 'continuous', low: 10, high: 40 }, { key: 'activationTemp', kind: 'continuous', low: 300, high: 380 }], seed: 7, randomize: false });
  const open = () => {
    const sent = stubApi('researcher', () => ({ status: 201, body: { builds: [{ ...builds[0], id: 501, code: 'P-501' }], designId: 3 } }));
    renderPage(<PlanRunsPanel projectId={projectId} design={design} factors={factors} builds={builds} labs={labs} homeLabId={labs[0]!.id} />);
    return sent;
  };
  const time = factor('activationTime');

  it('shows a held value outside its range under its field and sends nothing', async () => {
    const sent = open();
    const held = screen.getByLabelText(`${time.label} (${time.unit})`);
    await retype(held, '9');
    await retype(screen.getByLabelText('Active area (cm²)'), '0');
    await userEvent.click(screen.getByRole('button', { name: `Plan ${design.runs.length} builds` }));
    await waitFor(() => expect(errorUnder(held)).toBe(`${time.label}: 9 is outside ${time.low}–${time.high} ${time.unit}`));
    expect(errorUnder(screen.getByLabelText('Active area (cm²)'))).toBe('must be above 0');
    expect(sent).toEqual([]);
  });

  it('sends the design’s runs with the held values as numbers', async () => {
    const sent = open();
    await retype(screen.getByLabelText('Catalyst loading (mg/cm²)'), '3,0');
    await userEvent.click(screen.getByRole('button', { name: `Plan ${design.runs.length} builds` }));
    await waitFor(() => expect(sent).toHaveLength(1));
    expect(sent[0]!.path).toBe(`/projects/${projectId}/designs/plan`);
    const body = planRunsSchema.parse(sent[0]!.body);
    expect(body.runs).toHaveLength(4);
    // held at the middle of each range (derived by hand: (1 + 4) / 2 = 2.5 h, (160 + 200) / 2 = 180 °C) and the first level
    expect(body.held).toEqual({ activationTime: 2.5, gdl: factor('gdl').levels![0], cellTemp: 180 });
    expect(body.loadingMgCm2).toBe(3);
    expect(body.labsByBlock).toEqual({ 1: labs[0]!.id });
    await screen.findByText('1 planned builds');
  });
});

describe('fit form', () => {
  it('asks for a factor when none is ticked and hands on nothing', async () => {
    const onFit = vi.fn();
    renderPage(<FitForm factors={factors} responses={responses} initial={{ response: 'vAtRef', model: 'linear', factors: ['binder'] }} busy={false} onFit={onFit} />);
    await userEvent.click(screen.getByRole('checkbox', { name: /PTFE binder/ }));
    await userEvent.click(screen.getByRole('button', { name: 'Fit' }));
    await screen.findByText('choose at least one factor');
    expect(onFit).not.toHaveBeenCalled();
  });

  it('hands on the ticked terms of the ticked factors', async () => {
    const onFit = vi.fn();
    renderPage(<FitForm factors={factors} responses={responses} initial={{ response: 'vAtRef', model: 'linear', factors: ['binder', 'activationTemp'] }} busy={false} onFit={onFit} />);
    await userEvent.selectOptions(screen.getByLabelText('Model'), 'terms');
    await userEvent.click(screen.getByRole('checkbox', { name: 'PTFE binder × Activation temperature' }));
    await userEvent.click(screen.getByRole('button', { name: 'Fit' }));
    await waitFor(() => expect(onFit).toHaveBeenCalledTimes(1));
    const request = onFit.mock.calls[0]![0];
    expect(surfaceRequestSchema.parse(request)).toEqual(request);
    expect(request).toEqual({ response: 'vAtRef', model: { terms: ['binder*activationTemp'] }, factors: ['binder', 'activationTemp'] });
  });
});

describe('column confirmation', () => {
  const preview = {
    kind: 'polarization', fileName: 'station-export.csv', header: ['I (A)', 'U (V)'], rows: [['0', '0.98'], ['5', '0.71']], rowCount: 2, headerLine: 1, delimiter: ',', decimalComma: false,
    reasons: ['The current column has no unit.'], detected: { current: { column: 0, unit: 'A' }, voltage: { column: 1, unit: 'V' } }, conditions: null, buildAreaCm2: null, sheet: null, sheets: null,
  } as unknown as UploadPreview;

  it('a total current with a zero area shows the schema’s message under the area and confirms nothing', async () => {
    const onConfirm = vi.fn();
    renderPage(<MappingConfirm preview={preview} onConfirm={onConfirm} onCancel={() => {}} />);
    fireEvent.change(screen.getByLabelText('Active area'), { target: { value: '0' } });
    await userEvent.click(screen.getByRole('button', { name: 'Use these columns' }));
    await waitFor(() => expect(errorUnder(screen.getByLabelText('Active area'))).toBe('must be above 0 cm²'));
    expect(onConfirm).not.toHaveBeenCalled();
  });

  it('confirms the mapping and the area as the upload schema reads them', async () => {
    const onConfirm = vi.fn();
    renderPage(<MappingConfirm preview={preview} onConfirm={onConfirm} onCancel={() => {}} />);
    fireEvent.change(screen.getByLabelText('Active area'), { target: { value: '25' } });
    await userEvent.type(screen.getByLabelText('Profile name'), 'station export');
    await userEvent.click(screen.getByRole('button', { name: 'Use these columns' }));
    await waitFor(() => expect(onConfirm).toHaveBeenCalledTimes(1));
    expect(onConfirm.mock.calls[0]).toEqual([{ current: { column: 0, unit: 'A' }, voltage: { column: 1, unit: 'V' } }, { kind: 'polarization', areaCm2: 25, saveProfileAs: 'station export' }]);
  });
});

describe('proposals request', () => {
  it('the proposals form refuses a count of 0 and crossed limits in words, and reads a target in display units', async () => {
    const { proposalsResolver, initialProposalsValues } = await import('../../../src/features/surface/components/proposals-values');
    const resolve = proposalsResolver({ response: 'vAtRef', model: 'linear', factors: ['binder'] }, 1000, factors, 'mV');
    const opts = { fields: {}, shouldUseNativeValidation: false } as const;
    const bad = await resolve({ ...initialProposalsValues({ goal: 'maximize', target: null, scale: 1000 }), count: '0', bounds: { binder: { min: '30', max: '20' } } }, undefined, opts);
    // every input's problem at once: the schema's (count) and the form's own (crossed limits)
    expect(bad.errors).toEqual({
      count: { type: 'schema', message: 'must be at least 1' },
      bounds: { binder: { max: { type: 'schema', message: 'PTFE binder: "at most" must not be below "at least"' } } },
    });
    const good = await resolve({ ...initialProposalsValues({ goal: 'target', target: 0.6, scale: 1000 }), target: '650' }, undefined, opts);
    // 650 mV typed in display units is 0.65 V as stored (derived by hand: 650 / 1000)
    expect(proposalsRequestSchema.parse(good.values)).toMatchObject({ count: 3, exploratory: 1, strategy: 'balance', goal: { target: 0.65 }, seed: 1 });
  });
});

describe('invite form', () => {
  it('shows the schema’s e-mail message under the field and sends nothing; a good invitation is sent as the schema reads it', async () => {
    const { InviteForm } = await import('../../../src/features/projects/components/invite-form');
    const onSubmit = vi.fn();
    renderPage(<InviteForm labs={labs} pending={false} error={null} onSubmit={onSubmit} />);
    const email = screen.getByLabelText('Invite by e-mail');
    await userEvent.type(email, 'not-an-address');
    await userEvent.click(screen.getByRole('button', { name: 'Send invitation' }));
    await waitFor(() => expect(errorUnder(email)).toBe('an e-mail address like name@lab.example'));
    expect(onSubmit).not.toHaveBeenCalled();
    await retype(email, 'New.Person@Lab.example');
    await userEvent.selectOptions(screen.getByLabelText('Role'), 'partner');
    await userEvent.selectOptions(screen.getByLabelText('Lab'), String(labs[0]!.id));
    await userEvent.click(screen.getByRole('button', { name: 'Send invitation' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalledTimes(1));
    // the schema writes addresses in lower case, as the server stores them
    expect(onSubmit.mock.calls[0]![0]).toEqual({ email: 'new.person@lab.example', role: 'partner', labId: labs[0]!.id });
  });
});

describe('review thread', () => {
  it('a verdict without a reason shows the verdict schema’s message and sends nothing; with one it is sent', async () => {
    const { ReviewThread } = await import('../../../src/features/review/components/review-thread');
    const sent = stubApi('pi', () => ({ status: 201, body: { review: { id: 1 }, status: 'reviewed' } }));
    const detail = answer<{ build: { status: string }; permissions: { review: boolean; comment: boolean } }>('pi', `/builds/${fixtures.testedBuildId}`);
    renderPage(<ReviewThread buildId={fixtures.testedBuildId} projectId={projectId} permissions={detail.permissions} status={detail.build.status} />);
    const box = await screen.findByLabelText('Comment or verdict');
    await userEvent.type(box, '   ');
    await userEvent.click(screen.getByRole('button', { name: 'Approve' }));
    await waitFor(() => expect(errorUnder(box)).toBe('say why, in a sentence or two'));
    expect(sent).toEqual([]);
    await retype(box, '  Curves agree with the replicate.  ');
    await userEvent.click(screen.getByRole('button', { name: 'Approve' }));
    await waitFor(() => expect(sent).toHaveLength(1));
    expect(sent[0]).toEqual({ method: 'POST', path: `/builds/${fixtures.testedBuildId}/verdict`, body: { verdict: 'approved', body: 'Curves agree with the replicate.' } });
  });
});
