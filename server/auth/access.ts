// The server's permission guard. Every route declares what it checks (server/lib/route.ts); this
// module checks it against the one role × action table (shared/auth/permissions.ts), loading the
// project, build, curve, file or import profile the path names on the way.
import { eq, sql } from 'drizzle-orm';
import type { Db } from '../db';
import { builds, curves, files, importProfiles, lots, memberships, projects, referenceCurves, targets } from '../db/schema';
import type { AppContext, AuthUser } from '../context';
import type { ProjectRole } from '../../shared/schemas/project';
import { mayCreateProject, partnerLabProblem, profileLabProblem, refusalText, roleAllows, type Actor, type ProjectAction } from '../../shared/auth/permissions';
import { forbidden, notFound, unauthorized } from '../lib/errors';


export type { ProjectAction };

type BuildRow = typeof builds.$inferSelect;
type CurveRow = typeof curves.$inferSelect;
type FileRow = typeof files.$inferSelect;
type ProfileRow = typeof importProfiles.$inferSelect;
type TargetRow = typeof targets.$inferSelect;
type LotRow = typeof lots.$inferSelect;
type ReferenceCurveRow = typeof referenceCurves.$inferSelect;

/** What the path's {id} names on a project-scoped route. */
export type Scope = 'project' | 'build' | 'curve' | 'file' | 'import-profile' | 'target' | 'lot' | 'reference-curve';

/**
 * What a route checks before its handler runs:
 * - 'public': nothing (anyone, signed in or not)
 * - 'signed-in': any signed-in person (on their own things)
 * - 'site-admin': site administrators only
 * - 'create-project': signed in and not a partner-lab member
 * - { action, on }: an action of the role table on the project the path's {id} leads to
 *   (a project, or the project of a build, curve, file or import profile); `members` also
 *   refuses site admins who are not members of that project; `idFrom: 'body'` takes the
 *   project's id from the body's `projectId` instead (routes without one in the path)
 */
export type Permission = 'public' | 'signed-in' | 'site-admin' | 'create-project' | { action: ProjectAction; on: Scope; members?: true; idFrom?: 'body' };

export interface ProjectAccess {
  projectId: number;
  role: ProjectRole | 'admin';
  user: AuthUser;
}

/** What a permission check hands the handler, by scope. */
export type Guarded<P> = P extends { on: 'project' }
  ? { access: ProjectAccess }
  : P extends { on: 'build' }
    ? { access: ProjectAccess; build: BuildRow }
    : P extends { on: 'curve' }
      ? { access: ProjectAccess; build: BuildRow; curve: CurveRow }
      : P extends { on: 'file' }
        ? { access: ProjectAccess; file: FileRow }
        : P extends { on: 'import-profile' }
          ? { access: ProjectAccess; profile: ProfileRow }
          : P extends { on: 'target' }
            ? { access: ProjectAccess; target: TargetRow }
            : P extends { on: 'lot' }
              ? { access: ProjectAccess; lot: LotRow }
              : P extends { on: 'reference-curve' }
                ? { access: ProjectAccess; referenceCurve: ReferenceCurveRow }
                : unknown;

export function requireUser(user: AuthUser | undefined): AuthUser {
  if (!user) throw unauthorized();
  return user;
}

/** The acting person as the shared rules see them. */
export function actorOf(access: ProjectAccess): Actor {
  return { standing: access.role, labId: access.user.labId };
}

/** Asked on every project route: one prepared Drizzle join, compiled once per database. */
const standingStatements = new WeakMap<object, ReturnType<typeof prepareStanding>>();
function prepareStanding(db: Db) {
  return db
    .select({ id: projects.id, role: memberships.role })
    .from(projects)
    .leftJoin(memberships, sql`${memberships.projectId} = ${projects.id} and ${memberships.userId} = ${sql.placeholder('userId')}`)
    .where(eq(projects.id, sql.placeholder('projectId')))
    .prepare();
}

/**
 * The user's access to a project, checked for one action. A project the user cannot see answers
 * 404 (not 403), so partners cannot probe for projects. With `members`, a site admin who is not a
 * member of the project is refused too (for things only members have, like their own notices).
 */
export function requireProject(db: Db, user: AuthUser | undefined, projectId: number, action: ProjectAction, options: { members?: boolean } = {}): ProjectAccess {
  const who = requireUser(user);
  let statement = standingStatements.get(db.$client);
  if (!statement) {
    statement = prepareStanding(db);
    standingStatements.set(db.$client, statement);
  }
  const found = statement.get({ userId: who.id, projectId });
  if (!found) throw notFound(`Project ${projectId}`);
  if (who.isAdmin) {
    if (options.members && !found.role) throw notFound('Your membership');
    return { projectId, role: 'admin', user: who };
  }
  const role = found.role;
  if (!role) throw notFound(`Project ${projectId}`);
  if (!roleAllows(role, action)) throw forbidden(refusalText(role, action));
  return { projectId, role, user: who };
}

export function can(access: { role: ProjectRole | 'admin' }, action: ProjectAction): boolean {
  return roleAllows(access.role, action);
}

/** The partner rule on one build: a 403 unless the action is allowed on a build of that lab. */
export function requireOwnLab(access: ProjectAccess, action: ProjectAction, buildLabId: number | null): void {
  const problem = partnerLabProblem(actorOf(access), action, buildLabId);
  if (problem) throw forbidden(problem);
}

/** The import-profile rule: a 403 unless the person may keep profiles for that lab. */
export function requireProfileLab(access: ProjectAccess, labId: number | null): void {
  const problem = profileLabProblem(actorOf(access), labId);
  if (problem) throw forbidden(problem);
}

function loadBuild(db: Db, id: number): BuildRow {
  const row = db.select().from(builds).where(eq(builds.id, id)).get();
  if (!row) throw notFound(`Build ${id}`);
  return row;
}

/**
 * Check a route's permission for this caller and the path's ids; returns what it loaded on the
 * way (the access and the build, curve, file or profile), which the handler receives.
 */
export function guard(ctx: AppContext, user: AuthUser | undefined, permission: Permission, ids: Record<string, number>): Record<string, unknown> {
  const { db } = ctx;
  if (permission === 'public') return {};
  const who = requireUser(user);
  if (permission === 'signed-in') return {};
  if (permission === 'site-admin') {
    if (!who.isAdmin) throw forbidden('Only site administrators may do this.');
    return {};
  }
  if (permission === 'create-project') {
    if (!mayCreateProject(who)) throw forbidden('Partner-lab members cannot create projects; ask the project PI to invite you.');
    return {};
  }
  const id = ids.id!;
  const { action, on } = permission;
  const options = { members: permission.members === true };
  switch (on) {
    case 'project':
      return { access: requireProject(db, who, id, action, options) };
    case 'build': {
      const build = loadBuild(db, id);
      const access = requireProject(db, who, build.projectId, action, options);
      requireOwnLab(access, action, build.labId);
      return { access, build };
    }
    case 'curve': {
      const curve = db.select().from(curves).where(eq(curves.id, id)).get();
      if (!curve) throw notFound(`Curve ${id}`);
      const build = loadBuild(db, curve.buildId);
      const access = requireProject(db, who, build.projectId, action, options);
      requireOwnLab(access, action, build.labId);
      return { access, build, curve };
    }
    case 'file': {
      const file = db.select().from(files).where(eq(files.id, id)).get();
      if (!file || file.projectId == null) throw notFound(`File ${id}`);
      return { access: requireProject(db, who, file.projectId, action, options), file };
    }
    case 'import-profile': {
      const profile = db.select().from(importProfiles).where(eq(importProfiles.id, id)).get();
      if (!profile || profile.projectId == null) throw notFound(`Import profile ${id}`);
      const access = requireProject(db, who, profile.projectId, action, options);
      if (action === 'manageProfiles') requireProfileLab(access, profile.labId);
      return { access, profile };
    }
    case 'target': {
      const target = db.select().from(targets).where(eq(targets.id, id)).get();
      if (!target) throw notFound(`Target ${id}`);
      return { access: requireProject(db, who, target.projectId, action, options), target };
    }
    case 'lot': {
      const lot = db.select().from(lots).where(eq(lots.id, id)).get();
      if (!lot) throw notFound(`Lot ${id}`);
      return { access: requireProject(db, who, lot.projectId, action, options), lot };
    }
    case 'reference-curve': {
      const referenceCurve = db.select().from(referenceCurves).where(eq(referenceCurves.id, id)).get();
      if (!referenceCurve) throw notFound(`Reference curve ${id}`);
      return { access: requireProject(db, who, referenceCurve.projectId, action, options), referenceCurve };
    }
  }
}
