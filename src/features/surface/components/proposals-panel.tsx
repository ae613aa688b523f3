// Next builds from the surface, in two kinds kept apart: recipes inside the builds' support
// (the model is vouched for there) and exploratory steps outside it, each with its prediction
// interval held inside physical limits. "Plan this build" on a flagged proposal asks why first;
// the server checks the recipe again and stores the reason on the planned build.
import { useId, useState } from 'react';
import { Link } from 'react-router-dom';
import type { Build, FactorDef } from '@shared/api-types';
import type { ProposalStrategy } from '@shared/doe/proposals/index';
import { Button } from '@/components/ui/button';
import { Field, Input, Select, Textarea } from '@/components/ui/field';
import { ErrorNote, SafetyNote } from '@/components/ui/panel';
import { ApiError } from '@/lib/api-client';
import { useProposals, usePlanProposal, type ProposalItem, type SurfaceRequest, type SurfaceResult } from '../api/surface';
import { displayOf, show, showSetting, showSpread } from './display';
import { roundSignificant, SETTING_DIGITS } from '@shared/units/significant';

/** A proposal's setting rounded for a lab sheet by the stored-setting rule, kept inside the factor's bounds. */
function roundInside(value: number, f: FactorDef): number {
  const rounded = roundSignificant(value, SETTING_DIGITS);
  return Math.min(f.high ?? Infinity, Math.max(f.low ?? -Infinity, rounded));
}

const MIN_REASON = 10;

function PlanThis({ projectId, request, proposal, factors, onPlanned }: { projectId: number; request: SurfaceRequest; proposal: ProposalItem; factors: FactorDef[]; onPlanned: (b: Build) => void }) {
  const plan = usePlanProposal(projectId);
  const [asking, setAsking] = useState(false);
  const [reason, setReason] = useState('');
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
      <form className="flex w-72 flex-col gap-2" aria-label="Reason for planning a flagged proposal" onSubmit={(e) => { e.preventDefault(); if (!tooShort) send(reason.trim()); }}>
        <Field label="Why plan it anyway?" hint={`At least ${MIN_REASON} characters; kept on the planned build and shown in its review.`} id={reasonId}>
          {(p) => <Textarea {...p} rows={3} value={reason} onChange={(e) => setReason(e.target.value)} maxLength={1000} required />}
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

export function ProposalsPanel({ projectId, request, result, allFactors, canPlan }: { projectId: number; request: SurfaceRequest; result: SurfaceResult; allFactors: FactorDef[]; canPlan: boolean }) {
  const proposals = useProposals(projectId);
  const d = displayOf(result.response);
  const [count, setCount] = useState('3');
  const [exploratory, setExploratory] = useState('1');
  const [strategy, setStrategy] = useState<ProposalStrategy>('balance');
  const [goal, setGoal] = useState<string>(result.response.goal === 'target' ? 'target' : result.response.goal);
  const [target, setTarget] = useState(result.response.target != null ? String(result.response.target * d.scale) : '');
  const [bounds, setBounds] = useState<Record<string, { min: string; max: string }>>({});
  const [fixed, setFixed] = useState<Record<string, string>>({});
  const [planned, setPlanned] = useState<Record<number, Build>>({});

  const submit = () => {
    const b: Record<string, { min?: number; max?: number }> = {};
    for (const [key, v] of Object.entries(bounds)) {
      const entry: { min?: number; max?: number } = {};
      if (v.min.trim() !== '') entry.min = Number(v.min);
      if (v.max.trim() !== '') entry.max = Number(v.max);
      if (entry.min !== undefined || entry.max !== undefined) b[key] = entry;
    }
    const f: Record<string, string> = {};
    for (const [key, v] of Object.entries(fixed)) if (v) f[key] = v;
    setPlanned({});
    proposals.mutate({
      ...request,
      count: Math.min(10, Math.max(1, Number(count) || 3)),
      exploratory: Number(exploratory) || 0,
      strategy,
      goal: goal === 'target' ? { target: Number(target) / d.scale } : (goal as 'maximize' | 'minimize'),
      constraints: { bounds: b, fixed: f },
      seed: 1,
    });
  };

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
      <div className="grid grid-cols-2 gap-3 md:grid-cols-3">
        <Field label="Inside the support">{(p) => <Input {...p} inputMode="numeric" value={count} onChange={(e) => setCount(e.target.value)} />}</Field>
        <Field label="Exploratory">
          {(p) => <Select {...p} value={exploratory} onChange={(e) => setExploratory(e.target.value)}><option value="0">none</option><option value="1">one</option><option value="2">two</option></Select>}
        </Field>
        <Field label="Choose by">
          {(p) => (
            <Select {...p} value={strategy} onChange={(e) => setStrategy(e.target.value as ProposalStrategy)}>
              <option value="exploit">best predicted</option>
              <option value="explore">most informative</option>
              <option value="balance">balance of the two</option>
            </Select>
          )}
        </Field>
        <Field label="Goal">
          {(p) => (
            <Select {...p} value={goal} onChange={(e) => setGoal(e.target.value)}>
              <option value="maximize">as high as possible</option>
              <option value="minimize">as low as possible</option>
              <option value="target">reach a target</option>
            </Select>
          )}
        </Field>
        {goal === 'target' && <Field label={`Target (${d.unit})`}>{(p) => <Input {...p} inputMode="decimal" value={target} onChange={(e) => setTarget(e.target.value)} />}</Field>}
      </div>
      <details>
        <summary className="cursor-pointer text-sm text-copper-700">Limits on the recipe (keep a factor below a value, or use one level)</summary>
        <div className="mt-2 grid grid-cols-1 gap-2 md:grid-cols-2">
          {allFactors.map((f) =>
            f.kind === 'continuous' ? (
              <div key={f.key} className="flex items-end gap-2">
                <span className="w-36 shrink-0 pb-2 text-sm">{f.label} <span className="text-xs text-ink-500">({f.unit})</span></span>
                <Input aria-label={`${f.label} at least (${f.unit})`} placeholder={`≥ ${f.low}`} inputMode="decimal" value={bounds[f.key]?.min ?? ''} onChange={(e) => setBounds((s) => ({ ...s, [f.key]: { min: e.target.value, max: s[f.key]?.max ?? '' } }))} />
                <Input aria-label={`${f.label} at most (${f.unit})`} placeholder={`≤ ${f.high}`} inputMode="decimal" value={bounds[f.key]?.max ?? ''} onChange={(e) => setBounds((s) => ({ ...s, [f.key]: { min: s[f.key]?.min ?? '', max: e.target.value } }))} />
              </div>
            ) : (
              <Field key={f.key} label={f.label}>
                {(p) => (
                  <Select {...p} value={fixed[f.key] ?? ''} onChange={(e) => setFixed((s) => ({ ...s, [f.key]: e.target.value }))}>
                    <option value="">any level</option>
                    {(f.levels ?? []).map((l) => <option key={l} value={l}>{l} only</option>)}
                  </Select>
                )}
              </Field>
            ),
          )}
        </div>
      </details>
      <div><Button variant="primary" onClick={submit} disabled={proposals.isPending}>{proposals.isPending ? 'Proposing…' : 'Propose next builds'}</Button></div>
      <ErrorNote error={proposals.error} />
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
