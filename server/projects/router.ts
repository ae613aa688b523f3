// HTTP for projects, their factors and hand-entered responses, members, notices and invitations.
import { factorCreateSchema, metalPricesSchema, notifySchema, projectCreateSchema, projectUpdateSchema, responseCreateSchema } from '../../shared/schemas/project';
import { inviteCreateSchema, membershipSetSchema } from '../../shared/schemas/auth';
import { defineFeature, route } from '../lib/route';
import { emailLinks } from '../lib/base-url';
import { allowedActions } from '../../shared/auth/permissions';
import * as projects from './service';

export const projectsFeature = defineFeature('projects', [
  route({
    method: 'get', path: '/api/projects', tag: 'projects', permission: 'signed-in',
    summary: 'Projects visible to me',
    handle: ({ ctx, user }) => ({ projects: projects.listProjects(ctx, user) }),
  }),
  route({
    method: 'post', path: '/api/projects', tag: 'projects', permission: 'create-project', body: projectCreateSchema, status: 201,
    summary: 'Create a project (the creator becomes its PI)',
    handle: ({ ctx, user, body }) => ({ project: projects.createProject(ctx, user, body) }),
  }),
  route({
    method: 'get', path: '/api/projects/{id}', tag: 'projects', permission: { action: 'read', on: 'project' },
    summary: 'Read a project',
    handle: ({ ctx, access }) => ({ project: projects.getProject(ctx, access) }),
  }),
  route({
    method: 'patch', path: '/api/projects/{id}', tag: 'projects', permission: { action: 'editSettings', on: 'project' }, body: projectUpdateSchema,
    summary: 'Update a project; a new reference point recomputes every curve’s metrics',
    handle: ({ ctx, access, body }) => ({ project: projects.updateProject(ctx, access, body) }),
  }),
  route({
    method: 'put', path: '/api/projects/{id}/metal-prices', tag: 'projects', permission: { action: 'editSettings', on: 'project' }, body: metalPricesSchema,
    summary: 'Replace the project’s precious-metal prices ({prices: [{metal, pricePerGram, currency, date, source}]}, entered by hand, one currency) → {metalPrices}; audited',
    handle: ({ ctx, access, body }) => projects.setMetalPrices(ctx, access, body.prices),
  }),
  route({
    method: 'get', path: '/api/projects/{id}/permissions', tag: 'projects', permission: { action: 'read', on: 'project' },
    summary: 'What my role may do in this project → {role, actions: {read, editSettings, createBuild, …: true | false}} (partners: lab-bound actions on their own lab’s builds only)',
    handle: ({ access }) => ({ role: access.role, actions: allowedActions(access.role) }),
  }),
  route({
    method: 'get', path: '/api/projects/{id}/factors', tag: 'projects', permission: { action: 'read', on: 'project' },
    summary: 'List factors',
    handle: ({ ctx, access }) => ({ factors: projects.listFactors(ctx, access.projectId) }),
  }),
  route({
    method: 'post', path: '/api/projects/{id}/factors', tag: 'projects', permission: { action: 'editFactors', on: 'project' }, body: factorCreateSchema, status: 201,
    summary: 'Add a factor',
    handle: ({ ctx, access, body }) => ({ factor: projects.addFactor(ctx, access, body) }),
  }),
  route({
    method: 'patch', path: '/api/projects/{id}/factors/{factorId}', tag: 'projects', permission: { action: 'editFactors', on: 'project' }, body: factorCreateSchema,
    summary: 'Update a factor (key fixed)',
    handle: ({ ctx, access, ids, body }) => ({ factor: projects.updateFactor(ctx, access, ids.factorId!, body) }),
  }),
  route({
    method: 'get', path: '/api/projects/{id}/responses', tag: 'projects', permission: { action: 'read', on: 'project' },
    summary: 'List hand-entered response definitions',
    handle: ({ ctx, access }) => ({ responses: projects.listResponses(ctx, access.projectId) }),
  }),
  route({
    method: 'post', path: '/api/projects/{id}/responses', tag: 'projects', permission: { action: 'editFactors', on: 'project' }, body: responseCreateSchema, status: 201,
    summary: 'Add a hand-entered response definition',
    handle: ({ ctx, access, body }) => ({ response: projects.addResponse(ctx, access, body) }),
  }),
  route({
    method: 'get', path: '/api/projects/{id}/members', tag: 'projects', permission: { action: 'read', on: 'project' },
    summary: 'Members and pending invitations',
    handle: ({ ctx, access }) => projects.listMembers(ctx, access.projectId),
  }),
  route({
    method: 'put', path: '/api/projects/{id}/members', tag: 'projects', permission: { action: 'invite', on: 'project' }, body: membershipSetSchema,
    summary: 'Set a member’s role',
    handle: ({ ctx, access, body }) => projects.setMemberRole(ctx, access, body.userId, body.role),
  }),
  route({
    method: 'delete', path: '/api/projects/{id}/members/{userId}', tag: 'projects', permission: { action: 'invite', on: 'project' },
    summary: 'Remove a member',
    handle: ({ ctx, access, ids }) => projects.removeMember(ctx, access, ids.userId!),
  }),
  route({
    method: 'put', path: '/api/projects/{id}/notify', tag: 'projects', permission: { action: 'read', on: 'project', members: true }, body: notifySchema,
    summary: 'Turn my e-mail notices for this project on or off',
    handle: ({ ctx, access, body }) => projects.setNotify(ctx, access, body),
  }),
  route({
    method: 'post', path: '/api/projects/{id}/invitations', tag: 'projects', permission: { action: 'invite', on: 'project' }, body: inviteCreateSchema, status: 201,
    summary: 'Invite someone by e-mail (link valid 7 days, once)',
    handle: ({ ctx, req, access, body }) => projects.invite(ctx, access, body, emailLinks(ctx.env, req)),
  }),
]);
