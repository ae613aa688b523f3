// HTTP for site-wide administration: people, labs, digests, backups, the outbox and the audit
// log. Admins only, except the lab list (names), which every signed-in person needs for build forms.
import { adminPageQuery, labCreateSchema, personUpdateSchema } from '../../shared/schemas/auth';
import { defineFeature, route } from '../lib/route';
import * as admin from './service';

export const adminFeature = defineFeature('admin', [
  route({
    method: 'get', path: '/api/labs', tag: 'admin', permission: 'signed-in',
    summary: 'Labs (home and partner)',
    handle: ({ ctx }) => ({ labs: admin.listLabs(ctx) }),
  }),
  route({
    method: 'post', path: '/api/admin/labs', tag: 'admin', permission: 'site-admin', body: labCreateSchema, status: 201,
    summary: 'Add a lab (admin)',
    handle: ({ ctx, user, body }) => ({ lab: admin.addLab(ctx, user, body) }),
  }),
  route({
    method: 'get', path: '/api/admin/people', tag: 'admin', permission: 'site-admin',
    summary: 'People and their roles (admin)',
    handle: ({ ctx }) => ({ people: admin.listPeople(ctx) }),
  }),
  route({
    method: 'patch', path: '/api/admin/people/{id}', tag: 'admin', permission: 'site-admin', body: personUpdateSchema,
    summary: 'Update a person (admin)',
    handle: ({ ctx, user, ids, body }) => ({ person: admin.updatePerson(ctx, user, ids.id!, body) }),
  }),
  route({
    method: 'post', path: '/api/admin/people/{id}/revoke-sessions', tag: 'admin', permission: 'site-admin',
    summary: 'Sign a person out everywhere (admin)',
    handle: ({ ctx, user, ids }) => ({ revoked: admin.revokePersonSessions(ctx, user, ids.id!) }),
  }),
  route({
    method: 'post', path: '/api/admin/digests/send', tag: 'admin', permission: 'site-admin',
    summary: 'Send the daily digest of notices now (admin; it also runs every 24 h)',
    handle: async ({ ctx, user }) => ({ sent: await admin.sendDigestsNow(ctx, user) }),
  }),
  route({
    method: 'get', path: '/api/admin/outbox', tag: 'admin', permission: 'site-admin', query: adminPageQuery,
    summary: 'Messages in the local outbox (admin)',
    handle: ({ ctx, query }) => ({ messages: admin.outboxPage(ctx, query) }),
  }),
  route({
    method: 'get', path: '/api/admin/backups', tag: 'admin', permission: 'site-admin',
    summary: 'Backups in BACKUP_DIR, newest first (admin)',
    handle: ({ ctx }) => admin.backupFolder(ctx),
  }),
  route({
    method: 'post', path: '/api/admin/backups', tag: 'admin', permission: 'site-admin', status: 201,
    summary: 'Write a backup now: online database copy + raw files + SHA-256 manifest, as a .tar in BACKUP_DIR (admin)',
    handle: async ({ ctx, user }) => ({ backup: await admin.backupNow(ctx, user) }),
  }),
  route({
    method: 'get', path: '/api/admin/backups/{name}', tag: 'admin', permission: 'site-admin',
    summary: 'Download a backup archive (admin)',
    handle: ({ ctx, res, texts }) => {
      res.download(admin.backupArchivePath(ctx, texts.name!), texts.name!);
    },
  }),
  route({
    method: 'get', path: '/api/admin/audit', tag: 'admin', permission: 'site-admin', query: adminPageQuery,
    summary: 'Audit log (admin)',
    handle: ({ ctx, query }) => ({ entries: admin.auditPage(ctx, query) }),
  }),
]);
