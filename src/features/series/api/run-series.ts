// A series analysis (POST /api/projects/:id/series): computed on the server, cached by its inputs.
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SeriesData, SeriesRequestBody } from '@shared/api-types';

export type { SeriesData };

export const seriesQueryOptions = (projectId: number, body: SeriesRequestBody) =>
  queryOptions({
    queryKey: ['series', projectId, body.variable, body.builds?.join(',') ?? 'auto', body.atVoltageIrFree ?? 'default'],
    queryFn: () => api<SeriesData>(`/projects/${projectId}/series`, { method: 'POST', body }),
    retry: false,
  });

export const useSeries = (projectId: number, body: SeriesRequestBody) => useQuery({ ...seriesQueryOptions(projectId, body), placeholderData: keepPreviousData });
