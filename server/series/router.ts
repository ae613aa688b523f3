// HTTP for series analyses: POST /api/projects/:id/series
import { seriesRequestSchema } from '../../shared/schemas/series';
import { defineFeature, route } from '../lib/route';
import { analyseProjectSeries } from './service';

export const seriesFeature = defineFeature('series', [
  route({
    method: 'post', path: '/api/projects/{id}/series', tag: 'series', permission: { action: 'read', on: 'project' }, body: seriesRequestSchema, status: 200,
    summary: 'A temperature or pressure series → {kind: "arrhenius"|"order", points: [{buildId, x, y}], estimate, low, high, unit} with the members, the builds left out and what else differs (mismatches), and the method; Eₐ in kJ/mol, order dimensionless',
    handle: ({ ctx, access, body }) => analyseProjectSeries(ctx, access, body),
  }),
]);
