// My account: where I am signed in (revoke any session) and personal API tokens for scripts.
import { useState } from 'react';
import { useCreateToken, useRevokeSession, useRevokeToken, useSessions, useTokens, type TokenScope } from '@/features/auth/api/account';
import { PageHeader, Panel, Loading, ErrorNote } from '@/components/ui/panel';
import { Button } from '@/components/ui/button';
import { useConfirm } from '@/components/ui/confirm-dialog';
import { Field, Input, Select } from '@/components/ui/field';
import { formatDateTime } from '@/lib/format';

/** What each scope lets a script do, in the words the page shows. */
const SCOPES: Record<TokenScope, { label: string; does: string }> = {
  read: { label: 'Read only', does: 'read projects, builds, curves and files' },
  upload: { label: 'Read and upload curves', does: 'read, and upload curve files to builds' },
  full: { label: 'Everything I may do', does: 'every change your roles allow, except making tokens and signing out browsers' },
};

export default function Account() {
  const sessions = useSessions();
  const tokens = useTokens();
  const revokeSession = useRevokeSession();
  const createToken = useCreateToken();
  const revokeToken = useRevokeToken();
  const [name, setName] = useState('');
  const [scope, setScope] = useState<TokenScope | ''>('');
  const [fresh, setFresh] = useState<string | null>(null);
  const [confirm, confirmDialog] = useConfirm();
  if (sessions.isLoading || tokens.isLoading) return <Loading />;
  return (
    <div className="max-w-4xl space-y-5">
      {confirmDialog}
      <PageHeader eyebrow="Account" title="Sessions and API tokens" subtitle="Scripts at partner labs use a personal token: send it as “Authorization: Bearer <token>”. The API is described at /api/openapi.json." />
      <Panel title="Where I am signed in">
        <table className="w-full text-sm" aria-label="Sessions">
          <thead className="text-left text-xs text-ink-500"><tr><th className="py-1">Started</th><th>Browser</th><th>Expires</th><th /></tr></thead>
          <tbody className="divide-y divide-line">
            {sessions.data!.filter((s) => !s.revokedAt).map((s) => (
              <tr key={s.id}>
                <td className="num py-1.5">{formatDateTime(s.createdAt)}</td>
                <td className="max-w-xs truncate text-ink-700" title={s.userAgent ?? ''}>{s.current ? <b>this browser</b> : (s.userAgent ?? '—')}</td>
                <td className="num text-ink-500">{formatDateTime(s.expiresAt)}</td>
                <td className="text-right">{!s.current && <Button variant="ghost" onClick={async () => { if (await confirm({ title: 'Sign out of that browser?', message: 'Whoever uses it will have to sign in again.', confirmLabel: 'Sign out there' })) revokeSession.mutate(s.id); }}>Sign out there</Button>}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </Panel>
      <Panel title="Personal API tokens">
        <table className="mb-4 w-full text-sm" aria-label="API tokens">
          <thead className="text-left text-xs text-ink-500"><tr><th className="py-1">Name</th><th>Allowed to</th><th>Created</th><th>Last used</th><th /></tr></thead>
          <tbody className="divide-y divide-line">
            {tokens.data!.map((t) => (
              <tr key={t.id} className={t.revokedAt ? 'text-ink-500' : ''}>
                <td className="py-1.5">{t.name}</td><td className="text-ink-700" title={SCOPES[t.scope]?.does}>{SCOPES[t.scope]?.label ?? t.scope}</td><td className="num">{formatDateTime(t.createdAt)}</td><td className="num">{formatDateTime(t.lastUsedAt)}</td>
                <td className="text-right">{t.revokedAt ? 'revoked' : <Button variant="danger" aria-label={`Revoke ${t.name}`} onClick={async () => { if (await confirm({ title: `Revoke “${t.name}”?`, message: 'Scripts that use this token stop working at once. A revoked token cannot be restored; create a new one if you need it again.', confirmLabel: 'Revoke token' })) revokeToken.mutate(t.id); }}>Revoke</Button>}</td>
              </tr>
            ))}
          </tbody>
        </table>
        <form className="flex flex-wrap items-start gap-2" onSubmit={(e) => { e.preventDefault(); if (scope) createToken.mutate({ name, scope }, { onSuccess: (r) => { setFresh(r.token); setName(''); setScope(''); } }); }}>
          <div className="w-72"><Field label="New token name">{(p) => <Input {...p} required value={name} onChange={(e) => setName(e.target.value)} placeholder="station upload script" />}</Field></div>
          <div className="w-80">
            <Field label="The script may" hint={scope ? `It can ${SCOPES[scope].does}.` : 'Choose the least a script needs.'}>
              {(p) => (
                <Select {...p} required value={scope} onChange={(e) => setScope(e.target.value as TokenScope)}>
                  <option value="" disabled>Choose…</option>
                  {(Object.keys(SCOPES) as TokenScope[]).map((key) => <option key={key} value={key}>{SCOPES[key].label}</option>)}
                </Select>
              )}
            </Field>
          </div>
          <div className="pt-5">
            <Button type="submit" variant="primary" disabled={createToken.isPending || !scope}>Create token</Button>
          </div>
        </form>
        {fresh && (
          <div className="mt-3 rounded-md border border-moss-700/30 bg-moss-100 p-3 text-sm">
            <p className="font-medium text-moss-700">Copy it now — it is shown once:</p>
            <code className="num mt-1 block break-all text-ink-950">{fresh}</code>
          </div>
        )}
        <ErrorNote error={createToken.error ?? revokeToken.error ?? revokeSession.error} />
      </Panel>
    </div>
  );
}
