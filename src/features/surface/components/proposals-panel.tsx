// Next builds from the surface, in two kinds kept apart: recipes inside the builds' support
// (the model is vouched for there) and exploratory steps outside it, each with its prediction
// interval held inside physical limits. "Plan this build" on a flagged proposal asks why first;
// the server checks the recipe again and stores the reason on the planned build.
import { useId, useState } from 'react';
import { Link } from 'react-router-dom';
import { useForm, type UseFormRegister } from 'react-hook-form';
import type { Build, FactorDef } from '@shared/api-types';
import { Button } from '@/components/ui/button';
import { Field, Input, Select, Textarea } from '@/components/ui/field';
import { ErrorNote, SafetyNote } from '@/components/ui/panel';
import { ApiError } from '@/lib/api-client';
import { useProposals, usePlanProposal, type ProposalItem, type ProposalsRequest, type SurfaceRequest, type SurfaceResult } from '../api/surface';
import { displayOf, show, showSetting, showSpread } from './display';
import { roundSignificant, SETTING_DIGITS } from '@shared/units/significant';
import { initialProposalsValues, MIN_REASON, proposalsResolver, type ProposalsFormValues } from './proposals-values';

/** A proposal's setting rounded for a lab sheet by the stored-setting rule, kept inside the factor's bounds. */
function roundInside(value: number, f: FactorDef): number {
  const rounded = roundSignificant(value, SETTING_DIGITS);
  return Math.min(f.high ?? Infinity, Math.max(f.low ?? -Infinity, rounded));
}

function PlanThis({ projectId, request, proposal, factors, onPlanned }: { projectId: number; request: SurfaceRequest; proposal: ProposalItem; factors: FactorDef[]; onPlanned: (b: Build) => void }) {
  const plan = usePlanProposal(projectId);
  const [asking, setAsking] = useState(false);
  const reasonForm = useForm<{ reason: string }>({ defaultValues: { reason: '' } });
  const reason = reasonForm.watch('reason');
  const reasonId = useId();
  const recipe: Record<string, number | string> = {};
  for (const f of factors) {
    const v = proposal.factors[f.key];
    if (v !== undefined) recipe[f.key] = typeof v === 'number' ? roundInside(v, f) : v;
  }
  const send = (withReason?: string) =>
    plan.mutate(
      { ...request, recipe, reason: withReason, parentId: proposal.nearest?.buildId ?? null },
      {
        onSuccess: (r) => onPlanned(r.build),
        onError: (e) => {
          if (e instanceof ApiError && e.code === 'reason-required') setAsking(true);
        },
      },
    );
  if (asking || proposal.flagged) {
    if (!asking) {
      return <div className="flex flex-col gap-1"><Button variant="primary" onClick={() => setAsking(true)}>Plan this build…</Button></div>;
    }
    const tooShort = reason.trim().length < MIN_REASON;
    return (
      <form noValidate className="flex w-72 flex-col gap-2" aria-label="Reason for planning a flagged proposal" onSubmit={reasonForm.handleSubmit((v) => { if (!tooShort) send(v.reason.trim()); })}>
        <Field label="Why plan it anyway?" hint={`At least ${MIN_REASON} characters; kept on the planned build and shown in its review.`} id={reasonId} error={plan.error instanceof ApiError ? plan.error.fields.reason : undefined}>
          {(p) => <Textarea {...p} rows={3} maxLength={1000} required {...reasonForm.register('reason')} />}
        </Field>
        <div className="flex gap-2">
          <Button type="submit" variant="primary" disabled={tooShort || plan.isPending}>{plan.isPending ? 'Planning…' : 'Plan with this reason'}</Button>
          <Button onClick={() => { setAsking(false); plan.reset(); }}>Cancel</Button>
        </div>
        <ErrorNote error={plan.error} />
      </form>
    );
  }
  return (
    <div className="flex flex-col gap-1">
      <Button variant="primary" onClick={() => send()} disabled={plan.isPending}>{plan.isPending ? 'Planning…' : 'Plan this build'}</Button>
      <ErrorNote error={plan.error} />
    </div>
  );
}

function sentence(p: ProposalItem, result: SurfaceResult): string {
  const d = displayOf(result.response);
  const se = Math.sqrt(result.fit.basis.mse * p.support.leverage);
  if (p.kind === 'exploratory') {
    return `A step outside the builds' support, where the model is optimistic: a build could land anywhere from ${show(p.low, d)} to ${show(p.high, d)}. It tests the model rather than trusting it.`;
  }
  if (p.reasonKind === 'best predicted') return `The best predicted ${d.label} inside the builds' support${p.support.leverageRatio < 1 ? '' : ', at its edge'}.`;
  if (p.reasonKind === 'most informative') return `Where the model is least certain inside the builds' support (±${showSpread(se, d)} on the average): a build here sharpens it most.`;
  return `The most promising optimistic value inside the builds' support: predicted plus about two standard errors (±${showSpread(se, d)}).`;
}

function ProposalCard({ index, p, result, allFactors, projectId, request, canPlan, planned, onPlanned }: { index: number; p: ProposalItem; result: SurfaceResult; allFactors: FactorDef[]; projectId: number; request: SurfaceRequest; canPlan: boolean; planned?: Build; onPlanned: (b: Build) => void }) {
  const d = displayOf(result.response);
  return (
    <li className={`rounded-md border p-3 ${p.kind === 'exploratory' ? 'border-dashed border-amber-700/50 bg-amber-100/40' : 'border-line'}`}>
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div className="min-w-0 flex-1">
          <div className="text-sm font-semibold">
            {p.kind === 'exploratory' ? <>Exploratory {index}: <span className="text-amber-700">▲ outside the builds' support</span></> : <>Next build {index}: <span className="text-moss-700">● inside the builds' support</span></>}
          </div>
          <div className="mt-1 text-sm text-ink-700">
            {allFactors.map((f) => (p.factors[f.key] === undefined ? null : (
              <span key={f.key} className="mr-3 inline-block">{f.label} <span className="num text-ink-900">{showSetting(typeof p.factors[f.key] === 'number' ? roundInside(p.factors[f.key] as number, f) : p.factors[f.key], f.kind === 'continuous' ? f.unit : null)}</span></span>
            )))}
          </div>
          {p.limit.hitsLimit ? (
            <p className="mt-1 text-sm font-semibold text-rust-700">▲ Predicted {d.label}: not a number to trust. {p.limit.note}</p>
          ) : (
            <p className="mt-1 text-sm">Predicted {d.label} <span className="num font-semibold">{show(p.predicted, d)}</span>; one build would land between <span className="num">{show(p.low, d)}</span> and <span className="num">{show(p.high, d)}</span> (95 %).</p>
          )}
          <p className="mt-1 text-xs text-ink-500">{sentence(p, result)}{p.limit.intervalCut && p.limit.note ? ` ${p.limit.note}` : ''}</p>
          {p.flags.filter((f) => !f.startsWith('The model gives')).map((f) => <p key={f} className="mt-1 text-xs text-amber-700">{f}</p>)}
          {p.cautions.length > 0 && <p className="mt-1 text-xs text-amber-700">Caution: {p.cautions.join('; ')}.</p>}
          {p.nearest && <p className="mt-1 text-xs text-ink-500">Nearest tested build: {p.nearest.code} — planned as its child.</p>}
        </div>
        {canPlan && (planned ? (
          <p role="status" className="text-sm">Planned as <Link className="font-medium text-copper-700 hover:underline" to={`/projects/${projectId}/builds/${planned.id}`}>{planned.code}</Link></p>
        ) : (
          <PlanThis projectId={projectId} request={request} proposal={p} factors={allFactors} onPlanned={onPlanned} />
        ))}
      </div>
    </li>
  );
}

/** "At least" and "at most" for one continuous factor, each error under its row. */
function BoundsRow({ factor: f, register, minError, maxError }: { factor: FactorDef; register: UseFormRegister<ProposalsFormValues>; minError?: string; maxError?: string }) {
  const errorId = useId();
  const error = minError ?? maxError;
  return (
    <div className="flex flex-col gap-1">
      <div className="flex items-end gap-2">
        <span className="w-36 shrink-0 pb-2 text-sm">{f.label} <span className="text-xs text-ink-500">({f.unit})</span></span>
        <Input aria-label={`${f.label} at least (${f.unit})`} aria-invalid={Boolean(minError)} aria-describedby={minError ? errorId : undefined} placeholder={`≥ ${f.low}`} inputMode="decimal" {...register(`bounds.${f.key}.min`)} />
        <Input aria-label={`${f.label} at most (${f.unit})`} aria-invalid={Boolean(maxError)} aria-describedby={maxError ? errorId : undefined} placeholder={`≤ ${f.high}`} inputMode="decimal" {...register(`bounds.${f.key}.max`)} />
      </div>
      {error && <p id={errorId} role="alert" className="text-xs text-rust-700">{error}</p>}
    </div>
  );
}

export function ProposalsPanel({ projectId, request, result, allFactors, canPlan }: { projectId: number; request: SurfaceRequest; result: SurfaceResult; allFactors: FactorDef[]; canPlan: boolean }) {
  const proposals = useProposals(projectId);
  const d = displayOf(result.response);
  const [defaults] = useState(() => initialProposalsValues({ goal: result.response.goal, target: result.response.target ?? null, scale: d.scale }));
  const { register, handleSubmit, watch, formState } = useForm<ProposalsFormValues>({ defaultValues: defaults, resolver: proposalsResolver(request, d.scale, allFactors, d.unit) });
  const e = formState.errors;
  const goal = watch('goal');
  const [planned, setPlanned] = useState<Record<number, Build>>({});

  const submit = handleSubmit((body) => {
    setPlanned({});
    proposals.mutate(body as unknown as ProposalsRequest);
  });

  const items = proposals.data?.proposals ?? [];
  const inside = items.map((p, i) => ({ p, i })).filter(({ p }) => p.kind === 'supported');
  const outside = items.map((p, i) => ({ p, i })).filter(({ p }) => p.kind === 'exploratory');
  const anyCaution = items.some((p) => p.cautions.length > 0);
  // factors of the fit with no estimated term, and project factors left out of the fit
  const inTerms = new Set(result.model.terms.flatMap((t) => t.split('*').map((part) => part.replace(/\^\d+$/, ''))));
  const termless = result.factors.filter((f) => !inTerms.has(f.key));
  const heldOut = allFactors.filter((f) => !result.factors.some((g) => g.key === f.key));
  const card = ({ p, i }: { p: ProposalItem; i: number }, n: number) => (
    <ProposalCard key={i} index={n + 1} p={p} result={result} allFactors={allFactors} projectId={projectId} request={request} canPlan={canPlan} planned={planned[i]} onPlanned={(b) => setPlanned((s) => ({ ...s, [i]: b }))} />
  );
  return (
    <div className="flex flex-col gap-4">
    <form noValidate aria-label="Next builds" onSubmit={submit} className="flex flex-col gap-4">
      <div className="grid grid-cols-2 gap-3 md:grid-cols-3">
        <Field label="Inside the support" error={e.count?.message}>{(p) => <Input {...p} inputMode="numeric" {...register('count')} />}</Field>
        <Field label="Exploratory" error={e.exploratory?.message}>
          {(p) => <Select {...p} {...register('exploratory')}><option value="0">none</option><option value="1">one</option><option value="2">two</option></Select>}
        </Field>
        <Field label="Choose by" error={e.strategy?.message}>
          {(p) => (
            <Select {...p} {...register('strategy')}>
              <option value="exploit">best predicted</option>
              <option value="explore">most informative</option>
              <option value="balance">balance of the two</option>
            </Select>
          )}
        </Field>
        <Field label="Goal">
          {(p) => (
            <Select {...p} {...register('goal')}>
              <option value="maximize">as high as possible</option>
              <option value="minimize">as low as possible</option>
              <option value="target">reach a target</option>
            </Select>
          )}
        </Field>
        {goal === 'target' && <Field label={`Target (${d.unit})`} error={e.target?.message}>{(p) => <Input {...p} inputMode="decimal" {...register('target')} />}</Field>}
      </div>
      <details>
        <summary className="cursor-pointer text-sm text-copper-700">Limits on the recipe (keep a factor below a value, or use one level)</summary>
        <div className="mt-2 grid grid-cols-1 gap-2 md:grid-cols-2">
          {allFactors.map((f) =>
            f.kind === 'continuous' ? (
              <BoundsRow key={f.key} factor={f} register={register} minError={e.bounds?.[f.key]?.min?.message} maxError={e.bounds?.[f.key]?.max?.message} />
            ) : (
              <Field key={f.key} label={f.label} error={e.fixed?.[f.key]?.message}>
                {(p) => (
                  <Select {...p} {...register(`fixed.${f.key}`)}>
                    <option value="">any level</option>
                    {(f.levels ?? []).map((l) => <option key={l} value={l}>{l} only</option>)}
                  </Select>
                )}
              </Field>
            ),
          )}
        </div>
      </details>
      {e.root?.message && <p role="alert" className="text-xs text-rust-700">{e.root.message}</p>}
      <div><Button type="submit" variant="primary" disabled={proposals.isPending}>{proposals.isPending ? 'Proposing…' : 'Propose next builds'}</Button></div>
      <ErrorNote error={proposals.error} />
    </form>
      {anyCaution && (
        <SafetyNote>
          <strong>Before you make these:</strong> hydrogen and fuel vapours (methanol, dimethyl ether) burn easily; hot concentrated phosphoric acid is corrosive;
          PTFE-bonded electrodes heat-treated at high temperature can give off toxic fumes, so use a ventilated oven; pressurised gas lines need rated fittings.
          These proposals come from a model, not from a safety review — your lab's procedures, local codes and your safety officer decide.
        </SafetyNote>
      )}
      {items.length > 0 && termless.length > 0 && (
        <p className="text-sm text-ink-500">
          {termless.map((f) => f.label).join(', ')} {termless.length === 1 ? 'has' : 'have'} no term in the model yet: {termless.length === 1 ? 'its setting varies' : 'their settings vary'} across the proposals so the next fit can tell whether {termless.length === 1 ? 'it matters' : 'they matter'}.
          {heldOut.length > 0 && ` ${heldOut.map((f) => f.label).join(', ')} ${heldOut.length === 1 ? 'is' : 'are'} not in the fit and held where the best build so far had ${heldOut.length === 1 ? 'it' : 'them'}.`}
        </p>
      )}
      {inside.length > 0 && <ol className="flex flex-col gap-3" aria-label="Proposals inside the builds' support">{inside.map(card)}</ol>}
      {outside.length > 0 && (
        <div className="flex flex-col gap-2">
          <p className="text-sm text-ink-700">Exploratory: outside what the builds support, so the model's numbers there are guesses. Planning one asks you why.</p>
          <ol className="flex flex-col gap-3" aria-label="Exploratory proposals">{outside.map(card)}</ol>
        </div>
      )}
    </div>
  );
}
