// Who is signed in (null when nobody); keeps the CSRF token for later writes.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, ApiError, setCsrfToken } from '@/lib/api-client';
import type { Me } from '@shared/api-types';

export async function getMe(): Promise<Me | null> {
  try {
    const me = await api<Me>('/auth/me');
    setCsrfToken(me.csrfToken);
    return me;
  } catch (error) {
    if (error instanceof ApiError && error.status === 401) return null;
    throw error;
  }
}

export const meQueryOptions = () => queryOptions({ queryKey: ['me'], queryFn: getMe, staleTime: 5 * 60_000 });

export function useMe() {
  return useQuery(meQueryOptions());
}
