// Cookie sessions stored in SQLite (revocable) and personal API tokens; resolves req.user.
import type { Request, Response, NextFunction } from 'express';
import type { AppContext, AuthUser } from '../context';
import { sessions } from '../db/schema';
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

interface AuthRow {
  id: number;
  email: string;
  name: string;
  isAdmin: number;
  labId: number | null;
  labKind: 'home' | 'partner' | null;
  sessionId?: number;
  csrfToken?: string;
  tokenId?: number;
  lastUsedAt?: string | null;
}

const USER_COLUMNS = 'u.id, u.email, u.name, u.is_admin as isAdmin, u.lab_id as labId, l.kind as labKind';

/** Every request resolves its caller: one prepared join per way in, compiled once per database. */
const statements = new WeakMap<object, ReturnType<typeof prepareAuth>>();
function prepareAuth(ctx: AppContext) {
  const sqlite = ctx.db.$client;
  return {
    session: sqlite.prepare(
      `select ${USER_COLUMNS}, s.id as sessionId, s.csrf_token as csrfToken from sessions s join users u on u.id = s.user_id left join labs l on l.id = u.lab_id
       where s.token_hash = ? and s.revoked_at is null and s.expires_at > ? and u.disabled_at is null`,
    ),
    token: sqlite.prepare(
      `select ${USER_COLUMNS}, t.id as tokenId, t.last_used_at as lastUsedAt, u.disabled_at as disabledAt from api_tokens t join users u on u.id = t.user_id left join labs l on l.id = u.lab_id
       where t.token_hash = ? and t.revoked_at is null`,
    ),
    touchToken: sqlite.prepare('update api_tokens set last_used_at = ? where id = ?'),
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

function toAuthUser(row: AuthRow): AuthUser {
  return { id: row.id, email: row.email, name: row.name, isAdmin: Boolean(row.isAdmin), labId: row.labId, labKind: row.labKind ?? null };
}

/** Reads a Bearer token or the session cookie; never rejects — routes decide. */
export function authenticate(ctx: AppContext) {
  return (req: Request, _res: Response, next: NextFunction) => {
    const header = req.get('authorization');
    const now = new Date().toISOString();
    if (header?.startsWith('Bearer ')) {
      const row = auth(ctx).token.get(sha256(header.slice(7).trim())) as (AuthRow & { disabledAt: string | null }) | undefined;
      if (!row) return next(new AppError(401, 'bad-token', 'The API token is unknown or revoked.'));
      if (row.disabledAt) return next(new AppError(401, 'bad-token', 'The API token belongs to a disabled account.'));
      req.user = toAuthUser(row);
      req.authVia = 'token';
      // "last used" to the minute: no write on every request of a busy script
      if (!row.lastUsedAt || Date.parse(now) - Date.parse(row.lastUsedAt) > 60_000) auth(ctx).touchToken.run(now, row.tokenId);
      return next();
    }
    const cookie = (req.cookies as Record<string, string> | undefined)?.[SESSION_COOKIE];
    if (cookie) {
      const row = auth(ctx).session.get(sha256(cookie), now) as AuthRow | undefined;
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
