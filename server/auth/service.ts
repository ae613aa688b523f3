// Sign-in, sign-out, who am I, my sessions, personal API tokens, and accepting invitations:
// the rules and the queries. Cookies and rate limits are HTTP and stay in the router.
import { and, desc, eq, isNull } from 'drizzle-orm';
import type { z } from 'zod';
import type { AppContext, AuthUser } from '../context';
import { apiTokens, invitations, memberships, projects, sessions, users } from '../db/schema';
import type { apiTokenCreateSchema, inviteAcceptSchema, loginSchema } from '../../shared/schemas/auth';
import { AppError, notFound } from '../lib/errors';
import { audit } from '../lib/audit';
import { hashPassword, verifyPassword, verifyAgainstNothing } from './passwords';
import { createSession } from './sessions';
import { newToken, sha256 } from './tokens';

export function publicUser(u: { id: number; email: string; name: string; isAdmin: boolean; labId: number | null }) {
  return { id: u.id, email: u.email, name: u.name, isAdmin: u.isAdmin, labId: u.labId };
}

/** Check e-mail and password and open a session; 401 bad-credentials whatever was wrong. */
export async function signIn(ctx: AppContext, input: z.output<typeof loginSchema>, userAgent: string | undefined) {
  const { db } = ctx;
  const user = db.select().from(users).where(eq(users.email, input.email)).get();
  // the hash runs for unknown addresses, disabled accounts and unset passwords too, so the
  // answer takes as long whether or not the address has an account
  const passwordOk = user?.passwordHash ? await verifyPassword(user.passwordHash, input.password) : await verifyAgainstNothing(input.password);
  if (!user || user.disabledAt || !passwordOk) throw new AppError(401, 'bad-credentials', 'E-mail or password is wrong.');
  const session = createSession(ctx, user.id, userAgent);
  audit(db, { userId: user.id, action: 'login', entity: 'session' });
  return { user: publicUser(user), session };
}

export function signOut(ctx: AppContext, sessionId: number | undefined, userId: number | null) {
  if (!sessionId) return;
  ctx.db.update(sessions).set({ revokedAt: new Date().toISOString() }).where(eq(sessions.id, sessionId)).run();
  audit(ctx.db, { userId, action: 'logout', entity: 'session', entityId: sessionId });
}

export function myRoles(ctx: AppContext, user: AuthUser) {
  return ctx.db
    .select({ projectId: memberships.projectId, role: memberships.role, notify: memberships.notify })
    .from(memberships)
    .where(eq(memberships.userId, user.id))
    .all();
}

export function listSessions(ctx: AppContext, user: AuthUser, currentSessionId: number | undefined) {
  const rows = ctx.db
    .select({ id: sessions.id, createdAt: sessions.createdAt, expiresAt: sessions.expiresAt, userAgent: sessions.userAgent, revokedAt: sessions.revokedAt })
    .from(sessions)
    .where(eq(sessions.userId, user.id))
    .orderBy(desc(sessions.id))
    .limit(50)
    .all();
  return rows.map((s) => ({ ...s, current: s.id === currentSessionId }));
}

export function revokeSession(ctx: AppContext, user: AuthUser, id: number) {
  const { db } = ctx;
  const row = db.select().from(sessions).where(and(eq(sessions.id, id), eq(sessions.userId, user.id))).get();
  if (!row) throw notFound(`Session ${id}`);
  db.update(sessions).set({ revokedAt: new Date().toISOString() }).where(eq(sessions.id, id)).run();
  audit(db, { userId: user.id, action: 'revoke', entity: 'session', entityId: id });
}

export function listTokens(ctx: AppContext, user: AuthUser) {
  return ctx.db
    .select({ id: apiTokens.id, name: apiTokens.name, scope: apiTokens.scope, createdAt: apiTokens.createdAt, lastUsedAt: apiTokens.lastUsedAt, revokedAt: apiTokens.revokedAt })
    .from(apiTokens)
    .where(eq(apiTokens.userId, user.id))
    .all();
}

/** A new personal API token, shown once; `parentTokenId` records the token it was made with, if any. */
export function createToken(ctx: AppContext, user: AuthUser, input: z.output<typeof apiTokenCreateSchema>, parentTokenId: number | null) {
  const token = `cw_${newToken()}`;
  const row = ctx.db.insert(apiTokens).values({ userId: user.id, name: input.name, tokenHash: sha256(token), scope: input.scope, parentTokenId }).returning().get();
  audit(ctx.db, { userId: user.id, action: 'create', entity: 'api-token', entityId: row.id, after: { name: input.name, scope: input.scope } });
  return { token, id: row.id, name: row.name, scope: row.scope, note: 'Shown once: store it now.' };
}

/** Revoke a token and every token made with it, down the chain; returns how many were revoked. */
export function revokeToken(ctx: AppContext, user: AuthUser, id: number): number {
  const { db } = ctx;
  const row = db.select().from(apiTokens).where(and(eq(apiTokens.id, id), eq(apiTokens.userId, user.id))).get();
  if (!row) throw notFound(`API token ${id}`);
  const result = db.$client
    .prepare(
      `with recursive chain(id) as (select ? union select t.id from api_tokens t join chain c on t.parent_token_id = c.id)
       update api_tokens set revoked_at = ? where id in (select id from chain) and revoked_at is null`,
    )
    .run(id, new Date().toISOString());
  audit(db, { userId: user.id, action: 'revoke', entity: 'api-token', entityId: id, after: { revoked: result.changes } });
  return result.changes;
}

function findInvitation(ctx: AppContext, token: string) {
  const row = ctx.db
    .select({ inv: invitations, projectName: projects.name })
    .from(invitations)
    .innerJoin(projects, eq(projects.id, invitations.projectId))
    .where(eq(invitations.tokenHash, sha256(token)))
    .get();
  if (!row) throw notFound('Invitation');
  if (row.inv.acceptedAt) throw new AppError(410, 'invitation-used', 'This invitation has already been used; sign in instead.');
  if (row.inv.expiresAt < new Date().toISOString()) throw new AppError(410, 'invitation-expired', 'This invitation has expired (links last 7 days); ask for a new one.');
  return row;
}

export function readInvitation(ctx: AppContext, token: string) {
  const { inv, projectName } = findInvitation(ctx, token);
  const existing = ctx.db.select({ id: users.id, name: users.name }).from(users).where(eq(users.email, inv.email)).get();
  return { email: inv.email, role: inv.role, projectId: inv.projectId, projectName, expiresAt: inv.expiresAt, hasAccount: Boolean(existing?.id) };
}

/**
 * Accept an invitation: the account gets its name and password (created when new), the project
 * membership its role, the invitation is used up, all in one transaction; then a session opens.
 */
export async function acceptInvitation(ctx: AppContext, token: string, input: z.output<typeof inviteAcceptSchema>, userAgent: string | undefined) {
  const { db } = ctx;
  const { inv } = findInvitation(ctx, token);
  const passwordHash = await hashPassword(input.password);
  const userId = db.transaction((tx) => {
    let user = tx.select().from(users).where(eq(users.email, inv.email)).get();
    if (user && user.passwordHash) throw new AppError(409, 'account-exists', `An account for ${inv.email} already exists; sign in and open the project instead.`);
    if (!user) {
      user = tx.insert(users).values({ email: inv.email, name: input.name, passwordHash, labId: inv.labId ?? null }).returning().get();
    } else {
      tx.update(users).set({ name: input.name, passwordHash }).where(eq(users.id, user.id)).run();
    }
    const member = tx.select().from(memberships).where(and(eq(memberships.projectId, inv.projectId), eq(memberships.userId, user.id))).get();
    if (member) tx.update(memberships).set({ role: inv.role }).where(eq(memberships.id, member.id)).run();
    else tx.insert(memberships).values({ projectId: inv.projectId, userId: user.id, role: inv.role }).run();
    tx.update(invitations).set({ acceptedAt: new Date().toISOString() }).where(and(eq(invitations.id, inv.id), isNull(invitations.acceptedAt))).run();
    return user.id;
  });
  audit(db, { userId, action: 'accept', entity: 'invitation', entityId: inv.id, projectId: inv.projectId, after: { role: inv.role } });
  const session = createSession(ctx, userId, userAgent);
  return { projectId: inv.projectId, session };
}
