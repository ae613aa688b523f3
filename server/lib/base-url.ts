// Which addresses this server answers to, from configuration only: PUBLIC_URL and ALLOWED_HOSTS.
// Links in e-mails are built from them (never from an unvetted Host header), and the Origin of
// cookie-authenticated writes is checked against them.
import type { Request } from 'express';
import type { Env } from '../env';
import { AppError } from './errors';

export interface AllowedHost {
  /** "host" or "host:port", lower case */
  host: string;
  /** "http" / "https" when the entry named one (PUBLIC_URL always does) */
  scheme: string | null;
}

/** PUBLIC_URL first, then the ALLOWED_HOSTS entries ("cw.lab.example", "cw.lab.example:8443" or "https://cw.lab.example"). */
export function allowedHosts(env: Pick<Env, 'PUBLIC_URL' | 'ALLOWED_HOSTS'>): AllowedHost[] {
  const out: AllowedHost[] = [];
  const add = (entry: string) => {
    const text = entry.trim();
    if (!text) return;
    try {
      const url = new URL(text.includes('://') ? text : `http://${text}`);
      out.push({ host: url.host.toLowerCase(), scheme: text.includes('://') ? url.protocol.replace(':', '') : null });
    } catch {
      // env.ts refuses entries that are not host names; nothing to add here
    }
  };
  if (env.PUBLIC_URL) add(env.PUBLIC_URL);
  for (const entry of (env.ALLOWED_HOSTS ?? '').split(',')) add(entry);
  return out;
}

/**
 * The base of links in e-mails: PUBLIC_URL when set; else the request's host when ALLOWED_HOSTS
 * lists it (else the first listed host); else, in development only, this server on localhost.
 * Outside development with neither configured there is no trustworthy address: null.
 */
export function linkBase(env: Env, req?: Pick<Request, 'protocol' | 'get'>): string | null {
  if (env.PUBLIC_URL) return env.PUBLIC_URL.replace(/\/+$/, '');
  const hosts = allowedHosts(env);
  if (hosts.length > 0) {
    const asked = req?.get('host')?.toLowerCase();
    const chosen = hosts.find((h) => h.host === asked) ?? hosts[0]!;
    return `${chosen.scheme ?? req?.protocol ?? 'http'}://${chosen.host}`;
  }
  if (env.NODE_ENV !== 'production') return `http://localhost:${env.PORT}`;
  return null;
}

/** linkBase, or a 503 naming the setting an administrator must add (nothing is sent without it). */
export function requireLinkBase(env: Env, req?: Pick<Request, 'protocol' | 'get'>): string {
  const base = linkBase(env, req);
  if (!base) {
    throw new AppError(503, 'public-url-missing', 'E-mail links need the address people use to reach Cellwright: an administrator must set PUBLIC_URL (or ALLOWED_HOSTS) on the server; nothing was sent.');
  }
  return base;
}

/** Every link the app puts in an e-mail, built on one base; callers get them from emailLinks. */
export function appLinks(base: string) {
  const root = base.replace(/\/+$/, '');
  return {
    invitation: (token: string) => `${root}/invite/${token}`,
    project: (projectId: number) => `${root}/projects/${projectId}`,
    build: (projectId: number, buildId: number) => `${root}/projects/${projectId}/builds/${buildId}`,
    settings: (projectId: number) => `${root}/projects/${projectId}/settings`,
  };
}

export type AppLinks = ReturnType<typeof appLinks>;

/**
 * The links of an e-mail, built the one way: on requireLinkBase, so an invitation or a notice
 * never carries a made-up address (a 503 naming PUBLIC_URL instead, in production without one).
 */
export function emailLinks(env: Env, req?: Pick<Request, 'protocol' | 'get'>): AppLinks {
  return appLinks(requireLinkBase(env, req));
}

/**
 * Is this Origin (scheme://host[:port]) one the app answers to? With PUBLIC_URL or ALLOWED_HOSTS
 * set, it must be one of them; with neither, it must name the host the request was sent to
 * (same-origin), which a browser page on another site cannot fake.
 */
export function originAllowed(env: Env, origin: string, req: Pick<Request, 'get'>): boolean {
  let url: URL;
  try {
    url = new URL(origin);
  } catch {
    return false;
  }
  const host = url.host.toLowerCase();
  const scheme = url.protocol.replace(':', '');
  const hosts = allowedHosts(env);
  if (hosts.length > 0) return hosts.some((h) => h.host === host && (h.scheme === null || h.scheme === scheme));
  return host === req.get('host')?.toLowerCase();
}
