// The gains waterfall of one chain of builds for one response (GET /api/projects/:id/gains).
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export interface GainsResponseInfo {
  key: string;
  label: string;
  unit: string;
  goal: 'maximize' | 'minimize' | 'target';
  target: number | null;
  source: 'curve' | 'hand-entered';
}

export interface GainsStep {
  buildId: number;
  code: string;
  value: number;
  gain: number | null;
  low: number | null;
  high: number | null;
  withinNoise: boolean | null;
  n: number;
  sd: number | null;
  method: 'welch' | 'pooled' | 'none';
  note: string | null;
  changeNote: string | null;
  changeText: string | null;
  replicates: string[];
  status: string;
}

export interface GainsData {
  response: GainsResponseInfo;
  unit: string;
  confidence: number;
  chain: 'given' | 'best-path';
  pooledSd: { sd: number; df: number; groups: number } | null;
  steps: GainsStep[];
  total: { gain: number; low: number | null; high: number | null; withinNoise: boolean | null; method: string; note: string | null; value: number };
  baseline: { buildId: number; code: string; value: number };
}

export const gainsQueryOptions = (projectId: number, response: string, builds: number[] | null) =>
  queryOptions({
    queryKey: ['gains', projectId, response, builds?.join(',') ?? 'best-path'],
    queryFn: () => api<GainsData>(`/projects/${projectId}/gains?response=${encodeURIComponent(response)}${builds && builds.length ? `&builds=${builds.join(',')}` : ''}`),
    retry: false,
  });

export const useGains = (projectId: number, response: string, builds: number[] | null) => useQuery({ ...gainsQueryOptions(projectId, response, builds), placeholderData: keepPreviousData });
