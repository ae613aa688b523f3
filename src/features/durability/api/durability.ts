// Durability comparison of a project's builds (rate ± 95 % interval, hours, break-in, conditions).
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { DurabilityComparison, DurabilityRow } from '@shared/api-types';

export type { DurabilityComparison, DurabilityRow };

export const durabilityQueryOptions = (projectId: number) =>
  queryOptions({ queryKey: ['durability', projectId], queryFn: () => api<DurabilityComparison>(`/projects/${projectId}/durability`) });
export const useDurability = (projectId: number) => useQuery(durabilityQueryOptions(projectId));
