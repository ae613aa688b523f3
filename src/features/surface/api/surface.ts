// Surface fits and proposals. A fit is a POST but has no side effects, so it is cached as a
// query keyed on its request; the returned fit carries its basis, so the browser can predict
// anywhere (contours, what-if) without another round trip.
import { keepPreviousData, queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { FactorDef } from '@shared/api-types';
import type { CanonicalAnalysis, ModelSpec, SurfaceFit } from '@shared/doe/model/index';
import type { Proposal, ProposalConstraints, ProposalGoal, ProposalStrategy } from '@shared/doe/proposals/index';

export interface SurfaceRequest {
  response: string;
  model: ModelSpec;
  factors?: string[];
  exclude?: number[];
}

export interface ResponseInfo {
  key: string;
  label: string;
  unit: string;
  source: 'curve' | 'hand-entered';
  goal: 'maximize' | 'minimize' | 'target';
  target: number | null;
}

export interface SurfaceRun {
  buildId: number;
  code: string;
  labName: string | null;
  factors: Record<string, number | string>;
  observed: number;
  predicted: number;
  residual: number;
  leverage: number;
}

export interface SurfaceResult {
  response: ResponseInfo;
  factors: FactorDef[];
  fit: SurfaceFit;
  runs: SurfaceRun[];
  skipped: { buildId: number; code: string; reason: string }[];
  omittedFactors: { key: string; reason: string }[];
  canonical: CanonicalAnalysis | null;
  observedMax: Record<string, number>;
  gases: string[];
}

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

export interface ProposalsRequest extends SurfaceRequest {
  goal?: ProposalGoal;
  count: number;
  strategy?: ProposalStrategy;
  constraints?: ProposalConstraints;
  seed?: number;
}

export interface ProposalItem extends Proposal {
  extrapolationReasons: string[];
  nearest: { buildId: number; code: string; distance: number } | null;
  cautions: string[];
}

export interface ProposalsResult {
  proposals: ProposalItem[];
  response: ResponseInfo;
  goal: ProposalGoal;
  strategy: ProposalStrategy;
  fit: { n: number; r2: number; rmse: number; predR2: number | null; warnings: string[] };
}

export function useProposals(projectId: number) {
  return useMutation({
    mutationFn: (body: ProposalsRequest) => api<ProposalsResult>(`/projects/${projectId}/proposals`, { method: 'POST', body }),
  });
}
