// The lineage tree of a project for one response (GET /api/projects/:id/lineage).
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export interface LineageResponseInfo {
  key: string;
  label: string;
  unit: string;
  goal: 'maximize' | 'minimize' | 'target';
  target: number | null;
  source: 'curve' | 'hand-entered';
}

export interface LineageNodeView {
  groupId: number;
  buildId: number;
  code: string;
  changeNote: string | null;
  status: string;
  planned: boolean;
  members: { id: number; code: string; status: string; value: number | null }[];
  parentGroupId: number | null;
  parentBuildId: number | null;
  children: number[];
  depth: number;
  value: { mean: number; sd: number | null; n: number } | null;
  changes: { key: string; label: string; unit: string; from: number | string | null; to: number | string | null }[];
  changeText: string | null;
  onBestPath: boolean;
  best: boolean;
}

export interface LineageData {
  response: LineageResponseInfo;
  responses: LineageResponseInfo[];
  nodes: LineageNodeView[];
  roots: number[];
  bestPath: { bestGroupId: number; buildIds: number[] } | null;
  cutLoops: number[];
}

export const lineageQueryOptions = (projectId: number, response: string) =>
  queryOptions({ queryKey: ['lineage', projectId, response], queryFn: () => api<LineageData>(`/projects/${projectId}/lineage?response=${encodeURIComponent(response)}`) });

export const useLineage = (projectId: number, response: string) => useQuery({ ...lineageQueryOptions(projectId, response), placeholderData: keepPreviousData });
