// Who may do what in a project. Every route asks here; the client only hides what this refuses.
import { and, eq } from 'drizzle-orm';
import type { Db } from '../db';
import { memberships, projects } from '../db/schema';
import type { AuthUser } from '../context';
import type { ProjectRole } from '../../shared/schemas/project';
import { forbidden, notFound, unauthorized } from '../lib/errors';

export type ProjectAction =
  | 'read'
  | 'editSettings'
  | 'invite'
  | 'editFactors'
  | 'createBuild'
  | 'deleteBuild'
  | 'fit'
  | 'plan'
  | 'review'
  | 'comment'
  | 'manageProfiles'
  | 'manageAnyLabProfile';

/** The role matrix, in one place: which per-project roles may do each action (admins may do all). */
export const ROLE_MATRIX: Record<ProjectAction, readonly ProjectRole[]> = {
  read: ['pi', 'researcher', 'partner', 'viewer'],
  editSettings: ['pi'],
  invite: ['pi'],
  editFactors: ['pi', 'researcher'],
  createBuild: ['pi', 'researcher', 'partner'],
  deleteBuild: ['pi', 'researcher'],
  fit: ['pi', 'researcher'],
  plan: ['pi', 'researcher'],
  review: ['pi'],
  comment: ['pi', 'researcher', 'partner'],
  /** save or remove import profiles, for one's own lab only (see requireProfileLab) */
  manageProfiles: ['pi', 'researcher', 'partner'],
  /** …for any lab of the project, or for builds without a lab */
  manageAnyLabProfile: ['pi'],
};

export interface ProjectAccess {
  projectId: number;
  role: ProjectRole | 'admin';
  user: AuthUser;
}

export function requireUser(user: AuthUser | undefined): AuthUser {
  if (!user) throw unauthorized();
  return user;
}

export function projectRole(db: Db, user: AuthUser, projectId: number): ProjectRole | null {
  const row = db
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.projectId, projectId), eq(memberships.userId, user.id)))
    .get();
  return row?.role ?? null;
}

/**
 * Resolve the user's access to a project and check one action.
 * A project the user cannot see answers 404 (not 403), so partners cannot probe for projects.
 */
const accessStatements = new WeakMap<object, { projectRole: import('better-sqlite3').Statement }>();

/**
 * Resolve the user's access to a project and check one action.
 * A project the user cannot see answers 404 (not 403), so partners cannot probe for projects.
 */
export function requireProject(db: Db, user: AuthUser | undefined, projectId: number, action: ProjectAction): ProjectAccess {
  const who = requireUser(user);
  let statements = accessStatements.get(db.$client);
  if (!statements) {
    // asked on every project route: one prepared join, compiled once per database
    statements = { projectRole: db.$client.prepare('select p.id, m.role from projects p left join memberships m on m.project_id = p.id and m.user_id = ? where p.id = ?') };
    accessStatements.set(db.$client, statements);
  }
  const found = statements.projectRole.get(who.id, projectId) as { id: number; role: ProjectRole | null } | undefined;
  if (!found) throw notFound(`Project ${projectId}`);
  if (who.isAdmin) return { projectId, role: 'admin', user: who };
  const role = found.role;
  if (!role) throw notFound(`Project ${projectId}`);
  if (!ROLE_MATRIX[action].includes(role)) throw forbidden(`Your role (${role}) in this project does not allow: ${describe(action)}.`);
  return { projectId, role, user: who };
}

export function can(access: { role: ProjectRole | 'admin' }, action: ProjectAction): boolean {
  return access.role === 'admin' || ROLE_MATRIX[action].includes(access.role);
}

/** Partners may only touch builds of their own lab. */
export function requireBuildWrite(access: ProjectAccess, build: { labId: number | null }): void {
  if (access.role === 'viewer') throw forbidden('Viewers cannot change builds.');
  if (access.role === 'partner' && (access.user.labId == null || build.labId !== access.user.labId)) {
    throw forbidden('Partners may only change builds of their own lab.');
  }
}

/**
 * Import profiles decide how a lab's files are read, so only the lab's own members (with a
 * writing role in the project) and the project's PIs (and admins) may save or remove one for it.
 * A profile without a lab (for builds that have none) is for PIs and admins only.
 */
export function requireProfileLab(access: ProjectAccess, labId: number | null): void {
  if (!can(access, 'manageProfiles')) throw forbidden(`Your role (${access.role}) in this project does not allow: ${describe('manageProfiles')}.`);
  if (can(access, 'manageAnyLabProfile')) return;
  if (labId == null) throw forbidden('Only the project’s PIs may save or remove import profiles that apply to builds without a lab.');
  if (access.user.labId !== labId) throw forbidden('You may only save or remove import profiles for your own lab; a PI of the project can do it for other labs.');
}

function describe(action: ProjectAction): string {
  const words: Record<ProjectAction, string> = {
    read: 'read the project',
    editSettings: 'change project settings',
    invite: 'invite people',
    editFactors: 'change factors or responses',
    createBuild: 'create builds',
    deleteBuild: 'delete builds',
    fit: 'fit surfaces',
    plan: 'plan designs',
    review: 'give review verdicts',
    comment: 'comment',
    manageProfiles: 'manage import profiles',
    manageAnyLabProfile: 'manage import profiles of other labs',
  };
  return words[action];
}
