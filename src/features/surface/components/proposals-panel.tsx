// Next builds from the surface: the best predicted, the most informative, or a balance, inside
// the factor bounds and the user's constraints. Each comes with its prediction interval, the
// reason it was chosen, an extrapolation flag, and "Plan this build".
import { useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import type { Build, FactorDef } from '@shared/api-types';
import type { ProposalStrategy } from '@shared/doe/proposals/index';
import { Button } from '@/components/ui/button';
import { Field, Input, Select } from '@/components/ui/field';
import { ErrorNote, SafetyNote } from '@/components/ui/panel';
import { api } from '@/lib/api-client';
import { useProposals, type ProposalItem, type SurfaceRequest, type SurfaceResult } from '../api/surface';
import { displayOf, show } from './display';

/** A proposal's setting rounded for a lab sheet, kept inside the factor's bounds. */
function roundInside(value: number, f: FactorDef): number {
  const rounded = Number(value.toPrecision(4));
  return Math.min(f.high ?? Infinity, Math.max(f.low ?? -Infinity, rounded));
}

function PlanThis({ projectId, proposal, factors, onPlanned }: { projectId: number; proposal: ProposalItem; factors: FactorDef[]; onPlanned: (b: Build) => void }) {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<unknown>(null);
  const client = useQueryClient();
  const plan = async () => {
    setBusy(true);
    setError(null);
    try {
      const values: Record<string, number | string> = {};
      for (const f of factors) {
        const v = proposal.factors[f.key];
        if (v === undefined) continue;
        values[f.key] = typeof v === 'number' ? roundInside(v, f) : v;
      }
      const { build } = await api<{ build: Build }>(`/projects/${projectId}/builds`, {
        method: 'POST',
        body: { status: 'planned', factors: values, parentId: proposal.nearest?.buildId ?? null, changeNote: `proposal from the surface — ${proposal.reasonKind}`.slice(0, 500) },
      });
      client.invalidateQueries({ queryKey: ['builds', projectId] });
      onPlanned(build);
    } catch (e) {
      setError(e);
    } finally {
      setBusy(false);
    }
  };
  return (
    <div className="flex flex-col gap-1">
      <Button variant="primary" onClick={plan} disabled={busy}>{busy ? 'Planning…' : 'Plan this build'}</Button>
      <ErrorNote error={error} />
    </div>
  );
}

export function ProposalsPanel({ projectId, request, result, allFactors, canPlan }: { projectId: number; request: SurfaceRequest; result: SurfaceResult; allFactors: FactorDef[]; canPlan: boolean }) {
  const proposals = useProposals(projectId);
  const d = displayOf(result.response);
  const [count, setCount] = useState('3');
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
      count: Number(count) || 3,
      strategy,
      goal: goal === 'target' ? { target: Number(target) / d.scale } : (goal as 'maximize' | 'minimize'),
      constraints: { bounds: b, fixed: f },
      seed: 1,
    });
  };

  const items = proposals.data?.proposals ?? [];
  const anyCaution = items.some((p) => p.cautions.length > 0);
  return (
    <div className="flex flex-col gap-4">
      <div className="grid grid-cols-2 gap-3 md:grid-cols-4">
        <Field label="How many">{(p) => <Input {...p} inputMode="numeric" value={count} onChange={(e) => setCount(e.target.value)} />}</Field>
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
              <option value="maximize">maximise</option>
              <option value="minimize">minimise</option>
              <option value="target">reach a target</option>
            </Select>
          )}
        </Field>
        {goal === 'target' && <Field label={`Target (${d.unit})`}>{(p) => <Input {...p} inputMode="decimal" value={target} onChange={(e) => setTarget(e.target.value)} />}</Field>}
      </div>
      <details>
        <summary className="cursor-pointer text-sm text-copper-700">Constraints (e.g. keep a factor below a limit, fix a GDL)</summary>
        <div className="mt-2 grid grid-cols-1 gap-2 md:grid-cols-2">
          {allFactors.map((f) =>
            f.kind === 'continuous' ? (
              <div key={f.key} className="flex items-end gap-2">
                <span className="w-40 pb-2 text-sm">{f.label} <span className="text-xs text-ink-500">({f.unit})</span></span>
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
      {items.length > 0 && (
        <ol className="flex flex-col gap-3" aria-label="Proposals">
          {items.map((p, i) => (
            <li key={i} className="rounded-md border border-line p-3">
              <div className="flex flex-wrap items-start justify-between gap-3">
                <div className="min-w-0">
                  <div className="text-sm font-semibold">Proposal {i + 1}: {p.reasonKind}{p.extrapolation ? <span className="ml-2 rounded-full bg-amber-100 px-2 py-0.5 text-xs text-amber-700">▲ extrapolation</span> : <span className="ml-2 rounded-full bg-moss-100 px-2 py-0.5 text-xs text-moss-700">● inside the data</span>}</div>
                  <div className="mt-1 text-sm text-ink-700">
                    {allFactors.map((f) => (p.factors[f.key] === undefined ? null : (
                      <span key={f.key} className="mr-3 inline-block">{f.label} <span className="num text-ink-900">{typeof p.factors[f.key] === 'number' ? roundInside(p.factors[f.key] as number, f) : p.factors[f.key]}</span>{f.kind === 'continuous' && f.unit ? ` ${f.unit}` : ''}</span>
                    )))}
                  </div>
                  <div className="mt-1 text-sm">Predicted <span className="num font-semibold">{show(p.predicted, d)}</span>, 95 % prediction interval <span className="num">{show(p.low, d)} – {show(p.high, d)}</span></div>
                  <p className="mt-1 text-xs text-ink-500">{p.reason}</p>
                  {p.extrapolationReasons.length > 0 && <p className="mt-1 text-xs text-amber-700">{p.extrapolationReasons.join(' ')}</p>}
                  {p.cautions.length > 0 && <p className="mt-1 text-xs text-amber-700">Caution: {p.cautions.join('; ')}.</p>}
                  {p.nearest && <p className="mt-1 text-xs text-ink-500">Nearest tested build: {p.nearest.code} (distance {p.nearest.distance.toFixed(2)} in coded units) — used as the parent.</p>}
                </div>
                {canPlan && (planned[i] ? (
                  <p role="status" className="text-sm">Planned as <Link className="font-medium text-copper-700 hover:underline" to={`/projects/${projectId}/builds/${planned[i]!.id}`}>{planned[i]!.code}</Link></p>
                ) : (
                  <PlanThis projectId={projectId} proposal={p} factors={allFactors} onPlanned={(b) => setPlanned((s) => ({ ...s, [i]: b }))} />
                ))}
              </div>
            </li>
          ))}
        </ol>
      )}
    </div>
  );
}
