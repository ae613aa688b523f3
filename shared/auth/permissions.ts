// Who may do what in a project: the one role × action table. The server's guard refuses what it
// does not allow; the client reads the same table to hide what would be refused.
// Site administrators may do every action in every project. Pure: no I/O.
import { ROLES, type ProjectRole } from '../schemas/project';

export { ROLES, type ProjectRole };

/** A person's standing in one project: a project role, site admin, or none (not a member). */
export type ProjectStanding = ProjectRole | 'admin' | null;

interface ActionRule {
  /** the project roles that may do it (admins always may) */
  roles: readonly ProjectRole[];
  /** what it is, in the words of a refusal: "Your role … does not allow: <says>." */
  says: string;
  /** partners may do it only on builds (or for labs) of their own lab */
  partnerOwnLab?: true;
}

/**
 * The table. Keys are the actions routes check; `roles` lists who may. Partners are further held
 * to their own lab's builds where `partnerOwnLab` is set (see `partnerLabProblem`).
 */
export const PROJECT_ACTIONS = {
  read: { roles: ['pi', 'researcher', 'partner', 'viewer'], says: 'read the project' },
  editSettings: { roles: ['pi'], says: 'change project settings' },
  invite: { roles: ['pi'], says: 'invite people' },
  editFactors: { roles: ['pi', 'researcher'], says: 'change factors or responses' },
  createBuild: { roles: ['pi', 'researcher', 'partner'], says: 'create builds', partnerOwnLab: true },
  editBuild: { roles: ['pi', 'researcher', 'partner'], says: 'change builds', partnerOwnLab: true },
  uploadCurves: { roles: ['pi', 'researcher', 'partner'], says: 'upload curves', partnerOwnLab: true },
  deleteCurves: { roles: ['pi', 'researcher'], says: 'remove curves' },
  fit: { roles: ['pi', 'researcher'], says: 'fit surfaces' },
  plan: { roles: ['pi', 'researcher'], says: 'plan designs' },
  review: { roles: ['pi'], says: 'give review verdicts' },
  /** set, change or remove the programme's targets */
  editTargets: { roles: ['pi'], says: 'set targets' },
  /** choose the project's benchmark and import or remove its reference curves */
  setBenchmark: { roles: ['pi'], says: 'set the benchmark' },
  /** record catalyst lots and change their records (researchers receive and make batches) */
  editLots: { roles: ['pi', 'researcher'], says: 'record catalyst lots' },
  comment: { roles: ['pi', 'researcher', 'partner'], says: 'comment' },
  /** save or remove import profiles, for one's own lab (see `profileLabProblem`) */
  manageProfiles: { roles: ['pi', 'researcher', 'partner'], says: 'manage import profiles' },
  /** …for any lab of the project, or for builds without a lab */
  manageAnyLabProfile: { roles: ['pi'], says: 'manage import profiles of other labs' },
} as const satisfies Record<string, ActionRule>;

export type ProjectAction = keyof typeof PROJECT_ACTIONS;
export const PROJECT_ACTION_NAMES = Object.keys(PROJECT_ACTIONS) as ProjectAction[];

/** Does this standing allow the action (ignoring the partner lab rule)? */
export function roleAllows(standing: ProjectStanding, action: ProjectAction): boolean {
  if (standing === 'admin') return true;
  if (standing === null) return false;
  return (PROJECT_ACTIONS[action].roles as readonly ProjectRole[]).includes(standing);
}

/** The roles (admin first) that may do an action: what the role matrix expects of a route. */
export function rolesAllowed(action: ProjectAction): ('admin' | ProjectRole)[] {
  return ['admin', ...PROJECT_ACTIONS[action].roles];
}

/** "Your role (viewer) in this project does not allow: create builds." */
export function refusalText(standing: ProjectStanding, action: ProjectAction): string {
  return `Your role (${standing ?? 'none'}) in this project does not allow: ${PROJECT_ACTIONS[action].says}.`;
}

/** Every action with whether this standing allows it (the project's permissions answer and the client's gating). */
export function allowedActions(standing: ProjectStanding): Record<ProjectAction, boolean> {
  return Object.fromEntries(PROJECT_ACTION_NAMES.map((action) => [action, roleAllows(standing, action)])) as Record<ProjectAction, boolean>;
}

/** The person acting: their standing in the project and their own lab. */
export interface Actor {
  standing: ProjectStanding;
  labId: number | null;
}

/**
 * The partner rule, in one place: a partner acts only on builds of its own lab. Returns why an
 * action on a build of `buildLabId` is refused, or null when it is allowed (other roles: always).
 */
export function partnerLabProblem(actor: Actor, action: ProjectAction, buildLabId: number | null): string | null {
  if (actor.standing !== 'partner' || !('partnerOwnLab' in PROJECT_ACTIONS[action])) return null;
  if (actor.labId != null && buildLabId === actor.labId) return null;
  return 'Partners may only change builds of their own lab.';
}

/**
 * The lab a new build is recorded for: partners always their own lab (asking for another is
 * refused), everyone else the lab asked for, else their own.
 */
export function labForNewBuild(actor: Actor, requestedLabId: number | null | undefined): { labId: number | null; problem: string | null } {
  if (actor.standing === 'partner') {
    if (requestedLabId != null && requestedLabId !== actor.labId) return { labId: null, problem: 'Partners may only create builds for their own lab.' };
    return { labId: actor.labId, problem: null };
  }
  return { labId: requestedLabId ?? actor.labId ?? null, problem: null };
}

/**
 * Import profiles decide how a lab's files are read, so only the lab's own members (with a
 * writing role) and the project's PIs (and admins) may save or remove one for it; a profile for
 * builds without a lab is for PIs and admins only. Returns why not, or null when allowed.
 */
export function profileLabProblem(actor: Actor, profileLabId: number | null): string | null {
  if (!roleAllows(actor.standing, 'manageProfiles')) return refusalText(actor.standing, 'manageProfiles');
  if (roleAllows(actor.standing, 'manageAnyLabProfile')) return null;
  if (profileLabId == null) return 'Only the project’s PIs may save or remove import profiles that apply to builds without a lab.';
  if (actor.labId !== profileLabId) return 'You may only save or remove import profiles for your own lab; a PI of the project can do it for other labs.';
  return null;
}

/** The lab a new import profile is saved for: not given, the person's own; partners always their own. */
export function labForNewProfile(actor: Actor, requestedLabId: number | null | undefined): { labId: number | null; problem: string | null } {
  const labId = requestedLabId === undefined ? actor.labId : requestedLabId;
  if (actor.standing === 'partner') {
    if (labId != null && labId !== actor.labId) return { labId: null, problem: 'Partners may only save profiles for their own lab.' };
    return { labId: actor.labId, problem: null };
  }
  return { labId, problem: null };
}

/**
 * The lab a person is held to for an action, or null when they may act for any lab: what a form
 * locks its lab field to (partners: their own lab on lab-bound actions).
 */
export function labHeldTo(actor: Actor, action: ProjectAction): number | null {
  return actor.standing === 'partner' && 'partnerOwnLab' in PROJECT_ACTIONS[action] ? actor.labId : null;
}

/** Site level: partner-lab members cannot create projects (they are invited into them). */
export function mayCreateProject(person: { isAdmin: boolean; labKind: 'home' | 'partner' | null }): boolean {
  return person.isAdmin || person.labKind !== 'partner';
}

/** What the build page may offer on one build: the same rules the routes check. */
export function buildPermissions(actor: Actor, buildLabId: number | null) {
  const onBuild = (action: ProjectAction) => roleAllows(actor.standing, action) && partnerLabProblem(actor, action, buildLabId) === null;
  return { edit: onBuild('editBuild'), upload: onBuild('uploadCurves'), review: roleAllows(actor.standing, 'review'), comment: roleAllows(actor.standing, 'comment') };
}
