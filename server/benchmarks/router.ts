// HTTP for a project's benchmark (a build or a reference curve) and its reference curves: everyone
// reads, PIs choose the benchmark and import or remove reference curves.
import { benchmarkSetSchema, referenceCurveFieldsSchema } from '../../shared/schemas/benchmarks';
import { receiveFile, receivedFile, removeReceivedFile } from '../lib/receive-file';
import { defineFeature, route } from '../lib/route';
import * as bench from './service';

export const benchmarksFeature = defineFeature('benchmarks', [
  route({
    method: 'get', path: '/api/projects/{id}/benchmark', tag: 'benchmarks', permission: { action: 'read', on: 'project' },
    summary: 'The project’s benchmark or null: a build (its polarization curve of record) or a reference curve with provenance, with the points every polarization plot can draw and the values differences are taken from',
    handle: ({ ctx, access }) => ({ benchmark: bench.getBenchmark(ctx, access) }),
  }),
  route({
    method: 'put', path: '/api/projects/{id}/benchmark', tag: 'benchmarks', permission: { action: 'setBenchmark', on: 'project' }, body: benchmarkSetSchema,
    summary: 'Make a build or a reference curve the project’s benchmark ({buildId} or {referenceCurveId}, optional note). Audited',
    handle: ({ ctx, access, body }) => ({ benchmark: bench.setBenchmark(ctx, access, body) }),
  }),
  route({
    method: 'delete', path: '/api/projects/{id}/benchmark', tag: 'benchmarks', permission: { action: 'setBenchmark', on: 'project' },
    summary: 'The project has no benchmark any more (the build or reference curve stays). Audited',
    handle: ({ ctx, access }) => {
      bench.clearBenchmark(ctx, access);
      return { benchmark: null };
    },
  }),
  route({
    method: 'get', path: '/api/projects/{id}/reference-curves', tag: 'benchmarks', permission: { action: 'read', on: 'project' },
    summary: 'The project’s reference curves with provenance (source, date, conditions) and metrics at the current reference point',
    handle: ({ ctx, access }) => ({ referenceCurves: bench.listReferenceCurves(ctx, access) }),
  }),
  route({
    method: 'post', path: '/api/projects/{id}/reference-curves', tag: 'benchmarks', permission: { action: 'setBenchmark', on: 'project' }, multipart: referenceCurveFieldsSchema, status: 201,
    summary: 'Import a polarization curve that belongs to no build (multipart: file, label, source, sourceDate, loadings, conditions, makeBenchmark): 201 {referenceCurve} or 422 naming file, line and column with nothing stored',
    before: (ctx) => [receiveFile(ctx)],
    cleanup: removeReceivedFile,
    handle: ({ ctx, req, access, fields }) => bench.importReferenceCurve(ctx, access, receivedFile(req), fields),
  }),
  route({
    method: 'get', path: '/api/reference-curves/{id}', tag: 'benchmarks', permission: { action: 'read', on: 'reference-curve' },
    summary: 'A reference curve with its points',
    handle: ({ ctx, referenceCurve }) => bench.readReferenceCurve(ctx, referenceCurve),
  }),
  route({
    method: 'delete', path: '/api/reference-curves/{id}', tag: 'benchmarks', permission: { action: 'setBenchmark', on: 'reference-curve' },
    summary: 'Remove a reference curve (its raw file stays); when it was the benchmark the project has none. Audited',
    handle: ({ ctx, access, referenceCurve }) => {
      bench.deleteReferenceCurve(ctx, access, referenceCurve);
      return { deleted: true };
    },
  }),
]);
