// Sign in and sign out; both reset every cached query so nothing leaks between people.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, setCsrfToken } from '@/lib/api-client';
import { meQueryOptions } from './get-me';
import type { z } from 'zod';
import type { loginSchema } from '@shared/schemas/auth';

export function useSignIn() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async (input: z.input<typeof loginSchema>) => {
      const result = await api<{ csrfToken: string }>('/auth/login', { method: 'POST', body: input });
      setCsrfToken(result.csrfToken);
      return result;
    },
    onSuccess: async () => {
      client.clear();
      await client.fetchQuery(meQueryOptions());
    },
  });
}

export function useSignOut() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: () => api('/auth/logout', { method: 'POST' }),
    onSettled: () => {
      setCsrfToken(null);
      client.clear();
      client.setQueryData(['me'], null);
    },
  });
}
