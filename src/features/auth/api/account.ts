// My sessions and personal API tokens.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ApiTokenCreate, TokenScope } from '@shared/schemas/auth';

export type { TokenScope };

export interface SessionRow { id: number; createdAt: string; expiresAt: string; userAgent: string | null; revokedAt: string | null; current: boolean }
export interface TokenRow { id: number; name: string; scope: TokenScope; createdAt: string; lastUsedAt: string | null; revokedAt: string | null }

export const sessionsQueryOptions = () => queryOptions({ queryKey: ['account', 'sessions'], queryFn: () => api<{ sessions: SessionRow[] }>('/auth/sessions').then((r) => r.sessions) });
export const tokensQueryOptions = () => queryOptions({ queryKey: ['account', 'tokens'], queryFn: () => api<{ tokens: TokenRow[] }>('/auth/tokens').then((r) => r.tokens) });
export const useSessions = () => useQuery(sessionsQueryOptions());
export const useTokens = () => useQuery(tokensQueryOptions());

export function useRevokeSession() {
  const client = useQueryClient();
  return useMutation({ mutationFn: (id: number) => api(`/auth/sessions/${id}/revoke`, { method: 'POST' }), onSuccess: () => client.invalidateQueries({ queryKey: ['account', 'sessions'] }) });
}
export function useCreateToken() {
  const client = useQueryClient();
  return useMutation({ mutationFn: (input: ApiTokenCreate) => api<{ token: string; id: number; name: string; scope: TokenScope }>('/auth/tokens', { method: 'POST', body: input }), onSuccess: () => client.invalidateQueries({ queryKey: ['account', 'tokens'] }) });
}
export function useRevokeToken() {
  const client = useQueryClient();
  return useMutation({ mutationFn: (id: number) => api<{ ok: true; revoked: number }>(`/auth/tokens/${id}/revoke`, { method: 'POST' }), onSuccess: () => client.invalidateQueries({ queryKey: ['account', 'tokens'] }) });
}
