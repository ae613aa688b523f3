// Sign-in, sign-out, who am I, personal API tokens, and accepting invitations.
import { Router } from 'express';
import rateLimit, { ipKeyGenerator } from 'express-rate-limit';
import { and, desc, eq, isNull } from 'drizzle-orm';
import type { AppContext } from '../context';
import { apiTokens, invitations, memberships, projects, sessions, users } from '../db/schema';
import { apiTokenCreateSchema, inviteAcceptSchema, loginSchema, normalizeEmail } from '../../shared/schemas/auth';
import { parseInput, idParam } from '../lib/validate';
import { AppError, notFound } from '../lib/errors';
import { hashPassword, verifyPassword, verifyAgainstNothing } from './passwords';
import { createSession, setSessionCookie, SESSION_COOKIE } from './sessions';
import { requireUser } from './access';
import { newToken, sha256 } from './tokens';
import { audit } from '../lib/audit';

export function authRouter(ctx: AppContext): Router {
  const router = Router();
  const { db } = ctx;

  const loginLimiter = rateLimit({
    windowMs: 15 * 60 * 1000,
    limit: ctx.env.LOGIN_RATE_LIMIT,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    // the same spelling of the address as the look-up below (loginSchema normalises it too)
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${normalizeEmail(String((req.body as { email?: unknown } | undefined)?.email ?? '').slice(0, 320))}`,
    handler: (_req, _res, next) =>
      next(new AppError(429, 'rate-limited', 'Too many sign-in attempts for this address; wait 15 minutes and try again.')),
  });

  router.post('/auth/login', loginLimiter, async (req, res) => {
    const input = parseInput(loginSchema, req.body);
    const user = db.select().from(users).where(eq(users.email, input.email)).get();
    // the hash runs for unknown addresses, disabled accounts and unset passwords too, so the
    // answer takes as long whether or not the address has an account
    const passwordOk = user?.passwordHash ? await verifyPassword(user.passwordHash, input.password) : await verifyAgainstNothing(input.password);
    if (!user || user.disabledAt || !passwordOk) throw new AppError(401, 'bad-credentials', 'E-mail or password is wrong.');
    const session = createSession(ctx, user.id, req.get('user-agent'));
    setSessionCookie(req, res, session.token, session.expiresAt);
    audit(db, { userId: user.id, action: 'login', entity: 'session' });
    res.json({ user: publicUser(user), csrfToken: session.csrfToken });
  });

  router.post('/auth/logout', (req, res) => {
    if (req.sessionId) {
      db.update(sessions).set({ revokedAt: new Date().toISOString() }).where(eq(sessions.id, req.sessionId)).run();
      audit(db, { userId: req.user?.id ?? null, action: 'logout', entity: 'session', entityId: req.sessionId });
    }
    res.clearCookie(SESSION_COOKIE, { path: '/' });
    res.json({ ok: true });
  });

  router.get('/auth/me', (req, res) => {
    const user = requireUser(req.user);
    const roles = db
      .select({ projectId: memberships.projectId, role: memberships.role, notify: memberships.notify })
      .from(memberships)
      .where(eq(memberships.userId, user.id))
      .all();
    res.json({ user, roles, csrfToken: req.csrfToken ?? null });
  });

  router.get('/auth/sessions', (req, res) => {
    const user = requireUser(req.user);
    const rows = db
      .select({ id: sessions.id, createdAt: sessions.createdAt, expiresAt: sessions.expiresAt, userAgent: sessions.userAgent, revokedAt: sessions.revokedAt })
      .from(sessions)
      .where(eq(sessions.userId, user.id))
      .orderBy(desc(sessions.id))
      .limit(50)
      .all();
    res.json({ sessions: rows.map((s) => ({ ...s, current: s.id === req.sessionId })) });
  });

  router.post('/auth/sessions/:id/revoke', (req, res) => {
    const user = requireUser(req.user);
    const id = idParam(req.params.id);
    const row = db.select().from(sessions).where(and(eq(sessions.id, id), eq(sessions.userId, user.id))).get();
    if (!row) throw notFound(`Session ${id}`);
    db.update(sessions).set({ revokedAt: new Date().toISOString() }).where(eq(sessions.id, id)).run();
    audit(db, { userId: user.id, action: 'revoke', entity: 'session', entityId: id });
    res.json({ ok: true });
  });

  router.get('/auth/tokens', (req, res) => {
    const user = requireUser(req.user);
    const rows = db
      .select({ id: apiTokens.id, name: apiTokens.name, scope: apiTokens.scope, createdAt: apiTokens.createdAt, lastUsedAt: apiTokens.lastUsedAt, revokedAt: apiTokens.revokedAt })
      .from(apiTokens)
      .where(eq(apiTokens.userId, user.id))
      .all();
    res.json({ tokens: rows });
  });

  router.post('/auth/tokens', (req, res) => {
    const user = requireUser(req.user);
    const input = parseInput(apiTokenCreateSchema, req.body);
    const token = `cw_${newToken()}`;
    // tokenScopeGuard refuses this route to tokens; parentTokenId records the chain should that ever change
    const row = db.insert(apiTokens).values({ userId: user.id, name: input.name, tokenHash: sha256(token), scope: input.scope, parentTokenId: req.tokenId ?? null }).returning().get();
    audit(db, { userId: user.id, action: 'create', entity: 'api-token', entityId: row.id, after: { name: input.name, scope: input.scope } });
    res.status(201).json({ token, id: row.id, name: row.name, scope: row.scope, note: 'Shown once: store it now.' });
  });

  router.post('/auth/tokens/:id/revoke', (req, res) => {
    const user = requireUser(req.user);
    const id = idParam(req.params.id);
    const row = db.select().from(apiTokens).where(and(eq(apiTokens.id, id), eq(apiTokens.userId, user.id))).get();
    if (!row) throw notFound(`API token ${id}`);
    // the token and every token made with it, down the chain
    const result = db.$client
      .prepare(
        `with recursive chain(id) as (select ? union select t.id from api_tokens t join chain c on t.parent_token_id = c.id)
         update api_tokens set revoked_at = ? where id in (select id from chain) and revoked_at is null`,
      )
      .run(id, new Date().toISOString());
    audit(db, { userId: user.id, action: 'revoke', entity: 'api-token', entityId: id, after: { revoked: result.changes } });
    res.json({ ok: true, revoked: result.changes });
  });

  function findInvitation(token: string) {
    const row = db
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

  router.get('/invitations/:token', (req, res) => {
    const { inv, projectName } = findInvitation(String(req.params.token));
    const existing = db.select({ id: users.id, name: users.name }).from(users).where(eq(users.email, inv.email)).get();
    res.json({ email: inv.email, role: inv.role, projectId: inv.projectId, projectName, expiresAt: inv.expiresAt, hasAccount: Boolean(existing?.id) });
  });

  router.post('/invitations/:token/accept', async (req, res) => {
    const { inv } = findInvitation(String(req.params.token));
    const input = parseInput(inviteAcceptSchema, req.body);
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
    const session = createSession(ctx, userId, req.get('user-agent'));
    setSessionCookie(req, res, session.token, session.expiresAt);
    res.status(201).json({ ok: true, projectId: inv.projectId, csrfToken: session.csrfToken });
  });

  return router;
}

export function publicUser(u: { id: number; email: string; name: string; isAdmin: boolean; labId: number | null }) {
  return { id: u.id, email: u.email, name: u.name, isAdmin: u.isAdmin, labId: u.labId };
}
