// Designs: generate one over the project's factors (not stored), and turn its runs into planned builds.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Build, DesignBody, GeneratedDesign, PlanRunsBody } from '@shared/api-types';

export type { DesignBody, PlanRunsBody };

export function useGenerateDesign(projectId: number) {
  return useMutation({
    mutationFn: (body: DesignBody) => api<GeneratedDesign>(`/projects/${projectId}/designs`, { method: 'POST', body }),
  });
}

export function usePlanRuns(projectId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: PlanRunsBody) => api<{ builds: Build[] }>(`/projects/${projectId}/designs/plan`, { method: 'POST', body }).then((r) => r.builds),
    onSuccess: () => {
      client.invalidateQueries({ queryKey: ['builds', projectId] });
      client.invalidateQueries({ queryKey: ['home'] });
    },
  });
}
