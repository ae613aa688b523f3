// The OpenAPI document of the JSON API, generated from the feature modules' routes: the same
// zod schemas the routes validate with, and the permission each route checks.
import { OpenAPIRegistry, OpenApiGeneratorV3, extendZodWithOpenApi } from '@asteasolutions/zod-to-openapi';
import { z } from 'zod';
import { PROJECT_ACTIONS } from '../shared/auth/permissions';
import { CURVE_METRICS, CURVE_METRIC_KEYS } from '../shared/curves/metric-catalogue';
import { ROUTES } from './features';
import { TEXT_PARAMS, type Permission, type RouteDoc } from './lib/route';

extendZodWithOpenApi(z);

export { ROUTES, type RouteDoc };

const errorSchema = z.object({ error: z.object({ code: z.string(), message: z.string(), details: z.unknown() }) });
const fileField = z.string().describe('the file (CSV, TSV, TXT or XLSX)').openapi({ format: 'binary' });

const SCOPE_WORDS = { project: 'the project', build: 'the build’s project', curve: 'the curve’s project', file: 'the file’s project', 'import-profile': 'the profile’s project', target: 'the target’s project', lot: 'the lot’s project', 'reference-curve': 'the reference curve’s project' } as const;

/** "Who may: pi, researcher in the build’s project (site admins too)." */
export function describePermission(permission: Permission): string {
  if (permission === 'public') return 'Who may: anyone (no sign-in).';
  if (permission === 'signed-in') return 'Who may: any signed-in person, on their own things.';
  if (permission === 'site-admin') return 'Who may: site administrators.';
  if (permission === 'create-project') return 'Who may: any signed-in person except partner-lab members.';
  const rule = PROJECT_ACTIONS[permission.action];
  const partner = 'partnerOwnLab' in rule ? ' Partners: their own lab’s builds only.' : '';
  const admins = permission.members ? ' (members only)' : ' (site admins too)';
  return `Who may (${permission.action}): ${rule.roles.join(', ')} in ${SCOPE_WORDS[permission.on]}${admins}.${partner}`;
}

/** The metrics object of a curve, from the metric catalogue: each key with its unit and the kinds that carry it. */
function curveMetricsSchema() {
  const fields = CURVE_METRIC_KEYS.map((key) => {
    const m = CURVE_METRICS[key];
    const unit = m.unit ? `, ${m.unit}` : ', dimensionless';
    const pending = m.kinds.filter((kind) => !(m.computedOn as readonly string[]).includes(kind));
    const later = pending.length ? ` Not computed yet on ${pending.join(', ')} curves (null).` : '';
    return [key, z.number().nullable().optional().describe(`${m.label}${unit} (${m.kinds.join(', ')}): ${m.description}; ${m.goal === 'maximize' ? 'higher' : 'lower'} is better.${later}`)];
  });
  return z.object(Object.fromEntries(fields)).describe('Metrics of a curve in fixed units; null with a reason in metricNotes when a metric cannot be computed.');
}

let cached: unknown = null;

export function openApiDocument(): unknown {
  if (cached) return cached;
  const registry = new OpenAPIRegistry();
  registry.register('Error', errorSchema);
  registry.register('CurveMetricKey', z.enum(CURVE_METRIC_KEYS as [string, ...string[]]).describe('The key of a curve metric'));
  registry.register('CurveMetrics', curveMetricsSchema());
  registry.registerComponent('securitySchemes', 'session', { type: 'apiKey', in: 'cookie', name: 'cw_session' });
  registry.registerComponent('securitySchemes', 'token', { type: 'http', scheme: 'bearer' });
  for (const route of ROUTES) {
    const params = [...route.path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]!);
    const paramsSchema = params.length ? z.object(Object.fromEntries(params.map((p) => [p, TEXT_PARAMS.has(p) ? z.string() : z.coerce.number().int()]))) : undefined;
    registry.registerPath({
      method: route.method,
      path: route.path,
      summary: route.summary,
      description: describePermission(route.permission),
      tags: [route.tag],
      security: route.permission === 'public' ? [] : [{ session: [] }, { token: [] }],
      request: {
        ...(paramsSchema && { params: paramsSchema }),
        ...(route.query && { query: route.query as z.ZodObject }),
        ...(route.body && { body: { content: { 'application/json': { schema: route.body } } } }),
        ...(route.multipart && { body: { content: { 'multipart/form-data': { schema: z.object({ file: fileField, ...route.multipart.shape }) } } } }),
      },
      responses: {
        [route.status ?? 200]: { description: route.status === 201 ? 'Created' : 'OK' },
        400: { description: 'Invalid input; details.fields names each field', content: { 'application/json': { schema: errorSchema } } },
        401: { description: 'Not signed in', content: { 'application/json': { schema: errorSchema } } },
        403: { description: 'Role does not allow it', content: { 'application/json': { schema: errorSchema } } },
        404: { description: 'Not found or not visible', content: { 'application/json': { schema: errorSchema } } },
        422: { description: 'A file or request that cannot be used, with the reason and where', content: { 'application/json': { schema: errorSchema } } },
      },
    });
  }
  cached = new OpenApiGeneratorV3(registry.definitions).generateDocument({
    openapi: '3.0.3',
    info: { title: 'Cellwright API', version: '1', description: 'Builds, curves, metrics, gains, surfaces and proposals. Errors: {"error": {"code", "message", "details"}}. Cookie-authenticated writes need the X-CSRF-Token header; Bearer-token scripts do not.' },
  });
  return cached;
}
