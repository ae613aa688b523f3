// HTTP for a project's targets: list with status, add, change, remove (PIs edit; everyone reads).
import { targetCreateSchema, targetUpdateSchema } from '../../shared/schemas/targets';
import { defineFeature, route } from '../lib/route';
import * as targets from './service';

export const targetsFeature = defineFeature('targets', [
  route({
    method: 'get', path: '/api/projects/{id}/targets', tag: 'targets', permission: { action: 'read', on: 'project' },
    summary: 'The project’s targets, each with its status: met (by which build, when) or not yet (best so far, gap in the target’s unit), and the best-to-date series',
    handle: ({ ctx, access }) => ({ targets: targets.listTargets(ctx, access) }),
  }),
  route({
    method: 'post', path: '/api/projects/{id}/targets', tag: 'targets', permission: { action: 'editTargets', on: 'project' }, body: targetCreateSchema, status: 201,
    summary: 'Add a target on a curve metric or hand-entered response (≥ or ≤ a value with unit, basis, conditions, due date, name)',
    handle: ({ ctx, access, body }) => ({ target: targets.createTarget(ctx, access, body) }),
  }),
  route({
    method: 'patch', path: '/api/targets/{id}', tag: 'targets', permission: { action: 'editTargets', on: 'target' }, body: targetUpdateSchema,
    summary: 'Change a target',
    handle: ({ ctx, access, target, body }) => ({ target: targets.updateTarget(ctx, access, target, body) }),
  }),
  route({
    method: 'delete', path: '/api/targets/{id}', tag: 'targets', permission: { action: 'editTargets', on: 'target' },
    summary: 'Remove a target',
    handle: ({ ctx, access, target }) => {
      targets.deleteTarget(ctx, access, target);
      return { deleted: true };
    },
  }),
]);
