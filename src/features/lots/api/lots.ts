// Catalyst lots: a project's list, one lot with its builds, and a lot-to-lot comparison; recording
// and changing lots and the files kept with them (PIs and researchers).
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api, uploadWithProgress } from '@/lib/api-client';
import type { LotView } from '@shared/api-types';
import type { LotCreate } from '@shared/schemas/lots';

export interface LotSide { n: number; mean: number | null; sd: number | null }
export interface LotWelch { diff: number; low: number; high: number; df: number; se: number }
export interface LotDetail {
  lot: LotView;
  builds: { id: number; code: string; status: string; changeNote: string | null; testedOn: string | null; loadingMgCm2: number | null; metalLoadingMgCm2: number | null; metalLoadingSource: 'measured' | 'from lot metal content' | null; values: Record<string, number> }[];
}
export interface LotComparisonData {
  response: { key: string; label: string; unit: string };
  unit: string;
  confidence: number;
  lot: { id: number; name: string };
  against: { id: number; name: string };
  matchedRecipes: string[];
  a: LotSide;
  b: LotSide;
  welch: LotWelch | null;
  unmatched: number;
}

export const lotsQueryOptions = (projectId: number) => queryOptions({ queryKey: ['lots', projectId], queryFn: () => api<{ lots: LotView[] }>(`/projects/${projectId}/lots`).then((r) => r.lots) });
export const useLots = (projectId: number) => useQuery({ ...lotsQueryOptions(projectId), enabled: projectId > 0 });
export const lotQueryOptions = (lotId: number) => queryOptions({ queryKey: ['lot', lotId], queryFn: () => api<LotDetail>(`/lots/${lotId}`) });
export const useLot = (lotId: number) => useQuery(lotQueryOptions(lotId));
export const lotComparisonQueryOptions = (lotId: number, against: number, response: string) =>
  queryOptions({ queryKey: ['lot', lotId, 'comparison', against, response], queryFn: () => api<LotComparisonData>(`/lots/${lotId}/comparison?against=${against}&response=${encodeURIComponent(response)}`) });
export const useLotComparison = (lotId: number, against: number | null, response: string) => useQuery({ ...lotComparisonQueryOptions(lotId, against ?? 0, response), enabled: against != null && against > 0 });

function useInvalidateLots() {
  const client = useQueryClient();
  return () => {
    client.invalidateQueries({ queryKey: ['lots'] });
    client.invalidateQueries({ queryKey: ['lot'] });
    client.invalidateQueries({ queryKey: ['builds'] });
  };
}

export function useCreateLot(projectId: number) {
  const invalidate = useInvalidateLots();
  return useMutation({
    mutationFn: (input: LotCreate) => api<{ lot: LotView }>(`/projects/${projectId}/lots`, { method: 'POST', body: input }).then((r) => r.lot),
    onSuccess: invalidate,
  });
}

export function useUpdateLot(lotId: number) {
  const invalidate = useInvalidateLots();
  return useMutation({
    mutationFn: (input: Partial<LotCreate>) => api<{ lot: LotView }>(`/lots/${lotId}`, { method: 'PATCH', body: input }).then((r) => r.lot),
    onSuccess: invalidate,
  });
}

export function useAddLotFile(lotId: number) {
  const invalidate = useInvalidateLots();
  return useMutation({
    mutationFn: (file: File) => {
      const form = new FormData();
      form.append('file', file);
      return uploadWithProgress<{ lot: LotView }>(`/lots/${lotId}/files`, form, () => undefined).then((r) => r.lot);
    },
    onSuccess: invalidate,
  });
}

export function useRemoveLotFile(lotId: number) {
  const invalidate = useInvalidateLots();
  return useMutation({
    mutationFn: (fileId: number) => api<{ lot: LotView }>(`/lots/${lotId}/files/${fileId}`, { method: 'DELETE' }).then((r) => r.lot),
    onSuccess: invalidate,
  });
}
