// Curves: points of one curve, uploads (with progress), previews, profiles, curve options.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api, uploadWithProgress } from '@/lib/api-client';
import type { Build, CurvePoints, CurveSummary, RecordChange, RecordChoice, UploadFields, UploadPreview, UploadProgress } from '@shared/api-types';
import type { CurveKind } from '@shared/curves/types';
import type { CurvePatch } from '@shared/schemas/curves';

export const curveQueryOptions = (curveId: number, range?: { fromHours?: number; toHours?: number; maxPoints?: number }) =>
  queryOptions({
    queryKey: ['curve', curveId, range ?? null],
    queryFn: () => {
      const q = new URLSearchParams();
      if (range?.maxPoints) q.set('maxPoints', String(range.maxPoints));
      if (range?.fromHours != null) q.set('fromHours', String(range.fromHours));
      if (range?.toHours != null) q.set('toHours', String(range.toHours));
      return api<{ curve: CurveSummary; points: CurvePoints }>(`/curves/${curveId}${q.size ? `?${q}` : ''}`);
    },
    staleTime: 5 * 60_000,
  });
export const useCurve = (curveId: number, range?: { fromHours?: number; toHours?: number; maxPoints?: number }) => useQuery(curveQueryOptions(curveId, range));

export type { UploadFields, UploadProgress };

export const newUploadId = () => `u${Date.now().toString(36)}${Math.random().toString(36).slice(2, 10)}`;

export function fetchUploadProgress(uploadId: string) {
  return api<{ progress: UploadProgress & { known: boolean } }>(`/uploads/${uploadId}/progress`).then((r) => r.progress);
}

function formFor(file: File, fields: UploadFields) {
  const form = new FormData();
  for (const [key, value] of Object.entries(fields)) {
    if (value === undefined || value === null || value === '') continue;
    form.append(key, typeof value === 'object' ? JSON.stringify(value) : String(value));
  }
  form.append('file', file);
  return form;
}

/** 201 answer of an upload: the stored curve and the build's curve of record of the same kind. */
export interface UploadAnswer {
  curve: CurveSummary;
  /** the record of that kind: the new curve itself when it is the first of its kind */
  recordCurve: CurveSummary | null;
}

export function uploadCurve(buildId: number, file: File, fields: UploadFields, onProgress: (f: number) => void) {
  return uploadWithProgress<UploadAnswer>(`/builds/${buildId}/curves`, formFor(file, fields), onProgress);
}

export function previewCurve(buildId: number, file: File, fields: UploadFields) {
  return uploadWithProgress<{ preview: UploadPreview }>(`/builds/${buildId}/curves/preview`, formFor(file, fields), () => {});
}

export function useInvalidateAfterUpload(projectId: number) {
  const client = useQueryClient();
  // the first curve of a kind becomes the record, so any page reading the build's values may move
  return (buildId: number) => invalidateBuildValues(client, buildId, projectId);
}

/** Everything that reads a build's values: refetched after its curve of record changes. */
function invalidateBuildValues(client: ReturnType<typeof useQueryClient>, buildId: number, projectId: number) {
  client.invalidateQueries({ queryKey: ['build', buildId] });
  client.invalidateQueries({ queryKey: ['build-audit', buildId] });
  client.invalidateQueries({ queryKey: ['builds', projectId] });
  for (const key of ['home', 'gains', 'lineage', 'surface', 'durability']) client.invalidateQueries({ queryKey: [key] });
}

/** Choose a build's curve of record of one kind (PUT /api/builds/:id/record). */
export function useChooseRecord(projectId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ buildId, ...body }: RecordChoice & { buildId: number }) =>
      api<{ record: RecordChange; build: Build; curves: CurveSummary[] }>(`/builds/${buildId}/record`, { method: 'PUT', body }),
    onSuccess: (_answer, input) => invalidateBuildValues(client, input.buildId, projectId),
  });
}

export function useUpdateCurve(buildId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ curveId, ...body }: CurvePatch & { curveId: number }) =>
      api<{ curve: CurveSummary }>(`/curves/${curveId}`, { method: 'PATCH', body }),
    onSuccess: () => {
      client.invalidateQueries({ queryKey: ['build', buildId] });
      client.invalidateQueries({ queryKey: ['curve'] });
    },
  });
}

export interface ImportProfile {
  id: number;
  name: string;
  labId: number | null;
  kind: CurveKind;
  mapping: Record<string, { header: string; unit: string }>;
}
export const profilesQueryOptions = (projectId: number) => queryOptions({ queryKey: ['profiles', projectId], queryFn: () => api<{ profiles: ImportProfile[] }>(`/projects/${projectId}/import-profiles`).then((r) => r.profiles) });
export const useProfiles = (projectId: number) => useQuery(profilesQueryOptions(projectId));
