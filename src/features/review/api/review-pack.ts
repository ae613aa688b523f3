// The project's review pack (GET /api/projects/:id/review-pack) and the address of its PDF.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ReviewPack } from '@shared/api-types';

export type PackPeriod = { from?: string | null; to?: string | null };

function periodQuery(period: PackPeriod): string {
  const q = new URLSearchParams();
  if (period.from) q.set('from', period.from);
  if (period.to) q.set('to', period.to);
  const text = q.toString();
  return text ? `?${text}` : '';
}

export const reviewPackQueryOptions = (projectId: number, period: PackPeriod) =>
  queryOptions({ queryKey: ['review-pack', projectId, period.from ?? null, period.to ?? null], queryFn: () => api<ReviewPack>(`/projects/${projectId}/review-pack${periodQuery(period)}`) });
export const useReviewPack = (projectId: number, period: PackPeriod) => useQuery(reviewPackQueryOptions(projectId, period));

/** The PDF's address (a plain link: the browser downloads it with the session cookie). */
export const reviewPackPdfUrl = (projectId: number, period: PackPeriod) => `/api/projects/${projectId}/review-pack.pdf${periodQuery(period)}`;
