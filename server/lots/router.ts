// HTTP for catalyst lots: list and record them per project, read one with its builds, change it,
// keep certificates with it, and compare a response between two lots at matched recipes (PIs and
// researchers record lots); GET/POST /api/lots span the projects one may read.
import { lotComparisonQuerySchema, lotCreateInProjectSchema, lotCreateSchema, lotsQuerySchema, lotUpdateSchema } from '../../shared/schemas/lots';
import { defineFeature, route } from '../lib/route';
import { receiveFile, receivedFile, removeReceivedFile } from '../lib/receive-file';
import { z } from 'zod';
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
    method: 'get', path: '/api/lots', tag: 'lots', permission: 'signed-in', query: lotsQuerySchema,
    summary: 'Every catalyst lot of the projects one may read (projectId to keep one project, q to search name or maker), each with its project, build count and files',
    handle: ({ ctx, user, query }) => ({ lots: lots.listAllLots(ctx, user!, query) }),
  }),
  route({
    method: 'post', path: '/api/lots', tag: 'lots', permission: { action: 'editLots', on: 'project', idFrom: 'body' }, body: lotCreateInProjectSchema, status: 201,
    summary: 'Record a catalyst lot in the project the body names (projectId, name, maker, batch size in g, date, metal content in wt %, notes)',
    handle: ({ ctx, access, body }) => ({ lot: lots.createLot(ctx, access, body) }),
  }),
  route({
    method: 'post', path: '/api/lots/{id}/files', tag: 'lots', permission: { action: 'editLots', on: 'lot' }, multipart: z.object({}), status: 201,
    summary: 'Keep a file with the lot (multipart field "file": a certificate of analysis, an ICP report, a data sheet; PDF, image or table). Raw bytes at /api/files/{id}/raw',
    before: (ctx) => [receiveFile(ctx)],
    cleanup: removeReceivedFile,
    handle: async ({ ctx, req, access, lot }) => ({ lot: await lots.addLotFile(ctx, access, lot, receivedFile(req)) }),
  }),
  route({
    method: 'delete', path: '/api/lots/{id}/files/{fileId}', tag: 'lots', permission: { action: 'editLots', on: 'lot' },
    summary: 'Take a file off the lot’s list (the stored bytes stay, as every raw file does). Audited',
    handle: ({ ctx, access, lot, ids }) => ({ lot: lots.removeLotFile(ctx, access, lot, ids.fileId!) }),
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
