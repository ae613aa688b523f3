// Project settings: the project and its reference point, factors, hand-entered responses,
// members and invitations, and my own e-mail notices.
import { useParams } from 'react-router-dom';
import { useState } from 'react';
import type { FactorDef } from '@shared/api-types';
import type { ProjectRole } from '@shared/schemas/project';
import { MetalPricesForm } from '@/features/projects/components/metal-prices-form';
import { LogRulesForm } from '@/features/projects/components/log-rules-form';
import { useFactors, useMembers, useProject, useResponses, useSaveFactor, useCreateResponse, useUpdateProject, useInvite, useSetNotify } from '@/features/projects/api/projects';
import { useLabs } from '@/features/builds/api/builds';
import { ProjectForm } from '@/features/projects/components/project-form';
import { FactorForm, ResponseForm } from '@/features/projects/components/factor-form';
import { InviteForm } from '@/features/projects/components/invite-form';
import { canEditFactors, canEditSettings } from '@/features/projects/components/permissions';
import { PageHeader, Panel, Loading, ErrorNote } from '@/components/ui/panel';
import { Button } from '@/components/ui/button';
import { useMe } from '@/features/auth/api/get-me';
import { formatDate } from '@/lib/format';

const GOAL_WORD: Record<string, string> = { maximize: 'higher is better', minimize: 'lower is better', target: 'closest to a target' };

export default function Settings() {
  const projectId = Number(useParams().projectId);
  const project = useProject(projectId);
  const factors = useFactors(projectId);
  const responses = useResponses(projectId);
  const members = useMembers(projectId);
  const labs = useLabs();
  const { data: me } = useMe();
  const update = useUpdateProject(projectId);
  const saveFactor = useSaveFactor(projectId);
  const createResponse = useCreateResponse(projectId);
  const invite = useInvite(projectId);
  const notify = useSetNotify(projectId);
  const [editing, setEditing] = useState<FactorDef | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  if (project.isLoading || factors.isLoading || responses.isLoading || members.isLoading) return <Loading />;
  const error = project.error ?? factors.error ?? responses.error ?? members.error;
  if (error || !project.data) return <ErrorNote error={error} />;
  const p = project.data;
  const mine = members.data!.members.find((m) => m.userId === me?.user.id);

  return (
    <div className="max-w-5xl space-y-5">
      <PageHeader eyebrow={p.name} title="Project settings" />
      <Panel title="Project and reference point">
        {!canEditSettings(p.myRole) && <p className="mb-3 text-xs text-ink-500">Only the project’s PI changes these.</p>}
        <ProjectForm
          key={p.metricsVersion}
          initial={{ name: p.name, description: p.description, codePrefix: p.codePrefix, settings: p.settings }}
          disabled={!canEditSettings(p.myRole)}
          pending={update.isPending}
          error={update.error}
          submitLabel="Save project"
          onSubmit={(v) => update.mutate(v, { onSuccess: (r) => setMessage(r.recomputedCurves ? `Saved. ${r.recomputedCurves} curves were re-measured at the new reference point (metrics version ${r.metricsVersion}).` : 'Saved.') })}
        />
        {message && <p role="status" className="mt-2 text-sm text-moss-700">{message}</p>}
      </Panel>

      <Panel title="Precious-metal prices">
        <p className="mb-3 text-xs text-ink-500">Entered by hand and never looked up: the cost per kW beside every build uses these, with their date. {canEditSettings(p.myRole) ? 'All in one currency; each metal once.' : 'Only the project’s PI changes these.'}</p>
        <MetalPricesForm key={JSON.stringify(p.settings.metalPrices ?? [])} projectId={projectId} prices={p.settings.metalPrices ?? []} disabled={!canEditSettings(p.myRole)} />
      </Panel>

      <Panel title="Rules for long logs">
        <p className="mb-3 text-xs text-ink-500">When an accelerated test counts as failing, and how long an open-circuit hold settles. A single log can override these on its build page; the rule used is stored with each result. {canEditSettings(p.myRole) ? '' : 'Only the project’s PI changes these.'}</p>
        <LogRulesForm key={JSON.stringify([p.settings.onsetRule, p.settings.holdRule])} project={p} update={update} disabled={!canEditSettings(p.myRole)} />
      </Panel>

      <Panel title="Factors">
        <div className="mb-4 overflow-x-auto">
        <table className="w-full text-sm">
          <thead className="text-left text-xs text-ink-500"><tr><th className="py-1">Label</th><th>Kind</th><th>Range or levels</th><th>API key</th><th><span className="sr-only">Actions</span></th></tr></thead>
          <tbody className="divide-y divide-line">
            {factors.data!.map((f) => (
              <tr key={f.id}>
                <td className="py-1.5">{f.label}</td><td>{f.kind}</td>
                <td className="num">{f.kind === 'continuous' ? `${f.low} – ${f.high} ${f.unit}` : (f.levels ?? []).join(' · ')}</td>
                <td><code className="num text-xs text-ink-700">{f.key}</code></td>
                <td className="text-right">{canEditFactors(p.myRole) && <Button variant="ghost" onClick={() => setEditing(f)} aria-label={`Edit ${f.label}`}>Edit</Button>}</td>
              </tr>
            ))}
          </tbody>
        </table>
        </div>
        {canEditFactors(p.myRole) && (
          editing ? (
            <FactorForm key={editing.id} initial={{ ...editing, low: editing.low, high: editing.high, levels: editing.levels }} pending={saveFactor.isPending} error={saveFactor.error} onCancel={() => setEditing(null)} onSubmit={(v) => saveFactor.mutate({ ...v, id: editing.id }, { onSuccess: () => setEditing(null) })} />
          ) : (
            <FactorForm key={`new-${factors.data!.length}`} pending={saveFactor.isPending} error={saveFactor.error} onSubmit={(v) => saveFactor.mutate(v)} />
          )
        )}
      </Panel>

      <Panel title="Hand-entered responses">
        <p className="mb-3 text-xs text-ink-500">Numbers measured outside the curves (cost, thickness, …). Curve metrics such as V at j_ref are always available and need no definition. The API key is the name scripts use.</p>
        <div className="mb-4 overflow-x-auto">
        <table className="w-full text-sm">
          <thead className="text-left text-xs text-ink-500"><tr><th className="py-1">Label</th><th>Unit</th><th>Goal</th><th>API key</th></tr></thead>
          <tbody className="divide-y divide-line">{responses.data!.map((r) => <tr key={r.id}><td className="py-1.5">{r.label}</td><td>{r.unit}</td><td>{GOAL_WORD[r.goal] ?? r.goal}</td><td><code className="num text-xs text-ink-700">{r.key}</code></td></tr>)}</tbody>
        </table>
        </div>
        {canEditFactors(p.myRole) && <ResponseForm pending={createResponse.isPending} error={createResponse.error} onSubmit={(v) => createResponse.mutate(v)} />}
      </Panel>

      <Panel title="People">
        <div className="overflow-x-auto">
        <table className="w-full text-sm">
          <thead className="text-left text-xs text-ink-500"><tr><th className="py-1">Name</th><th>E-mail</th><th>Lab</th><th>Role</th></tr></thead>
          <tbody className="divide-y divide-line">
            {members.data!.members.map((m) => <tr key={m.userId}><td className="py-1.5">{m.name}</td><td className="text-ink-700">{m.email}</td><td>{m.labName ?? '—'}</td><td>{m.role}</td></tr>)}
            {members.data!.pendingInvitations.map((i) => <tr key={`i${i.id}`} className="text-ink-500"><td className="py-1.5 italic">invited</td><td>{i.email}</td><td /><td>{i.role} · until {formatDate(i.expiresAt)}</td></tr>)}
          </tbody>
        </table>
        </div>
        {canEditSettings(p.myRole) && (
          <InviteForm
            labs={labs.data ?? []}
            pending={invite.isPending}
            error={invite.error}
            onSubmit={(body, done) => invite.mutate(body, { onSuccess: (r) => { done(); setMessage(r.member ? `${r.member.name} already has an account: added to the project as ${r.member.role}, with a notice e-mail.` : 'Invitation sent: it is in the outbox.'); } })}
          />
        )}
      </Panel>

      {mine && (
        <Panel title="My notices">
          <fieldset className="space-y-2 text-sm">
            <legend className="sr-only">E-mail notices</legend>
            <label className="flex items-center gap-2">
              <input type="radio" name="notice" checked={mine.notify && !mine.digest} onChange={() => notify.mutate({ notify: true, digest: false })} /> E-mail me each time a partner lab uploads curves, a build is ready for review, or my build gets a verdict
            </label>
            <label className="flex items-center gap-2">
              <input type="radio" name="notice" checked={mine.notify && mine.digest} onChange={() => notify.mutate({ notify: true, digest: true })} /> Collect them into one daily digest
            </label>
            <label className="flex items-center gap-2">
              <input type="radio" name="notice" checked={!mine.notify} onChange={() => notify.mutate({ notify: false })} /> No e-mail for this project
            </label>
          </fieldset>
        </Panel>
      )}
    </div>
  );
}
