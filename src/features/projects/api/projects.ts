// Projects: list, home summary, one project, create and update (one query key per resource).
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Project, FactorDef, ResponseDef, TargetView } from '@shared/api-types';
import type { ProjectCreate, FactorCreate, NotifyBody, ResponseCreate } from '@shared/schemas/project';
import type { InviteCreate } from '@shared/schemas/auth';

export const projectsQueryOptions = () => queryOptions({ queryKey: ['projects'], queryFn: () => api<{ projects: Project[] }>('/projects').then((r) => r.projects) });
export const useProjects = () => useQuery(projectsQueryOptions());

export interface HomeData {
  projects: (Project & { best: { buildId: number; code: string; vAtRef: number; changeNote: string | null } | null; targets?: TargetView[] })[];
  recentUploads: { fileId: number; name: string; uploadedAt: string; projectId: number; buildId: number | null; buildCode: string | null; buildStatus: string | null; uploadedBy: string | null; lotId?: number | null; lotName?: string | null; referenceCurveId?: number | null }[];
  waitingForData?: { buildId: number; code: string; projectId: number; projectName: string; status: string; plannedOn: string | null; changeNote: string | null; needs: string[] }[];
  awaitingReview?: { buildId: number; code: string; projectId: number; projectName: string; changeNote: string | null; status: string; testedOn: string | null; waitingDays: number | null; vAtRef: number | null; parentCode: string | null; changeFromParent: number | null }[];
  needsWork?: { buildId: number; code: string; projectId: number; projectName: string; comment: string | null }[];
}
export const homeQueryOptions = () => queryOptions({ queryKey: ['home'], queryFn: () => api<HomeData>('/home') });
export const useHome = () => useQuery(homeQueryOptions());

export const projectQueryOptions = (id: number) => queryOptions({ queryKey: ['projects', id], queryFn: () => api<{ project: Project }>(`/projects/${id}`).then((r) => r.project) });
export const useProject = (id: number) => useQuery({ ...projectQueryOptions(id), enabled: id > 0 });

export function useCreateProject() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: ProjectCreate) => api<{ project: Project }>('/projects', { method: 'POST', body: input }).then((r) => r.project),
    onSuccess: () => client.invalidateQueries({ queryKey: ['projects'] }),
  });
}

export function useUpdateProject(id: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: Partial<ProjectCreate>) => api<{ project: Project & { recomputedCurves: number } }>(`/projects/${id}`, { method: 'PATCH', body: input }).then((r) => r.project),
    onSuccess: () => {
      client.invalidateQueries({ queryKey: ['projects'] });
      client.invalidateQueries({ queryKey: ['builds', id] });
      client.invalidateQueries({ queryKey: ['build'] });
    },
  });
}

export const factorsQueryOptions = (projectId: number) => queryOptions({ queryKey: ['factors', projectId], queryFn: () => api<{ factors: FactorDef[] }>(`/projects/${projectId}/factors`).then((r) => r.factors) });
export const useFactors = (projectId: number) => useQuery(factorsQueryOptions(projectId));

export function useSaveFactor(projectId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...input }: FactorCreate & { id?: number }) =>
      api<{ factor: FactorDef }>(id ? `/projects/${projectId}/factors/${id}` : `/projects/${projectId}/factors`, { method: id ? 'PATCH' : 'POST', body: input }).then((r) => r.factor),
    onSuccess: () => client.invalidateQueries({ queryKey: ['factors', projectId] }),
  });
}

export const responsesQueryOptions = (projectId: number) => queryOptions({ queryKey: ['responses', projectId], queryFn: () => api<{ responses: ResponseDef[] }>(`/projects/${projectId}/responses`).then((r) => r.responses) });
export const useResponses = (projectId: number) => useQuery(responsesQueryOptions(projectId));

export function useCreateResponse(projectId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: ResponseCreate) => api<{ response: ResponseDef }>(`/projects/${projectId}/responses`, { method: 'POST', body: input }).then((r) => r.response),
    onSuccess: () => client.invalidateQueries({ queryKey: ['responses', projectId] }),
  });
}

export interface Members {
  members: { userId: number; name: string; email: string; role: string; labId: number | null; labName: string | null; notify: boolean; digest: boolean }[];
  pendingInvitations: { id: number; email: string; role: string; expiresAt: string; createdAt: string }[];
}
export const membersQueryOptions = (projectId: number) => queryOptions({ queryKey: ['members', projectId], queryFn: () => api<Members>(`/projects/${projectId}/members`) });
export const useMembers = (projectId: number) => useQuery(membersQueryOptions(projectId));

export function useInvite(projectId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: InviteCreate) =>
      api<{ invitation: { id: number; email: string } | null; member: { name: string; email: string; role: string; added: true } | null }>(`/projects/${projectId}/invitations`, { method: 'POST', body: input }),
    onSuccess: () => client.invalidateQueries({ queryKey: ['members', projectId] }),
  });
}

export function useSetNotify(projectId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (choice: NotifyBody) => api(`/projects/${projectId}/notify`, { method: 'PUT', body: choice }),
    onSuccess: () => {
      client.invalidateQueries({ queryKey: ['members', projectId] });
      client.invalidateQueries({ queryKey: ['me'] });
    },
  });
}
