// The OpenAPI document is generated from the feature modules: every declared route is in it,
// with the schema it validates its body, query or multipart fields with, and the permission it checks.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createHarness, type Harness } from './harness';
import { ROUTES } from '../../server/features';

let h: Harness;
beforeAll(async () => {
  h = await createHarness({ seed: false });
});
afterAll(() => h.close());

describe('OpenAPI document', () => {
  it('has every route of every feature, with its schemas and permission', async () => {
    const doc = (await request(h.app).get('/api/openapi.json')).body as { paths: Record<string, Record<string, { description: string; requestBody?: { content: Record<string, { schema: { properties?: Record<string, unknown> } }> }; parameters?: { in: string; name: string }[] }>> };
    const documented = Object.entries(doc.paths).flatMap(([path, methods]) => Object.keys(methods).map((method) => `${method} ${path}`));
    expect(documented.sort()).toEqual(ROUTES.map((r) => `${r.method} ${r.path}`).sort());
    for (const route of ROUTES) {
      const operation = doc.paths[route.path]![route.method]!;
      expect(operation.description, route.path).toMatch(/^Who may/);
      if (route.body) expect(Object.keys(operation.requestBody!.content), route.path).toEqual(['application/json']);
      if (route.multipart) expect(Object.keys(operation.requestBody!.content['multipart/form-data']!.schema.properties!), route.path).toEqual(['file', ...Object.keys(route.multipart.shape)]);
      if (route.query) expect(operation.parameters!.some((p) => p.in === 'query'), route.path).toBe(true);
    }
  });

  it('says who may call a route in words a script author reads', async () => {
    const doc = (await request(h.app).get('/api/openapi.json')).body;
    expect(doc.paths['/api/builds/{id}'].patch.description).toBe('Who may (editBuild): pi, researcher, partner in the build’s project (site admins too). Partners: their own lab’s builds only.');
    expect(doc.paths['/api/admin/audit'].get.description).toBe('Who may: site administrators.');
    expect(doc.paths['/api/uploads/{uploadId}/progress'].get.parameters.find((p: { name: string }) => p.name === 'uploadId').schema.type).toBe('string');
  });
});
