// The lineage tree of a project for one response (GET /api/projects/:id/lineage).
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { LineageData, LineageNodeView } from '@shared/api-types';

export type { LineageData, LineageNodeView };

export const lineageQueryOptions = (projectId: number, response: string) =>
  queryOptions({ queryKey: ['lineage', projectId, response], queryFn: () => api<LineageData>(`/projects/${projectId}/lineage?response=${encodeURIComponent(response)}`) });

export const useLineage = (projectId: number, response: string) => useQuery({ ...lineageQueryOptions(projectId, response), placeholderData: keepPreviousData });
