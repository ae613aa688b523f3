// Durability comparison of a project's builds (rate ± 95 % interval, hours, break-in, conditions).
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export interface DurabilityRow {
  curveId: number;
  buildId: number;
  code: string;
  status: string;
  labName: string | null;
  kind: 'durability' | 'hold';
  label: string;
  degradationRate: number | null;
  low: number | null;
  high: number | null;
  hoursRun: number | null;
  breakInHours: number | null;
  breakInSource: string | null;
  voltageLossMv: number | null;
  hoursToLoss: number | null;
  projectedHoursToLoss: number | null;
  lossFraction: number | null;
  interruptions: number;
  currentDensity: number | null;
  temperatureC: number | null;
  note: string | null;
}

export interface DurabilityComparison {
  curves: DurabilityRow[];
  typicalBand: { standard: readonly [number, number]; improved: number };
}

export const durabilityQueryOptions = (projectId: number) =>
  queryOptions({ queryKey: ['durability', projectId], queryFn: () => api<DurabilityComparison>(`/projects/${projectId}/durability`) });
export const useDurability = (projectId: number) => useQuery(durabilityQueryOptions(projectId));
