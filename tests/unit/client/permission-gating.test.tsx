// @vitest-environment jsdom
// What each role is offered on real pages, rendered from the answers the server gives that
// role: the client hides exactly what the shared role table lets the server refuse.
import { describe, expect, it } from 'vitest';
import { screen, within } from '@testing-library/react';
import Settings from '../../../src/app/routes/settings';
import BuildPage from '../../../src/app/routes/build';
import ProjectBuilds from '../../../src/app/routes/project-builds';
import { ReviewThread } from '../../../src/features/review/components/review-thread';
import { answer, fixtures, renderPage, stubApi, type Role } from './render';

const { projectId, plannedBuildId, testedBuildId } = fixtures;
type Detail = { build: { code: string; status: string }; permissions: { edit: boolean; upload: boolean; review: boolean; comment: boolean } };

const openSettings = async (role: Role) => {
  stubApi(role);
  renderPage(<Settings />, { url: `/projects/${projectId}/settings`, pattern: '/projects/:projectId/settings' });
  await screen.findByRole('heading', { name: 'Project settings' });
};
const openBuild = async (role: Role, buildId = plannedBuildId) => {
  stubApi(role);
  renderPage(<BuildPage />, { url: `/projects/${projectId}/builds/${buildId}`, pattern: '/projects/:projectId/builds/:buildId' });
  const detail = answer<Detail>(role, `/builds/${buildId}`);
  await screen.findByRole('heading', { name: new RegExp(detail.build.code) });
  // the review thread has loaded when its text box or its read-only note is there
  await screen.findAllByText(/No comments yet|Add comment|Your role can read/);
  return detail;
};
const openBuilds = async (role: Role) => {
  stubApi(role);
  renderPage(<ProjectBuilds />, { url: `/projects/${projectId}`, pattern: '/projects/:projectId' });
  await screen.findByRole('heading', { level: 1 });
};

describe('factor controls (settings page)', () => {
  it('a PI sees an edit button per factor and the add-factor form', async () => {
    await openSettings('pi');
    const factors = answer<{ factors: { label: string }[] }>('pi', `/projects/${projectId}/factors`).factors;
    expect(factors.length).toBeGreaterThan(0);
    for (const f of factors) expect(screen.getByRole('button', { name: `Edit ${f.label}` })).toBeTruthy();
    expect(screen.getByRole('form', { name: 'Factor form' })).toBeTruthy();
  });

  it.each(['partner', 'viewer'] as const)('a %s sees the factors but no edit button and no factor form', async (role) => {
    await openSettings(role);
    const factors = answer<{ factors: { label: string }[] }>(role, `/projects/${projectId}/factors`).factors;
    expect(screen.getByText(factors[0]!.label)).toBeTruthy();
    expect(screen.queryByRole('button', { name: /^Edit / })).toBeNull();
    expect(screen.queryByRole('form', { name: 'Factor form' })).toBeNull();
    // the project form is shown read-only: its fieldset is disabled, and so its save button
    expect(screen.getByText('Only the project’s PI changes these.')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Save project' }).matches(':disabled')).toBe(true);
  });
});

describe('build page', () => {
  it('a PI may edit, discard and branch a build of the home lab', async () => {
    const detail = await openBuild('pi');
    expect(detail.permissions.edit).toBe(true);
    expect(screen.getByRole('link', { name: 'Edit' })).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Discard' })).toBeTruthy();
    expect(screen.getByRole('link', { name: 'New child build' })).toBeTruthy();
  });

  it('a partner sees another lab’s build without edit, discard or upload, and may comment', async () => {
    const detail = await openBuild('partner');
    expect(detail.permissions).toEqual({ edit: false, upload: false, review: false, comment: true });
    expect(screen.queryByRole('link', { name: 'Edit' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Discard' })).toBeNull();
    expect(screen.queryByRole('link', { name: 'New child build' })).toBeNull();
    expect(screen.queryByLabelText('Choose curve files')).toBeNull();
    expect(screen.getByRole('button', { name: 'Add comment' })).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Approve' })).toBeNull();
  });

  it('a viewer sees no write button at all', async () => {
    await openBuild('viewer');
    expect(screen.queryAllByRole('button').map((b) => b.textContent)).toEqual(['Show history']);
    expect(screen.queryByRole('link', { name: 'Edit' })).toBeNull();
    expect(screen.getByText('Your role can read this thread but not comment.')).toBeTruthy();
  });
});

describe('review controls', () => {
  const openThread = async (role: Role) => {
    stubApi(role);
    const detail = answer<Detail>(role, `/builds/${testedBuildId}`);
    renderPage(<ReviewThread buildId={testedBuildId} projectId={projectId} permissions={detail.permissions} status={detail.build.status} />);
    await screen.findAllByText(/No comments yet|Add comment|Your role can read/);
    return detail;
  };

  it('a PI sees approve and needs-work on a tested build', async () => {
    const detail = await openThread('pi');
    expect(detail.build.status).toBe('tested');
    expect(screen.getByRole('button', { name: 'Approve' })).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Needs work' })).toBeTruthy();
    expect(screen.getByLabelText('Comment or verdict')).toBeTruthy();
  });

  it('a researcher may comment on the same build but gives no verdict', async () => {
    await openThread('researcher');
    expect(screen.getByRole('button', { name: 'Add comment' })).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Approve' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Needs work' })).toBeNull();
  });
});

describe('builds table page', () => {
  it('a researcher is offered a new build and an upload', async () => {
    await openBuilds('researcher');
    const header = screen.getByRole('heading', { level: 1 }).closest('header') ?? document.body;
    expect(within(header as HTMLElement).getByRole('link', { name: 'New build' })).toBeTruthy();
    expect(within(header as HTMLElement).getByRole('link', { name: 'Upload curves' })).toBeTruthy();
  });

  it('a viewer is offered neither', async () => {
    await openBuilds('viewer');
    expect(screen.queryByRole('link', { name: 'New build' })).toBeNull();
    expect(screen.queryByRole('link', { name: 'Upload curves' })).toBeNull();
  });
});
