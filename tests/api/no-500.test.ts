// The server never answers 500 to user input: every documented route, called by an admin with
// odd path parameters, odd query strings and arbitrary JSON bodies, answers below 500.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createHarness, type Harness } from './harness';
import { ROUTES } from '../../server/features';

let h: Harness;
beforeAll(async () => {
  h = await createHarness();
});
afterAll(() => h.close());

const PARAMS = ['1', '2', '999999', '0', '-1', 'abc', '1.5', '%20', 'null'];

// routes that would sign the calling admin out and leave the rest of the run unauthenticated
const SIGNS_OUT = new Set(['post /api/auth/logout', 'post /api/auth/sessions/{id}/revoke', 'post /api/admin/people/{id}/revoke-sessions']);

describe('no 500 for any input', () => {
  for (const route of ROUTES.filter((r) => !SIGNS_OUT.has(`${r.method} ${r.path}`))) {
    it(`${route.method.toUpperCase()} ${route.path}`, async () => {
      await fc.assert(
        fc.asyncProperty(
          fc.constantFrom(...PARAMS),
          fc.oneof(fc.json(), fc.constant('{}'), fc.constant('[]'), fc.constant('"x"'), fc.constant('{"name":1,"settings":null,"factors":[1],"mapping":"{","response":{}}')),
          fc.constantFrom('', '?limit=abc', '?response=zzz&builds=1,x', '?maxPoints=-5&fromHours=a', '?status=weird'),
          async (param, body, query) => {
            const path = route.path.replace(/\{[^}]+\}/g, param) + query;
            const res = route.method === 'get' || route.method === 'delete'
              ? await h.as.admin.raw(route.method, path)
              : await h.as.admin.raw(route.method, path).set('Content-Type', 'application/json').send(body);
            expect(res.status, `${route.method} ${path} ${body} → ${res.status} ${JSON.stringify(res.body)}`).toBeLessThan(500);
            expect(res.status, 'the admin must stay signed in for the run to mean anything').not.toBe(401);
          },
        ),
        { numRuns: 12, seed: 42 },
      );
    });
  }
});
