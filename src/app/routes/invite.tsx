// Accept an invitation: set name and password, then land in the project.
import { useParams, useNavigate } from 'react-router-dom';
import { useQuery, useMutation, useQueryClient } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { inviteAcceptSchema } from '@shared/schemas/auth';
import { api, setCsrfToken } from '@/lib/api-client';
import { Field, Input } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { ErrorNote, Loading } from '@/components/ui/panel';
import { Logo } from '@/components/layout/logo';

type Accept = z.input<typeof inviteAcceptSchema>;

export default function InvitePage() {
  const { token } = useParams();
  const navigate = useNavigate();
  const client = useQueryClient();
  const invitation = useQuery({ queryKey: ['invitation', token], queryFn: () => api<{ email: string; role: string; projectName: string; expiresAt: string }>(`/invitations/${token}`) });
  const accept = useMutation({
    mutationFn: (v: Accept) => api<{ projectId: number; csrfToken: string }>(`/invitations/${token}/accept`, { method: 'POST', body: v }),
    onSuccess: (r) => { setCsrfToken(r.csrfToken); client.clear(); navigate(`/projects/${r.projectId}`); },
  });
  const { register, handleSubmit, formState } = useForm<Accept>({ resolver: zodResolver(inviteAcceptSchema) });
  return (
    <div className="flex min-h-screen items-center justify-center bg-ink-900 p-6">
      <div className="w-full max-w-md rounded-lg bg-panel p-6">
        <div className="mb-4 rounded bg-ink-900 px-3 py-2"><Logo /></div>
        {invitation.isLoading ? <Loading /> : invitation.error ? <ErrorNote error={invitation.error} /> : (
          <form noValidate className="space-y-4" onSubmit={handleSubmit((v) => accept.mutate(v))}>
            <div>
              <h1 className="text-lg font-semibold text-ink-950">Join “{invitation.data!.projectName}”</h1>
              <p className="text-sm text-ink-500">as {invitation.data!.role}, with the address {invitation.data!.email}</p>
            </div>
            <Field label="Your name" error={formState.errors.name?.message}>{(p) => <Input {...p} autoComplete="name" {...register('name')} />}</Field>
            <Field label="Choose a password" hint="at least 10 characters" error={formState.errors.password?.message}>{(p) => <Input {...p} type="password" autoComplete="new-password" {...register('password')} />}</Field>
            <ErrorNote error={accept.error} />
            <Button type="submit" variant="primary" className="w-full" disabled={accept.isPending}>Join the project</Button>
          </form>
        )}
      </div>
    </div>
  );
}
