// HTTP for gains: GET /api/projects/:id/gains?response=vAtRef&builds=ID,ID,…
import { gainsQuery } from '../../shared/schemas/gains';
import { defineFeature, route } from '../lib/route';
import { gainsFor } from './service';

export const gainsFeature = defineFeature('gains', [
  route({
    method: 'get', path: '/api/projects/{id}/gains', tag: 'gains', permission: { action: 'read', on: 'project' }, query: gainsQuery,
    summary: 'Gains waterfall along a chain of builds (default: the lineage’s best path) → {response, unit, steps: [{buildId, code, value, gain, low, high, withinNoise, n, sd, method, note, changeNote, changeText}], total}; values in the response’s internal unit',
    handle: ({ ctx, access, query }) => gainsFor(ctx, access, { response: query.response, builds: query.builds }),
  }),
]);
