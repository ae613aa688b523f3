// A build's review thread, comments, verdicts and audit trail.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { AuditTrailEntry, ReviewEntry } from '@shared/api-types';
import type { VerdictBody } from '@shared/schemas/review';

/** one line of a build's audit trail */
export type AuditEntry = AuditTrailEntry;
export type { ReviewEntry };

export const reviewsQueryOptions = (buildId: number) =>
  queryOptions({ queryKey: ['reviews', buildId], queryFn: () => api<{ reviews: ReviewEntry[]; status: string }>(`/builds/${buildId}/reviews`) });
export const useReviews = (buildId: number) => useQuery(reviewsQueryOptions(buildId));

export const buildAuditQueryOptions = (buildId: number) =>
  queryOptions({ queryKey: ['build-audit', buildId], queryFn: () => api<{ entries: AuditEntry[] }>(`/builds/${buildId}/audit`).then((r) => r.entries) });
export const useBuildAudit = (buildId: number, enabled: boolean) => useQuery({ ...buildAuditQueryOptions(buildId), enabled });

function useInvalidate(buildId: number, projectId: number) {
  const client = useQueryClient();
  return () => {
    client.invalidateQueries({ queryKey: ['reviews', buildId] });
    client.invalidateQueries({ queryKey: ['build-audit', buildId] });
    client.invalidateQueries({ queryKey: ['build', buildId] });
    client.invalidateQueries({ queryKey: ['builds', projectId] });
    client.invalidateQueries({ queryKey: ['home'] });
  };
}

export function useAddComment(buildId: number, projectId: number) {
  const invalidate = useInvalidate(buildId, projectId);
  return useMutation({
    mutationFn: (body: string) => api<{ review: ReviewEntry }>(`/builds/${buildId}/reviews`, { method: 'POST', body: { body } }),
    onSuccess: invalidate,
  });
}

export function useGiveVerdict(buildId: number, projectId: number) {
  const invalidate = useInvalidate(buildId, projectId);
  return useMutation({
    mutationFn: (input: VerdictBody) => api<{ review: ReviewEntry; status: string; nextWaiting: { buildId: number; code: string; projectId: number } | null }>(`/builds/${buildId}/verdict`, { method: 'POST', body: input }),
    onSuccess: invalidate,
  });
}
