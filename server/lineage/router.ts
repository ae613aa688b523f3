// HTTP for the lineage view: GET /api/projects/:id/lineage?response=vAtRef
import { lineageQuery } from '../../shared/schemas/gains';
import type { LineageData } from '../../shared/api-types';
import { defineFeature, route } from '../lib/route';
import { lineageView, projectResponses } from './service';

export const lineageFeature = defineFeature('lineage', [
  route({
    method: 'get', path: '/api/projects/{id}/lineage', tag: 'gains', permission: { action: 'read', on: 'project' }, query: lineageQuery,
    summary: 'Lineage tree of replicate groups with the chosen response (mean, SD, n), recipe changes from each parent, best path',
    handle: ({ ctx, access, query }): LineageData => ({ ...lineageView(ctx, access, query.response), responses: projectResponses(ctx, access.projectId) }),
  }),
]);
