// Designs: generate one over the project's factors (not stored), and turn its runs into planned builds.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Build, FactorDef } from '@shared/api-types';
import type { Design, DesignRequest } from '@shared/doe/designs/types';

export type DesignBody = Omit<DesignRequest, 'factors'> & { factors: string[] };

export function useGenerateDesign(projectId: number) {
  return useMutation({
    mutationFn: (body: DesignBody) => api<{ design: Design; factors: FactorDef[] }>(`/projects/${projectId}/designs`, { method: 'POST', body }),
  });
}

export interface PlanRunsBody {
  runs: Design['runs'];
  parentId?: number | null;
  labId?: number | null;
  labsByBlock?: Record<string, number>;
  loadingMgCm2?: number | null;
  areaCm2?: number | null;
  note?: string;
  designKind?: string;
  seed?: number;
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
