// The project's benchmark (a build or a reference curve) and its reference curves: read by every
// plot of the project, set and imported by PIs.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api, uploadWithProgress } from '@/lib/api-client';
import type { BenchmarkSet, BenchmarkView, ReferenceCurveView } from '@shared/schemas/benchmarks';

export type { BenchmarkView, ReferenceCurveView };

export const benchmarkQueryOptions = (projectId: number) =>
  queryOptions({ queryKey: ['benchmark', projectId], queryFn: () => api<{ benchmark: BenchmarkView | null }>(`/projects/${projectId}/benchmark`).then((r) => r.benchmark) });
export const useBenchmark = (projectId: number | undefined) => useQuery({ ...benchmarkQueryOptions(projectId ?? 0), enabled: projectId != null && projectId > 0 });

export const referenceCurvesQueryOptions = (projectId: number) =>
  queryOptions({ queryKey: ['reference-curves', projectId], queryFn: () => api<{ referenceCurves: ReferenceCurveView[] }>(`/projects/${projectId}/reference-curves`).then((r) => r.referenceCurves) });
export const useReferenceCurves = (projectId: number) => useQuery(referenceCurvesQueryOptions(projectId));

function useInvalidate(projectId: number) {
  const client = useQueryClient();
  return () => {
    client.invalidateQueries({ queryKey: ['benchmark', projectId] });
    client.invalidateQueries({ queryKey: ['reference-curves', projectId] });
  };
}

export function useSetBenchmark(projectId: number) {
  const invalidate = useInvalidate(projectId);
  return useMutation({
    mutationFn: (input: BenchmarkSet) => api<{ benchmark: BenchmarkView }>(`/projects/${projectId}/benchmark`, { method: 'PUT', body: input }).then((r) => r.benchmark),
    onSuccess: invalidate,
  });
}

export function useClearBenchmark(projectId: number) {
  const invalidate = useInvalidate(projectId);
  return useMutation({
    mutationFn: () => api<{ benchmark: null }>(`/projects/${projectId}/benchmark`, { method: 'DELETE' }),
    onSuccess: invalidate,
  });
}

export function useImportReference(projectId: number) {
  const invalidate = useInvalidate(projectId);
  return useMutation({
    mutationFn: (form: FormData) => uploadWithProgress<{ referenceCurve: ReferenceCurveView }>(`/projects/${projectId}/reference-curves`, form, () => undefined).then((r) => r.referenceCurve),
    onSuccess: invalidate,
  });
}

export function useDeleteReference(projectId: number) {
  const invalidate = useInvalidate(projectId);
  return useMutation({
    mutationFn: (id: number) => api<{ deleted: boolean }>(`/reference-curves/${id}`, { method: 'DELETE' }),
    onSuccess: invalidate,
  });
}
