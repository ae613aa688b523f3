// The role × action table, pinned: a change to who may do what shows here as a changed row.
// The role matrix API test checks the server enforces the same table on every route.
import { describe, expect, it } from 'vitest';
import { PROJECT_ACTION_NAMES, allowedActions, buildPermissions, labForNewBuild, labHeldTo, labForNewProfile, mayCreateProject, partnerLabProblem, profileLabProblem, refusalText, roleAllows, rolesAllowed } from '../../../shared/auth/permissions';

// pi: everything in the project; researcher: builds, uploads, fits, plans; partner: its own lab's builds; viewer: reads
const EXPECTED = {
  read: ['admin', 'pi', 'researcher', 'partner', 'viewer'],
  editSettings: ['admin', 'pi'],
  invite: ['admin', 'pi'],
  editFactors: ['admin', 'pi', 'researcher'],
  createBuild: ['admin', 'pi', 'researcher', 'partner'],
  editBuild: ['admin', 'pi', 'researcher', 'partner'],
  uploadCurves: ['admin', 'pi', 'researcher', 'partner'],
  deleteCurves: ['admin', 'pi', 'researcher'],
  fit: ['admin', 'pi', 'researcher'],
  plan: ['admin', 'pi', 'researcher'],
  review: ['admin', 'pi'],
  editTargets: ['admin', 'pi'],
  setBenchmark: ['admin', 'pi'],
  editLots: ['admin', 'pi', 'researcher'],
  comment: ['admin', 'pi', 'researcher', 'partner'],
  manageProfiles: ['admin', 'pi', 'researcher', 'partner'],
  manageAnyLabProfile: ['admin', 'pi'],
};

describe('the role × action table', () => {
  it('is exactly this', () => {
    expect(Object.fromEntries(PROJECT_ACTION_NAMES.map((a) => [a, rolesAllowed(a)]))).toEqual(EXPECTED);
  });

  it('answers per standing; a non-member may do nothing', () => {
    expect(roleAllows('viewer', 'read')).toBe(true);
    expect(roleAllows('viewer', 'comment')).toBe(false);
    expect(roleAllows(null, 'read')).toBe(false);
    expect(Object.values(allowedActions('admin')).every(Boolean)).toBe(true);
    expect(allowedActions('researcher')).toMatchObject({ fit: true, review: false, editSettings: false });
    expect(refusalText('viewer', 'createBuild')).toBe('Your role (viewer) in this project does not allow: create builds.');
  });
});

describe('the partner rule', () => {
  const partner = { standing: 'partner' as const, labId: 7 };
  const researcher = { standing: 'researcher' as const, labId: 1 };

  it('holds partners to their own lab’s builds on lab-bound actions only', () => {
    expect(partnerLabProblem(partner, 'editBuild', 7)).toBeNull();
    expect(partnerLabProblem(partner, 'editBuild', 8)).toMatch(/own lab/);
    expect(partnerLabProblem(partner, 'uploadCurves', null)).toMatch(/own lab/);
    expect(partnerLabProblem({ standing: 'partner', labId: null }, 'editBuild', null)).toMatch(/own lab/);
    expect(partnerLabProblem(partner, 'comment', 8)).toBeNull(); // comments are not lab-bound
    expect(partnerLabProblem(researcher, 'editBuild', 8)).toBeNull();
  });

  it('records a partner’s new build for its own lab, refusing another', () => {
    expect(labForNewBuild(partner, undefined)).toEqual({ labId: 7, problem: null });
    expect(labForNewBuild(partner, 8).problem).toMatch(/own lab/);
    expect(labForNewBuild(researcher, 8)).toEqual({ labId: 8, problem: null });
    expect(labForNewBuild(researcher, null)).toEqual({ labId: 1, problem: null });
  });

  it('lets import profiles be kept by the lab’s own writers and the PIs', () => {
    expect(profileLabProblem(researcher, 1)).toBeNull();
    expect(profileLabProblem(researcher, 7)).toMatch(/own lab/);
    expect(profileLabProblem(researcher, null)).toMatch(/PIs/);
    expect(profileLabProblem({ standing: 'pi', labId: 1 }, null)).toBeNull();
    expect(profileLabProblem({ standing: 'viewer', labId: 1 }, 1)).toMatch(/does not allow/);
    expect(labForNewProfile(partner, null)).toEqual({ labId: 7, problem: null });
    expect(labForNewProfile(partner, 8).problem).toMatch(/own lab/);
    expect(labForNewProfile(researcher, undefined)).toEqual({ labId: 1, problem: null });
    expect(labForNewProfile(researcher, null)).toEqual({ labId: null, problem: null });
  });

  it('says which lab a form locks to', () => {
    expect(labHeldTo(partner, 'createBuild')).toBe(7);
    expect(labHeldTo(partner, 'comment')).toBeNull();
    expect(labHeldTo(researcher, 'createBuild')).toBeNull();
  });

  it('gives the build page the same answers', () => {
    expect(buildPermissions(partner, 7)).toEqual({ edit: true, upload: true, review: false, comment: true });
    expect(buildPermissions(partner, 8)).toEqual({ edit: false, upload: false, review: false, comment: true });
    expect(buildPermissions({ standing: 'viewer', labId: 1 }, 1)).toEqual({ edit: false, upload: false, review: false, comment: false });
    expect(buildPermissions({ standing: 'admin', labId: null }, 8)).toEqual({ edit: true, upload: true, review: true, comment: true });
  });

  it('keeps partner-lab members from creating projects', () => {
    expect(mayCreateProject({ isAdmin: false, labKind: 'partner' })).toBe(false);
    expect(mayCreateProject({ isAdmin: true, labKind: 'partner' })).toBe(true);
    expect(mayCreateProject({ isAdmin: false, labKind: 'home' })).toBe(true);
    expect(mayCreateProject({ isAdmin: false, labKind: null })).toBe(true);
  });
});
