// Builds: the project's list, one build with lineage and curves, create and update.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Build, BuildBrief, BuildDetail, Lab } from '@shared/api-types';
import type { BuildCreate } from '@shared/schemas/build';

export const buildsQueryOptions = (projectId: number) => queryOptions({ queryKey: ['builds', projectId], queryFn: () => api<{ builds: Build[] }>(`/projects/${projectId}/builds`).then((r) => r.builds) });
export const useBuilds = (projectId: number) => useQuery(buildsQueryOptions(projectId));

/** Every build of the project as a picker shows it (code, change note, status, lab, curves): a tenth of the full list's bytes. */
export const buildBriefsQueryOptions = (projectId: number) => queryOptions({ queryKey: ['builds', projectId, 'brief'], queryFn: () => api<{ builds: BuildBrief[] }>(`/projects/${projectId}/builds?view=brief`).then((r) => r.builds) });
export const useBuildBriefs = (projectId: number) => useQuery(buildBriefsQueryOptions(projectId));

/** Rows the builds table asks for at a time: a project of many builds is read one page at a time. */
export const BUILDS_PAGE_SIZE = 100;

/** One page of the project's builds, in id order, with how many the whole list holds. */
export const buildsPageQueryOptions = (projectId: number, page: number, size = BUILDS_PAGE_SIZE) =>
  queryOptions({
    queryKey: ['builds', projectId, 'page', page, size],
    queryFn: () => api<{ builds: Build[]; total: number }>(`/projects/${projectId}/builds?limit=${size}&offset=${page * size}`),
    placeholderData: (previous) => previous,
  });
export const useBuildsPage = (projectId: number, page: number, size = BUILDS_PAGE_SIZE) => useQuery(buildsPageQueryOptions(projectId, page, size));

export const buildQueryOptions = (buildId: number) => queryOptions({ queryKey: ['build', buildId], queryFn: () => api<BuildDetail>(`/builds/${buildId}`) });
export const useBuild = (buildId: number) => useQuery(buildQueryOptions(buildId));

export function useCreateBuild(projectId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: BuildCreate) => api<{ build: Build }>(`/projects/${projectId}/builds`, { method: 'POST', body: input }).then((r) => r.build),
    onSuccess: () => {
      client.invalidateQueries({ queryKey: ['builds', projectId] });
      client.invalidateQueries({ queryKey: ['home'] });
    },
  });
}

export function useUpdateBuild(buildId: number, projectId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: Partial<BuildCreate>) => api<{ build: Build }>(`/builds/${buildId}`, { method: 'PATCH', body: input }).then((r) => r.build),
    onSuccess: () => {
      client.invalidateQueries({ queryKey: ['builds', projectId] });
      client.invalidateQueries({ queryKey: ['build', buildId] });
    },
  });
}

export const labsQueryOptions = () => queryOptions({ queryKey: ['labs'], queryFn: () => api<{ labs: Lab[] }>('/labs').then((r) => r.labs), staleTime: 5 * 60_000 });
export const useLabs = () => useQuery(labsQueryOptions());
