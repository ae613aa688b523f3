// Cookie sessions stored in SQLite (revocable) and personal API tokens; resolves req.user.
import type { Request, Response, NextFunction } from 'express';
import { createHash, timingSafeEqual } from 'node:crypto';
import type { AppContext, AuthUser } from '../context';
import { and, eq, gt, isNull, sql } from 'drizzle-orm';
import { apiTokens, labs, sessions, users } from '../db/schema';
import { newToken, sha256 } from './tokens';
import { AppError } from '../lib/errors';
import { originAllowed } from '../lib/base-url';

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

/**
 * Every request resolves its caller: one prepared Drizzle join per way in (session cookie or
 * API token), compiled once per database.
 */
const statements = new WeakMap<object, ReturnType<typeof prepareAuth>>();
function prepareAuth(ctx: AppContext) {
  const { db } = ctx;
  const person = { id: users.id, email: users.email, name: users.name, isAdmin: users.isAdmin, labId: users.labId, labKind: labs.kind };
  return {
    session: db
      .select({ ...person, sessionId: sessions.id, csrfToken: sessions.csrfToken })
      .from(sessions)
      .innerJoin(users, eq(users.id, sessions.userId))
      .leftJoin(labs, eq(labs.id, users.labId))
      .where(and(eq(sessions.tokenHash, sql.placeholder('hash')), isNull(sessions.revokedAt), gt(sessions.expiresAt, sql.placeholder('now')), isNull(users.disabledAt)))
      .prepare(),
    token: db
      .select({ ...person, tokenId: apiTokens.id, tokenScope: apiTokens.scope, lastUsedAt: apiTokens.lastUsedAt, disabledAt: users.disabledAt })
      .from(apiTokens)
      .innerJoin(users, eq(users.id, apiTokens.userId))
      .leftJoin(labs, eq(labs.id, users.labId))
      .where(and(eq(apiTokens.tokenHash, sql.placeholder('hash')), isNull(apiTokens.revokedAt)))
      .prepare(),
    touchToken: db.update(apiTokens).set({ lastUsedAt: sql.placeholder('now') as unknown as string }).where(eq(apiTokens.id, sql.placeholder('id'))).prepare(),
  };
}
function auth(ctx: AppContext) {
  let found = statements.get(ctx.db.$client);
  if (!found) {
    found = prepareAuth(ctx);
    statements.set(ctx.db.$client, found);
  }
  return found;
}

function toAuthUser(row: { id: number; email: string; name: string; isAdmin: boolean; labId: number | null; labKind: 'home' | 'partner' | null }): AuthUser {
  return { id: row.id, email: row.email, name: row.name, isAdmin: row.isAdmin, labId: row.labId, labKind: row.labKind ?? null };
}

/** Reads a Bearer token or the session cookie; never rejects — routes decide. */
export function authenticate(ctx: AppContext) {
  return (req: Request, _res: Response, next: NextFunction) => {
    const header = req.get('authorization');
    const now = new Date().toISOString();
    if (header?.startsWith('Bearer ')) {
      const row = auth(ctx).token.get({ hash: sha256(header.slice(7).trim()) });
      if (!row) return next(new AppError(401, 'bad-token', 'The API token is unknown or revoked.'));
      if (row.disabledAt) return next(new AppError(401, 'bad-token', 'The API token belongs to a disabled account.'));
      req.user = toAuthUser(row);
      req.authVia = 'token';
      req.tokenId = row.tokenId;
      req.tokenScope = row.tokenScope ?? 'full';
      // "last used" to the minute: no write on every request of a busy script
      if (!row.lastUsedAt || Date.parse(now) - Date.parse(row.lastUsedAt) > 60_000) auth(ctx).touchToken.run({ now, id: row.tokenId });
      return next();
    }
    const cookie = (req.cookies as Record<string, string> | undefined)?.[SESSION_COOKIE];
    if (cookie) {
      const row = auth(ctx).session.get({ hash: sha256(cookie), now });
      if (row) {
        req.user = toAuthUser(row);
        req.authVia = 'cookie';
        req.sessionId = row.sessionId;
        req.csrfToken = row.csrfToken;
      }
    }
    next();
  };
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Two secrets compared in time that depends on neither their content nor their lengths: both
 * are hashed to 32 bytes first, then compared with crypto.timingSafeEqual.
 */
export function sameSecret(sent: string | undefined | null, expected: string | undefined | null): boolean {
  if (!sent || !expected) return false;
  const digest = (text: string) => createHash('sha256').update(text).digest();
  return timingSafeEqual(digest(sent), digest(expected));
}

/** The origin a browser says a request comes from: Origin, else the origin part of Referer. */
function requestOrigin(req: Request): string | null {
  const origin = req.get('origin');
  if (origin && origin !== 'null') return origin;
  if (origin === 'null') return 'null';
  const referer = req.get('referer');
  if (!referer) return null;
  try {
    return new URL(referer).origin;
  } catch {
    return 'null';
  }
}

/**
 * CSRF protection for cookie-authenticated writes (OWASP): the request's Origin (or Referer)
 * must be an address the app answers to (PUBLIC_URL / ALLOWED_HOSTS, or the request's own host
 * when neither is set), and the session's synchronizer token, handed out by /api/auth/me and
 * /api/auth/login, must come back in the X-CSRF-Token header (compared in constant time).
 * A request with neither Origin nor Referer is not from a browser page and relies on the token.
 * Token-authenticated scripts are not exposed to CSRF and skip this.
 */
export function csrfGuard(ctx: AppContext) {
  return (req: Request, _res: Response, next: NextFunction) => {
    if (SAFE_METHODS.has(req.method) || req.authVia !== 'cookie') return next();
    const origin = requestOrigin(req);
    if (origin !== null && !originAllowed(ctx.env, origin, req)) {
      return next(new AppError(403, 'bad-origin', `A signed-in write from ${origin.slice(0, 100)} was refused: this server only accepts writes from its own pages.`));
    }
    if (!sameSecret(req.get('x-csrf-token'), req.csrfToken)) {
      return next(new AppError(403, 'csrf', 'Missing or wrong X-CSRF-Token header for a signed-in write; reload the page and try again.'));
    }
    next();
  };
}

/** What a token may never do, whatever its scope: mint tokens or end browser sessions. */
const NEVER_BY_TOKEN: { method: string; path: RegExp }[] = [
  { method: 'POST', path: /^\/auth\/tokens\/?$/ },
  { method: 'POST', path: /^\/auth\/logout\/?$/ },
  { method: 'POST', path: /^\/auth\/sessions\/[^/]+\/revoke\/?$/ },
  { method: 'POST', path: /^\/admin\/people\/[^/]+\/revoke-sessions\/?$/ },
];
/** The writes an upload-scoped token may make: curve uploads and their previews. */
const UPLOAD_WRITES = /^\/builds\/[^/]+\/curves(?:\/preview)?\/?$/;

/**
 * Personal API tokens carry a scope: `read` (GET only), `upload` (reads, plus curve uploads and
 * previews) or `full` (everything the person may do). No token may mint tokens or end browser
 * sessions: those need the person, signed in.
 */
export function tokenScopeGuard() {
  return (req: Request, _res: Response, next: NextFunction) => {
    if (req.authVia !== 'token') return next();
    if (NEVER_BY_TOKEN.some((rule) => rule.method === req.method && rule.path.test(req.path))) {
      return next(new AppError(403, 'token-scope', 'API tokens cannot create tokens or end browser sessions; sign in with a browser to do this.'));
    }
    const scope = req.tokenScope ?? 'full';
    if (SAFE_METHODS.has(req.method) || scope === 'full') return next();
    if (scope === 'upload' && req.method === 'POST' && UPLOAD_WRITES.test(req.path)) return next();
    const allows = scope === 'read' ? 'reading only' : 'reading and uploading curves only';
    next(new AppError(403, 'token-scope', `This API token's scope (${scope}) allows ${allows}, not ${req.method} /api${req.path}; create a token with a wider scope on the account page.`, { scope }));
  };
}
