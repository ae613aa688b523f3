// Designs: generate one over the project's factors (not stored), turn its runs into planned
// builds (the design is then stored and its builds point back to it), and list stored designs.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Build, DesignBody, GeneratedDesign, PlanRunsBody, StoredDesign } from '@shared/api-types';

export type { DesignBody, PlanRunsBody, StoredDesign };

export function useGenerateDesign(projectId: number) {
  return useMutation({
    mutationFn: (body: DesignBody) => api<GeneratedDesign>(`/projects/${projectId}/designs`, { method: 'POST', body }),
  });
}

export const designsQueryOptions = (projectId: number) =>
  queryOptions({ queryKey: ['designs', projectId], queryFn: () => api<{ designs: StoredDesign[] }>(`/projects/${projectId}/designs`).then((r) => r.designs) });
export const useDesigns = (projectId: number) => useQuery(designsQueryOptions(projectId));

export function usePlanRuns(projectId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: PlanRunsBody) => api<{ builds: Build[]; designId: number }>(`/projects/${projectId}/designs/plan`, { method: 'POST', body }).then((r) => r.builds),
    onSuccess: () => {
      client.invalidateQueries({ queryKey: ['builds', projectId] });
      client.invalidateQueries({ queryKey: designsQueryOptions(projectId).queryKey });
      client.invalidateQueries({ queryKey: ['home'] });
    },
  });
}
