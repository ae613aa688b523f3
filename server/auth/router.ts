// HTTP for signing in and out, who am I, my sessions, personal API tokens, and invitations.
import rateLimit, { ipKeyGenerator } from 'express-rate-limit';
import type { AppContext } from '../context';
import { apiTokenCreateSchema, inviteAcceptSchema, loginSchema, normalizeEmail } from '../../shared/schemas/auth';
import { AppError } from '../lib/errors';
import { defineFeature, route } from '../lib/route';
import { setSessionCookie, SESSION_COOKIE } from './sessions';
import * as auth from './service';

function loginLimiter(ctx: AppContext) {
  return rateLimit({
    windowMs: 15 * 60 * 1000,
    limit: ctx.env.LOGIN_RATE_LIMIT,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    // the same spelling of the address as the look-up (loginSchema normalises it too)
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${normalizeEmail(String((req.body as { email?: unknown } | undefined)?.email ?? '').slice(0, 320))}`,
    handler: (_req, _res, next) => next(new AppError(429, 'rate-limited', 'Too many sign-in attempts for this address; wait 15 minutes and try again.')),
  });
}

export const authFeature = defineFeature('auth', [
  route({
    method: 'post', path: '/api/auth/login', tag: 'auth', permission: 'public', body: loginSchema,
    summary: 'Sign in with e-mail and password; sets the session cookie and returns the CSRF token',
    before: (ctx) => [loginLimiter(ctx)],
    handle: async ({ ctx, req, res, body }) => {
      const { user, session } = await auth.signIn(ctx, body, req.get('user-agent'));
      setSessionCookie(req, res, session.token, session.expiresAt);
      return { user, csrfToken: session.csrfToken };
    },
  }),
  route({
    method: 'post', path: '/api/auth/logout', tag: 'auth', permission: 'public',
    summary: 'Sign out (revokes this session)',
    handle: ({ ctx, req, res, user }) => {
      auth.signOut(ctx, req.sessionId, user?.id ?? null);
      res.clearCookie(SESSION_COOKIE, { path: '/' });
      return { ok: true };
    },
  }),
  route({
    method: 'get', path: '/api/auth/me', tag: 'auth', permission: 'signed-in',
    summary: 'The signed-in person, their project roles and CSRF token',
    handle: ({ ctx, req, user }) => ({ user, roles: auth.myRoles(ctx, user), csrfToken: req.csrfToken ?? null }),
  }),
  route({
    method: 'get', path: '/api/auth/sessions', tag: 'auth', permission: 'signed-in',
    summary: 'My sessions',
    handle: ({ ctx, req, user }) => ({ sessions: auth.listSessions(ctx, user, req.sessionId) }),
  }),
  route({
    method: 'post', path: '/api/auth/sessions/{id}/revoke', tag: 'auth', permission: 'signed-in',
    summary: 'Revoke one of my sessions',
    handle: ({ ctx, user, ids }) => {
      auth.revokeSession(ctx, user, ids.id!);
      return { ok: true };
    },
  }),
  route({
    method: 'get', path: '/api/auth/tokens', tag: 'auth', permission: 'signed-in',
    summary: 'My personal API tokens',
    handle: ({ ctx, user }) => ({ tokens: auth.listTokens(ctx, user) }),
  }),
  route({
    method: 'post', path: '/api/auth/tokens', tag: 'auth', permission: 'signed-in', body: apiTokenCreateSchema, status: 201,
    summary: 'Create a personal API token (shown once); use as Authorization: Bearer <token>',
    // tokens cannot reach this route (tokenScopeGuard); the parent id records a chain should that change
    handle: ({ ctx, req, user, body }) => auth.createToken(ctx, user, body, req.tokenId ?? null),
  }),
  route({
    method: 'post', path: '/api/auth/tokens/{id}/revoke', tag: 'auth', permission: 'signed-in',
    summary: 'Revoke a personal API token (and every token made with it)',
    handle: ({ ctx, user, ids }) => ({ ok: true, revoked: auth.revokeToken(ctx, user, ids.id!) }),
  }),
  route({
    method: 'get', path: '/api/invitations/{token}', tag: 'auth', permission: 'public',
    summary: 'Read an invitation',
    handle: ({ ctx, texts }) => auth.readInvitation(ctx, texts.token!),
  }),
  route({
    method: 'post', path: '/api/invitations/{token}/accept', tag: 'auth', permission: 'public', body: inviteAcceptSchema, status: 201,
    summary: 'Accept an invitation: set name and password',
    handle: async ({ ctx, req, res, texts, body }) => {
      const { projectId, session } = await auth.acceptInvitation(ctx, texts.token!, body, req.get('user-agent'));
      setSessionCookie(req, res, session.token, session.expiresAt);
      return { ok: true, projectId, csrfToken: session.csrfToken };
    },
  }),
]);
