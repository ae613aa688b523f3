// The address links in e-mails point at: PUBLIC_URL when set, else the request's own origin.
import type { Request } from 'express';
import type { AppContext } from '../context';

export function baseUrl(ctx: AppContext, req: Request): string {
  if (ctx.env.PUBLIC_URL) return ctx.env.PUBLIC_URL.replace(/\/$/, '');
  return `${req.protocol}://${req.get('host')}`;
}
