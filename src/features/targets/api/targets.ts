// A project's targets with their status; adding, changing and removing them (PIs).
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { TargetView } from '@shared/api-types';
import type { TargetCreate, TargetUpdate } from '@shared/schemas/targets';

export const targetsQueryOptions = (projectId: number) =>
  queryOptions({ queryKey: ['targets', projectId], queryFn: () => api<{ targets: TargetView[] }>(`/projects/${projectId}/targets`).then((r) => r.targets) });
export const useTargets = (projectId: number) => useQuery(targetsQueryOptions(projectId));

function useInvalidate(projectId: number) {
  const client = useQueryClient();
  return () => {
    client.invalidateQueries({ queryKey: targetsQueryOptions(projectId).queryKey });
    client.invalidateQueries({ queryKey: ['home'] });
  };
}

export function useCreateTarget(projectId: number) {
  const invalidate = useInvalidate(projectId);
  return useMutation({
    mutationFn: (input: TargetCreate) => api<{ target: TargetView }>(`/projects/${projectId}/targets`, { method: 'POST', body: input }).then((r) => r.target),
    onSuccess: invalidate,
  });
}

export function useUpdateTarget(projectId: number) {
  const invalidate = useInvalidate(projectId);
  return useMutation({
    mutationFn: ({ id, ...input }: TargetUpdate & { id: number }) => api<{ target: TargetView }>(`/targets/${id}`, { method: 'PATCH', body: input }).then((r) => r.target),
    onSuccess: invalidate,
  });
}

export function useDeleteTarget(projectId: number) {
  const invalidate = useInvalidate(projectId);
  return useMutation({
    mutationFn: (id: number) => api<{ deleted: boolean }>(`/targets/${id}`, { method: 'DELETE' }),
    onSuccess: invalidate,
  });
}
