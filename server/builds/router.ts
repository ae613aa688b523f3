// HTTP for builds: list and create per project, read and update one, choose its curve of record.
import { buildCreateSchema, buildListQuery, buildUpdateSchema, recordChoiceSchema } from '../../shared/schemas/build';
import { defineFeature, route } from '../lib/route';
import * as builds from './service';

export const buildsFeature = defineFeature('builds', [
  route({
    method: 'get', path: '/api/projects/{id}/builds', tag: 'builds', permission: { action: 'read', on: 'project' }, query: buildListQuery,
    summary: 'List builds with factor values and metric values (from each build’s curves of record: recordCurveIds)',
    handle: ({ ctx, res, access, query }) => {
      // the serialised list, shared by every member until the next write
      res.type('application/json').send(builds.buildListJson(ctx, access, query));
    },
  }),
  route({
    method: 'post', path: '/api/projects/{id}/builds', tag: 'builds', permission: { action: 'createBuild', on: 'project' }, body: buildCreateSchema, status: 201,
    summary: 'Create a build (factor values checked against bounds and levels; partners: for their own lab)',
    handle: ({ ctx, access, body }) => ({ build: builds.createBuild(ctx, access, body) }),
  }),
  route({
    method: 'get', path: '/api/builds/{id}', tag: 'builds', permission: { action: 'read', on: 'build' },
    summary: 'Read a build with lineage, curves and metrics, and what the caller may do on it',
    handle: ({ ctx, access, build }) => builds.buildDetail(ctx, access, build),
  }),
  route({
    method: 'put', path: '/api/builds/{id}/record', tag: 'builds', permission: { action: 'editBuild', on: 'build' }, body: recordChoiceSchema,
    summary: 'Choose the build’s curve of record of one kind → {record: {kind, fromCurveId, toCurveId, changed, status, message}, build, curves}. A reviewed build goes back to review (status tested) and its PIs are told; audited. Partners: their own lab’s builds only',
    handle: ({ ctx, access, build, body }) => builds.chooseBuildRecord(ctx, access, build, body),
  }),
  route({
    method: 'patch', path: '/api/builds/{id}', tag: 'builds', permission: { action: 'editBuild', on: 'build' }, body: buildUpdateSchema,
    summary: 'Update a build (partners: their own lab’s builds; only a PI sets "reviewed")',
    handle: ({ ctx, access, build, body }) => ({ build: builds.updateBuild(ctx, access, build, body) }),
  }),
]);
