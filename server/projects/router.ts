// HTTP for projects, factors, responses, members and invitations: validation in, JSON out.
import { Router } from 'express';
import { z } from 'zod';
import type { AppContext } from '../context';
import { factorCreateSchema, projectCreateSchema, projectUpdateSchema, responseCreateSchema } from '../../shared/schemas/project';
import { inviteCreateSchema, membershipSetSchema } from '../../shared/schemas/auth';
import { idParam, parseInput } from '../lib/validate';
import { requireProject, requireUser } from '../auth/access';
import * as projects from './service';
import { requireLinkBase } from '../lib/base-url';

export function projectsRouter(ctx: AppContext): Router {
  const router = Router();
  const { db } = ctx;

  router.get('/projects', (req, res) => {
    res.json({ projects: projects.listProjects(ctx, requireUser(req.user)) });
  });

  router.post('/projects', (req, res) => {
    const user = requireUser(req.user);
    const body = parseInput(projectCreateSchema, req.body);
    res.status(201).json({ project: projects.createProject(ctx, user, body) });
  });

  router.get('/projects/:id', (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'read');
    res.json({ project: projects.getProject(ctx, access) });
  });

  router.patch('/projects/:id', (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'editSettings');
    const body = parseInput(projectUpdateSchema, req.body);
    res.json({ project: projects.updateProject(ctx, access, body) });
  });

  router.get('/projects/:id/factors', (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'read');
    res.json({ factors: projects.listFactors(ctx, access.projectId) });
  });

  router.post('/projects/:id/factors', (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'editFactors');
    const body = parseInput(factorCreateSchema, req.body);
    res.status(201).json({ factor: projects.addFactor(ctx, access, body) });
  });

  router.patch('/projects/:id/factors/:factorId', (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'editFactors');
    const body = parseInput(factorCreateSchema, req.body);
    res.json({ factor: projects.updateFactor(ctx, access, idParam(req.params.factorId, 'factorId'), body) });
  });

  router.get('/projects/:id/responses', (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'read');
    res.json({ responses: projects.listResponses(ctx, access.projectId) });
  });

  router.post('/projects/:id/responses', (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'editFactors');
    const body = parseInput(responseCreateSchema, req.body);
    res.status(201).json({ response: projects.addResponse(ctx, access, body) });
  });

  router.get('/projects/:id/members', (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'read');
    res.json(projects.listMembers(ctx, access.projectId));
  });

  router.put('/projects/:id/members', (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'invite');
    const body = parseInput(membershipSetSchema, req.body);
    res.json(projects.setMemberRole(ctx, access, body.userId, body.role));
  });

  router.delete('/projects/:id/members/:userId', (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'invite');
    res.json(projects.removeMember(ctx, access, idParam(req.params.userId, 'userId')));
  });

  router.put('/projects/:id/notify', (req, res) => {
    requireUser(req.user);
    const body = parseInput(z.object({ notify: z.boolean(), digest: z.boolean().optional() }), req.body);
    res.json(projects.setNotify(ctx, requireUser(req.user), idParam(req.params.id), body.notify, body.digest));
  });

  router.post('/projects/:id/invitations', async (req, res) => {
    const access = requireProject(db, req.user, idParam(req.params.id), 'invite');
    const body = parseInput(inviteCreateSchema, req.body);
    res.status(201).json(await projects.invite(ctx, access, body, requireLinkBase(ctx.env, req)));
  });

  return router;
}

