// The OpenAPI document of the JSON API, generated from the same zod schemas the routes validate with.
import { OpenAPIRegistry, OpenApiGeneratorV3, extendZodWithOpenApi } from '@asteasolutions/zod-to-openapi';
import { z } from 'zod';

extendZodWithOpenApi(z);
import { factorCreateSchema, projectCreateSchema, projectUpdateSchema, responseCreateSchema } from '../shared/schemas/project';
import { buildCreateSchema, buildUpdateSchema } from '../shared/schemas/build';
import { apiTokenCreateSchema, inviteAcceptSchema, inviteCreateSchema, labCreateSchema, loginSchema, membershipSetSchema, personUpdateSchema } from '../shared/schemas/auth';
import { extraRoutes } from './openapi-extra';

export interface RouteDoc {
  method: 'get' | 'post' | 'patch' | 'put' | 'delete';
  path: string;
  summary: string;
  body?: z.ZodType;
  multipart?: Record<string, z.ZodType>;
  query?: z.ZodObject;
  tag: string;
}

const errorSchema = z.object({ error: z.object({ code: z.string(), message: z.string(), details: z.unknown() }) });

export const ROUTES: RouteDoc[] = [
  { method: 'post', path: '/api/auth/login', summary: 'Sign in with e-mail and password; sets the session cookie and returns the CSRF token', body: loginSchema, tag: 'auth' },
  { method: 'post', path: '/api/auth/logout', summary: 'Sign out (revokes this session)', tag: 'auth' },
  { method: 'get', path: '/api/auth/me', summary: 'The signed-in person, their project roles and CSRF token', tag: 'auth' },
  { method: 'get', path: '/api/auth/sessions', summary: 'My sessions', tag: 'auth' },
  { method: 'post', path: '/api/auth/sessions/{id}/revoke', summary: 'Revoke one of my sessions', tag: 'auth' },
  { method: 'get', path: '/api/auth/tokens', summary: 'My personal API tokens', tag: 'auth' },
  { method: 'post', path: '/api/auth/tokens', summary: 'Create a personal API token (shown once); use as Authorization: Bearer <token>', body: apiTokenCreateSchema, tag: 'auth' },
  { method: 'post', path: '/api/auth/tokens/{id}/revoke', summary: 'Revoke a personal API token', tag: 'auth' },
  { method: 'get', path: '/api/invitations/{token}', summary: 'Read an invitation', tag: 'auth' },
  { method: 'post', path: '/api/invitations/{token}/accept', summary: 'Accept an invitation: set name and password', body: inviteAcceptSchema, tag: 'auth' },
  { method: 'get', path: '/api/home', summary: 'Home page: my projects with best builds, recent uploads', tag: 'home' },
  { method: 'get', path: '/api/projects', summary: 'Projects visible to me', tag: 'projects' },
  { method: 'post', path: '/api/projects', summary: 'Create a project (the creator becomes its PI)', body: projectCreateSchema, tag: 'projects' },
  { method: 'get', path: '/api/projects/{id}', summary: 'Read a project', tag: 'projects' },
  { method: 'patch', path: '/api/projects/{id}', summary: 'Update a project; a new reference point recomputes every curve’s metrics', body: projectUpdateSchema, tag: 'projects' },
  { method: 'get', path: '/api/projects/{id}/factors', summary: 'List factors', tag: 'projects' },
  { method: 'post', path: '/api/projects/{id}/factors', summary: 'Add a factor', body: factorCreateSchema, tag: 'projects' },
  { method: 'patch', path: '/api/projects/{id}/factors/{factorId}', summary: 'Update a factor (key fixed)', body: factorCreateSchema, tag: 'projects' },
  { method: 'get', path: '/api/projects/{id}/responses', summary: 'List hand-entered response definitions', tag: 'projects' },
  { method: 'post', path: '/api/projects/{id}/responses', summary: 'Add a hand-entered response definition', body: responseCreateSchema, tag: 'projects' },
  { method: 'get', path: '/api/projects/{id}/members', summary: 'Members and pending invitations', tag: 'projects' },
  { method: 'put', path: '/api/projects/{id}/members', summary: 'Set a member’s role', body: membershipSetSchema, tag: 'projects' },
  { method: 'delete', path: '/api/projects/{id}/members/{userId}', summary: 'Remove a member', tag: 'projects' },
  { method: 'put', path: '/api/projects/{id}/notify', summary: 'Turn my e-mail notices for this project on or off', body: z.object({ notify: z.boolean(), digest: z.boolean().optional() }), tag: 'projects' },
  { method: 'post', path: '/api/projects/{id}/invitations', summary: 'Invite someone by e-mail (link valid 7 days, once)', body: inviteCreateSchema, tag: 'projects' },
  { method: 'get', path: '/api/projects/{id}/builds', summary: 'List builds with factor values and metric values (from each build’s curves of record: recordCurveIds)', tag: 'builds' },
  { method: 'post', path: '/api/projects/{id}/builds', summary: 'Create a build (factor values checked against bounds and levels)', body: buildCreateSchema, tag: 'builds' },
  { method: 'get', path: '/api/builds/{id}', summary: 'Read a build with lineage, curves and metrics', tag: 'builds' },
  { method: 'patch', path: '/api/builds/{id}', summary: 'Update a build', body: buildUpdateSchema, tag: 'builds' },
  { method: 'get', path: '/api/labs', summary: 'Labs (home and partner)', tag: 'admin' },
  { method: 'post', path: '/api/admin/labs', summary: 'Add a lab (admin)', body: labCreateSchema, tag: 'admin' },
  { method: 'get', path: '/api/admin/people', summary: 'People and their roles (admin)', tag: 'admin' },
  { method: 'patch', path: '/api/admin/people/{id}', summary: 'Update a person (admin)', body: personUpdateSchema, tag: 'admin' },
  { method: 'post', path: '/api/admin/people/{id}/revoke-sessions', summary: 'Sign a person out everywhere (admin)', tag: 'admin' },
  { method: 'post', path: '/api/admin/digests/send', summary: 'Send the daily digest of notices now (admin; it also runs every 24 h)', tag: 'admin' },
  { method: 'get', path: '/api/admin/outbox', summary: 'Messages in the local outbox (admin)', tag: 'admin' },
  { method: 'get', path: '/api/admin/backups', summary: 'Backups in BACKUP_DIR, newest first (admin)', tag: 'admin' },
  { method: 'post', path: '/api/admin/backups', summary: 'Write a backup now: online database copy + raw files + SHA-256 manifest, as a .tar in BACKUP_DIR (admin)', tag: 'admin' },
  { method: 'get', path: '/api/admin/backups/{name}', summary: 'Download a backup archive (admin)', tag: 'admin' },
  { method: 'get', path: '/api/admin/audit', summary: 'Audit log (admin)', tag: 'admin' },
  ...extraRoutes,
];

let cached: unknown = null;

export function openApiDocument(): unknown {
  if (cached) return cached;
  const registry = new OpenAPIRegistry();
  registry.register('Error', errorSchema);
  registry.registerComponent('securitySchemes', 'session', { type: 'apiKey', in: 'cookie', name: 'cw_session' });
  registry.registerComponent('securitySchemes', 'token', { type: 'http', scheme: 'bearer' });
  for (const route of ROUTES) {
    const params = [...route.path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]!);
    const paramsSchema = params.length ? z.object(Object.fromEntries(params.map((p) => [p, p === 'token' ? z.string() : z.coerce.number().int()]))) : undefined;
    registry.registerPath({
      method: route.method,
      path: route.path,
      summary: route.summary,
      tags: [route.tag],
      security: route.path === '/api/auth/login' ? [] : [{ session: [] }, { token: [] }],
      request: {
        ...(paramsSchema && { params: paramsSchema }),
        ...(route.query && { query: route.query }),
        ...(route.body && { body: { content: { 'application/json': { schema: route.body } } } }),
        ...(route.multipart && { body: { content: { 'multipart/form-data': { schema: z.object(route.multipart) } } } }),
      },
      responses: {
        200: { description: 'OK (201 for creations)' },
        400: { description: 'Invalid input; details.fields names each field', content: { 'application/json': { schema: errorSchema } } },
        401: { description: 'Not signed in', content: { 'application/json': { schema: errorSchema } } },
        403: { description: 'Role does not allow it', content: { 'application/json': { schema: errorSchema } } },
        404: { description: 'Not found or not visible', content: { 'application/json': { schema: errorSchema } } },
        422: { description: 'A file that cannot be used, with the reason and where', content: { 'application/json': { schema: errorSchema } } },
      },
    });
  }
  cached = new OpenApiGeneratorV3(registry.definitions).generateDocument({
    openapi: '3.0.3',
    info: { title: 'Cellwright API', version: '1', description: 'Builds, curves, metrics, gains, surfaces and proposals. Errors: {"error": {"code", "message", "details"}}. Cookie-authenticated writes need the X-CSRF-Token header; Bearer-token scripts do not.' },
  });
  return cached;
}
