// Surface fits and proposals. A fit is a POST but has no side effects, so it is cached as a
// query keyed on its request; the returned fit carries its basis, so the browser can predict
// anywhere (contours, what-if) without another round trip. Planning a proposal is a write: the
// server refits and checks the recipe again before it plans it.
import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { PlanProposalBody, PlanProposalResult, ProposalItem, ProposalsRequest, ProposalsResult, ResponseInfo, SurfaceRequest, SurfaceResult } from '@shared/api-types';

export type { PlanProposalBody, PlanProposalResult, ProposalItem, ProposalsRequest, ProposalsResult, ResponseInfo, SurfaceRequest, SurfaceResult };

export const surfaceQueryOptions = (projectId: number, request: SurfaceRequest | null) =>
  queryOptions({
    queryKey: ['surface', projectId, request],
    queryFn: () => api<SurfaceResult>(`/projects/${projectId}/surface`, { method: 'POST', body: request }),
    enabled: request !== null,
    staleTime: 60_000,
    retry: false,
    placeholderData: keepPreviousData,
  });
export const useSurface = (projectId: number, request: SurfaceRequest | null) => useQuery(surfaceQueryOptions(projectId, request));

export function useProposals(projectId: number) {
  return useMutation({
    mutationFn: (body: ProposalsRequest) => api<ProposalsResult>(`/projects/${projectId}/proposals`, { method: 'POST', body }),
  });
}

export function usePlanProposal(projectId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: PlanProposalBody) => api<PlanProposalResult>(`/projects/${projectId}/proposals/plan`, { method: 'POST', body }),
    onSuccess: () => {
      client.invalidateQueries({ queryKey: ['builds', projectId] });
      client.invalidateQueries({ queryKey: ['home'] });
    },
  });
}
