// Cookie sessions stored in SQLite (revocable) and personal API tokens; resolves req.user.
import type { Request, Response, NextFunction } from 'express';
import { and, eq, isNull, gt } from 'drizzle-orm';
import type { AppContext, AuthUser } from '../context';
import { apiTokens, labs, sessions, users } from '../db/schema';
import { newToken, sha256 } from './tokens';
import { AppError } from '../lib/errors';

export const SESSION_COOKIE = 'cw_session';
const SESSION_DAYS = 14;

export function createSession(ctx: AppContext, userId: number, userAgent: string | undefined) {
  const token = newToken();
  const csrfToken = newToken(24);
  const expiresAt = new Date(Date.now() + SESSION_DAYS * 86400_000).toISOString();
  ctx.db.insert(sessions).values({ tokenHash: sha256(token), csrfToken, userId, userAgent: userAgent?.slice(0, 200) ?? null, expiresAt }).run();
  return { token, csrfToken, expiresAt };
}

export function setSessionCookie(req: Request, res: Response, token: string, expiresAt: string) {
  res.cookie(SESSION_COOKIE, token, {
    httpOnly: true,
    sameSite: 'lax',
    secure: req.secure,
    path: '/',
    expires: new Date(expiresAt),
  });
}

function loadAuthUser(ctx: AppContext, userId: number): AuthUser | null {
  const row = ctx.db
    .select({ id: users.id, email: users.email, name: users.name, isAdmin: users.isAdmin, labId: users.labId, labKind: labs.kind, disabledAt: users.disabledAt })
    .from(users)
    .leftJoin(labs, eq(labs.id, users.labId))
    .where(eq(users.id, userId))
    .get();
  if (!row || row.disabledAt) return null;
  return { id: row.id, email: row.email, name: row.name, isAdmin: row.isAdmin, labId: row.labId, labKind: row.labKind ?? null };
}

/** Reads a Bearer token or the session cookie; never rejects — routes decide. */
export function authenticate(ctx: AppContext) {
  return (req: Request, _res: Response, next: NextFunction) => {
    const header = req.get('authorization');
    const now = new Date().toISOString();
    if (header?.startsWith('Bearer ')) {
      const token = header.slice(7).trim();
      const row = ctx.db.select().from(apiTokens).where(and(eq(apiTokens.tokenHash, sha256(token)), isNull(apiTokens.revokedAt))).get();
      if (!row) return next(new AppError(401, 'bad-token', 'The API token is unknown or revoked.'));
      const user = loadAuthUser(ctx, row.userId);
      if (!user) return next(new AppError(401, 'bad-token', 'The API token belongs to a disabled account.'));
      req.user = user;
      req.authVia = 'token';
      ctx.db.update(apiTokens).set({ lastUsedAt: now }).where(eq(apiTokens.id, row.id)).run();
      return next();
    }
    const cookie = (req.cookies as Record<string, string> | undefined)?.[SESSION_COOKIE];
    if (cookie) {
      const row = ctx.db
        .select()
        .from(sessions)
        .where(and(eq(sessions.tokenHash, sha256(cookie)), isNull(sessions.revokedAt), gt(sessions.expiresAt, now)))
        .get();
      if (row) {
        const user = loadAuthUser(ctx, row.userId);
        if (user) {
          req.user = user;
          req.authVia = 'cookie';
          req.sessionId = row.id;
          req.csrfToken = row.csrfToken;
        }
      }
    }
    next();
  };
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * CSRF protection for cookie-authenticated writes (synchronizer token pattern, OWASP): the
 * session's token, handed out by /api/auth/me and /api/auth/login, must come back in the
 * X-CSRF-Token header. Token-authenticated scripts are not exposed to CSRF and skip this.
 */
export function csrfGuard() {
  return (req: Request, _res: Response, next: NextFunction) => {
    if (SAFE_METHODS.has(req.method) || req.authVia !== 'cookie') return next();
    const sent = req.get('x-csrf-token');
    if (!sent || sent !== req.csrfToken) {
      return next(new AppError(403, 'csrf', 'Missing or wrong X-CSRF-Token header for a signed-in write; reload the page and try again.'));
    }
    next();
  };
}
