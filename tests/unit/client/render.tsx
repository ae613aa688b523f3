// Renders real client components and pages as a signed-in person would see them: a fresh
// QueryClient, a router at the page's address, and fetch answered from the recorded API
// answers of that person's role (fixtures/api-answers.json, written by
// scripts/client-fixtures.mjs from a seeded server). Writes are recorded, not sent anywhere.
import type { ReactElement } from 'react';
import { afterEach, vi } from 'vitest';
import { cleanup, render } from '@testing-library/react';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { MemoryRouter, Route, Routes } from 'react-router-dom';
import answers from './fixtures/api-answers.json';

export type Role = 'pi' | 'researcher' | 'partner' | 'viewer';
export const fixtures = answers as unknown as { projectId: number; plannedBuildId: number; testedBuildId: number; byRole: Record<Role, Record<string, unknown>> };

export interface SentRequest {
  method: string;
  path: string;
  body: unknown;
}

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

/** The recorded answer of a GET, as the given role received it. */
export function answer<T>(role: Role, path: string): T {
  const body = fixtures.byRole[role][path];
  if (body === undefined) throw new Error(`no recorded answer for GET ${path} as ${role}; add it to scripts/client-fixtures.mjs`);
  return structuredClone(body) as T;
}

/**
 * Stub fetch: GETs answer from the role's recorded answers (404 for paths not recorded), writes
 * are kept in the returned list and answered by `write` (default 201 with an empty object).
 */
export function stubApi(role: Role, write: (request: SentRequest) => { status: number; body: unknown } = () => ({ status: 201, body: {} })) {
  const sent: SentRequest[] = [];
  vi.stubGlobal('fetch', async (input: string, init?: RequestInit) => {
    const method = (init?.method ?? 'GET').toUpperCase();
    const path = String(input).replace(/^\/api/, '').split('?')[0]!;
    const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
    if (method === 'GET') {
      const body = fixtures.byRole[role][path];
      return body === undefined ? json(404, { error: { code: 'not-found', message: `not recorded: ${path}`, details: null } }) : json(200, body);
    }
    const request = { method, path, body: init?.body ? JSON.parse(String(init.body)) : undefined };
    sent.push(request);
    const reply = write(request);
    return json(reply.status, reply.body);
  });
  return sent;
}

/** Render an element under a router at `url`, matched by `pattern` (e.g. '/projects/:projectId/settings'). */
export function renderPage(element: ReactElement, { url = '/', pattern = '/' }: { url?: string; pattern?: string } = {}) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  return render(
    <QueryClientProvider client={client}>
      <MemoryRouter initialEntries={[url]}>
        <Routes>
          <Route path={pattern} element={element} />
        </Routes>
      </MemoryRouter>
    </QueryClientProvider>,
  );
}
