// Administration: people, labs, outbox, audit log and backups.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { LabCreate, PersonUpdate } from '@shared/schemas/auth';
import type { ProjectRole } from '@shared/schemas/project';

export interface Person {
  id: number; email: string; name: string; isAdmin: boolean; labId: number | null; labName: string | null; disabledAt: string | null; createdAt: string;
  roles: { projectId: number; projectName: string; role: string }[];
}
export const peopleQueryOptions = () => queryOptions({ queryKey: ['admin', 'people'], queryFn: () => api<{ people: Person[] }>('/admin/people').then((r) => r.people) });
export const usePeople = () => useQuery(peopleQueryOptions());

export function useUpdatePerson() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...body }: PersonUpdate & { id: number }) => api(`/admin/people/${id}`, { method: 'PATCH', body }),
    onSuccess: () => client.invalidateQueries({ queryKey: ['admin', 'people'] }),
  });
}

export function useSetRole() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ projectId, userId, role }: { projectId: number; userId: number; role: ProjectRole | 'none' }) =>
      role === 'none' ? api(`/projects/${projectId}/members/${userId}`, { method: 'DELETE' }) : api(`/projects/${projectId}/members`, { method: 'PUT', body: { userId, role } }),
    onSuccess: () => client.invalidateQueries({ queryKey: ['admin', 'people'] }),
  });
}

export function useCreateLab() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: LabCreate) => api('/admin/labs', { method: 'POST', body }),
    onSuccess: () => client.invalidateQueries({ queryKey: ['labs'] }),
  });
}

export interface OutboxMessage { id: number; to: string; subject: string; text: string; html: string | null; transport: string; createdAt: string }
export const outboxQueryOptions = () => queryOptions({ queryKey: ['admin', 'outbox'], queryFn: () => api<{ messages: OutboxMessage[] }>('/admin/outbox').then((r) => r.messages) });
export const useOutbox = () => useQuery(outboxQueryOptions());

export interface AuditEntry { id: number; userId: number | null; userName: string | null; at: string; action: string; entity: string; entityId: number | null; projectId: number | null; before: unknown; after: unknown }
export const auditQueryOptions = (filter: { projectId?: number; entity?: string; entityId?: number }) =>
  queryOptions({
    queryKey: ['admin', 'audit', filter],
    queryFn: () => {
      const q = new URLSearchParams();
      if (filter.projectId) q.set('projectId', String(filter.projectId));
      if (filter.entity) q.set('entity', filter.entity);
      if (filter.entityId) q.set('entityId', String(filter.entityId));
      return api<{ entries: AuditEntry[] }>(`/admin/audit?${q}`).then((r) => r.entries);
    },
  });
export const useAudit = (filter: { projectId?: number; entity?: string; entityId?: number }) => useQuery(auditQueryOptions(filter));

export function useSendDigests() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: () => api<{ sent: number }>('/admin/digests/send', { method: 'POST' }),
    onSuccess: () => client.invalidateQueries({ queryKey: ['admin', 'outbox'] }),
  });
}

export interface BackupRow { name: string; bytes: number; createdAt: string; archive: boolean }
export interface BackupsData { folder: string; store: string; backups: BackupRow[] }
export const backupsQueryOptions = () => queryOptions({ queryKey: ['admin', 'backups'], queryFn: () => api<BackupsData>('/admin/backups') });
export const useBackups = () => useQuery(backupsQueryOptions());

export interface BackupMade { name: string; bytes: number; createdAt: string; counts: Record<'projects' | 'builds' | 'curves' | 'files' | 'users', number>; rawFiles: number; databaseSha256: string }
export function useMakeBackup() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: () => api<{ backup: BackupMade }>('/admin/backups', { method: 'POST' }).then((r) => r.backup),
    onSuccess: () => client.invalidateQueries({ queryKey: backupsQueryOptions().queryKey }),
  });
}
