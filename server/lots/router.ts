// HTTP for catalyst lots: list and record them per project, read one with its builds, change it,
// and compare a response between two lots at matched recipes (PIs and researchers record lots).
import { lotComparisonQuerySchema, lotCreateSchema, lotUpdateSchema } from '../../shared/schemas/lots';
import { defineFeature, route } from '../lib/route';
import * as lots from './service';

export const lotsFeature = defineFeature('lots', [
  route({
    method: 'get', path: '/api/projects/{id}/lots', tag: 'lots', permission: { action: 'read', on: 'project' },
    summary: 'The project’s catalyst lots, each with how many builds were made from it',
    handle: ({ ctx, access }) => ({ lots: lots.listLots(ctx, access) }),
  }),
  route({
    method: 'post', path: '/api/projects/{id}/lots', tag: 'lots', permission: { action: 'editLots', on: 'project' }, body: lotCreateSchema, status: 201,
    summary: 'Record a catalyst lot (name, maker, batch size in g, synthesis or receipt date, metal content in wt %, notes)',
    handle: ({ ctx, access, body }) => ({ lot: lots.createLot(ctx, access, body) }),
  }),
  route({
    method: 'get', path: '/api/lots/{id}', tag: 'lots', permission: { action: 'read', on: 'lot' },
    summary: 'A lot with the builds made from it (metal loading measured, or catalyst loading × metal content)',
    handle: ({ ctx, access, lot }) => lots.lotDetail(ctx, access, lot),
  }),
  route({
    method: 'patch', path: '/api/lots/{id}', tag: 'lots', permission: { action: 'editLots', on: 'lot' }, body: lotUpdateSchema,
    summary: 'Change a lot’s record',
    handle: ({ ctx, access, lot, body }) => ({ lot: lots.updateLot(ctx, access, lot, body) }),
  }),
  route({
    method: 'get', path: '/api/lots/{id}/comparison', tag: 'lots', permission: { action: 'read', on: 'lot' }, query: lotComparisonQuerySchema,
    summary: 'This lot against another at matched recipes: means, SD, n and the Welch 95 % interval of the difference, overall and per recipe',
    handle: ({ ctx, access, lot, query }) => lots.lotComparison(ctx, access, lot, query),
  }),
]);
