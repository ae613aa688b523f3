// The gains waterfall of one chain of builds for one response (GET /api/projects/:id/gains).
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { GainsData, GainsStep } from '@shared/api-types';

export type { GainsData, GainsStep };

export const gainsQueryOptions = (projectId: number, response: string, builds: number[] | null) =>
  queryOptions({
    queryKey: ['gains', projectId, response, builds?.join(',') ?? 'best-path'],
    queryFn: () => api<GainsData>(`/projects/${projectId}/gains?response=${encodeURIComponent(response)}${builds && builds.length ? `&builds=${builds.join(',')}` : ''}`),
    retry: false,
  });

export const useGains = (projectId: number, response: string, builds: number[] | null) => useQuery({ ...gainsQueryOptions(projectId, response, builds), placeholderData: keepPreviousData });
