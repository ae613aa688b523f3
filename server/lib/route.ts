// A route is declared once: method, path, summary, tag, the permission it checks, its body /
// query / multipart schema, and the handler. From that one declaration the feature's Express
// router is built (sign-in, path ids, permission, then validation, in that order, before the
// handler runs), the OpenAPI document is generated and the role-matrix test knows what to expect.
import { Router, type Request, type RequestHandler, type Response } from 'express';
import type { z } from 'zod';
import type { AppContext, AuthUser } from '../context';
import { guard, type Guarded, type Permission } from '../auth/access';
import { idParam, parseInput } from './validate';

export type { Permission };

export type HttpMethod = 'get' | 'post' | 'patch' | 'put' | 'delete';

/** Path parameters that are text; every other one ({id}, {factorId}, {userId}) is a positive whole number. */
export const TEXT_PARAMS = new Set(['token', 'name', 'uploadId']);

/** The documented part of a route: what the OpenAPI document and the role matrix read. */
export interface RouteDoc {
  method: HttpMethod;
  /** OpenAPI-style path, e.g. /api/builds/{id}/record */
  path: string;
  summary: string;
  tag: string;
  permission: Permission;
  body?: z.ZodType;
  query?: z.ZodType;
  /** multipart: the text fields sent beside the file field `file` */
  multipart?: z.ZodObject;
  /** success status: 200 unless said (201 for creations) */
  status?: number;
}

type Out<S> = S extends z.ZodType ? z.output<S> : undefined;

/** What a handler receives: the caller, the checked path values, the validated input, and what the permission check loaded. */
export type RouteCall<P extends Permission, B, Q, F> = {
  ctx: AppContext;
  req: Request;
  res: Response;
  user: P extends 'public' ? AuthUser | undefined : AuthUser;
  /** numeric path parameters by name */
  ids: Record<string, number>;
  /** text path parameters by name */
  texts: Record<string, string>;
  body: B;
  query: Q;
  /** the multipart fields, validated (only on multipart routes) */
  fields: F;
} & Guarded<P>;

export interface RouteSpec extends RouteDoc {
  /** Express middleware that runs first (e.g. receiving a file, a rate limit), made once per app */
  before?: (ctx: AppContext) => RequestHandler[];
  /** runs after the handler whatever happened (e.g. removing a received file) */
  cleanup?: (req: Request) => void;
  /** returns the JSON answer; or writes the response itself and returns undefined */
  handle: (call: never) => unknown;
}

/**
 * Declare one route. The handler's `body`, `query`, `fields`, `user` and loaded rows are typed
 * from the schemas and the permission given here.
 */
export function route<const P extends Permission, B extends z.ZodType | undefined = undefined, Q extends z.ZodType | undefined = undefined, M extends z.ZodObject | undefined = undefined>(
  spec: Omit<RouteDoc, 'permission' | 'body' | 'query' | 'multipart'> & {
    permission: P;
    body?: B;
    query?: Q;
    multipart?: M;
    before?: (ctx: AppContext) => RequestHandler[];
    cleanup?: (req: Request) => void;
    handle: (call: RouteCall<P, Out<B>, Out<Q>, Out<M>>) => unknown;
  },
): RouteSpec {
  return spec as unknown as RouteSpec;
}

/** One server feature: its name, its routes (with their docs), and the Express router made from them. */
export interface Feature {
  name: string;
  routes: RouteDoc[];
  router(ctx: AppContext): Router;
}

const paramNames = (path: string) => [...path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]!);

export function defineFeature(name: string, specs: RouteSpec[]): Feature {
  return {
    name,
    routes: specs.map(({ before: _b, cleanup: _c, handle: _h, ...doc }) => doc),
    router(ctx) {
      const router = Router();
      for (const spec of specs) {
        const expressPath = spec.path.replace(/^\/api/, '').replace(/\{(\w+)\}/g, ':$1');
        const names = paramNames(spec.path);
        const handler: RequestHandler = async (req, res) => {
          try {
            // sign-in first, then the path's values, then the permission, then the input
            if (spec.permission !== 'public' && !req.user) guard(ctx, undefined, spec.permission, {});
            const ids: Record<string, number> = {};
            const texts: Record<string, string> = {};
            for (const param of names) {
              if (TEXT_PARAMS.has(param)) texts[param] = String(req.params[param]);
              else ids[param] = idParam(req.params[param], param);
            }
            // a route without the project in its path names it in the body
            if (typeof spec.permission === 'object' && spec.permission.idFrom === 'body') ids.id = idParam((req.body as { projectId?: unknown } | undefined)?.projectId, 'projectId');
            const guarded = guard(ctx, req.user, spec.permission, ids);
            const body = spec.body ? parseInput(spec.body, req.body) : undefined;
            const query = spec.query ? parseInput(spec.query, req.query, 'query') : undefined;
            const fields = spec.multipart ? parseInput(spec.multipart, req.body ?? {}, 'upload fields') : undefined;
            const call = { ctx, req, res, user: req.user, ids, texts, body, query, fields, ...guarded };
            const answer = await (spec.handle as (call: unknown) => unknown)(call);
            if (answer !== undefined && !res.headersSent) res.status(spec.status ?? 200).json(answer);
          } finally {
            spec.cleanup?.(req);
          }
        };
        router[spec.method](expressPath, ...(spec.before?.(ctx) ?? []), handler);
      }
      return router;
    },
  };
}
