// Turns a generated design into planned builds in one step: optional parent, the values every
// build holds for the factors the design does not vary, a lab per block, loading and area, and
// a note that ends up in each change note. The design is stored and each build points to it.
import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import type { Build, FactorDef, Lab } from '@shared/api-types';
import type { Design } from '@shared/doe/designs/types';
import { Field, Input, Select } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { ErrorNote } from '@/components/ui/panel';
import { usePlanRuns } from '../api/designs';

function defaultHeld(f: FactorDef, parent: Build | undefined): string {
  const fromParent = parent?.factors[f.key];
  if (fromParent !== undefined && fromParent !== '') return String(fromParent);
  if (f.kind === 'categorical') return (f.levels ?? [''])[0]!;
  return String(Number((((f.low ?? 0) + (f.high ?? 0)) / 2).toPrecision(4)));
}

export function PlanRunsPanel({ projectId, design, factors, builds, labs, homeLabId }: { projectId: number; design: Design; factors: FactorDef[]; builds: Build[]; labs: Lab[]; homeLabId: number | null }) {
  const plan = usePlanRuns(projectId);
  const [parentId, setParentId] = useState('');
  const [labsByBlock, setLabsByBlock] = useState<Record<string, string>>({});
  const [loading, setLoading] = useState('');
  const [area, setArea] = useState('');
  const [note, setNote] = useState('');
  const [heldText, setHeldText] = useState<Record<string, string>>({});
  const [done, setDone] = useState<Build[] | null>(null);
  const blocks = Array.from({ length: design.info.blocks }, (_, i) => i + 1);
  const parents = builds.filter((b) => b.status !== 'planned' && b.status !== 'discarded');
  const parent = parents.find((b) => String(b.id) === parentId);
  const outside = useMemo(() => factors.filter((f) => !design.factorKeys.includes(f.key)), [factors, design.factorKeys]);
  const heldValue = (f: FactorDef) => heldText[f.key] ?? defaultHeld(f, parent);

  const submit = () => {
    const byBlock: Record<string, number> = {};
    for (const block of blocks) {
      const chosen = labsByBlock[String(block)] ?? (homeLabId != null ? String(homeLabId) : '');
      if (chosen) byBlock[String(block)] = Number(chosen);
    }
    const held: Record<string, number | string> = {};
    for (const f of outside) {
      const text = heldValue(f).trim();
      held[f.key] = f.kind === 'continuous' ? Number(text.replace(',', '.')) : text;
    }
    const info = design.info;
    plan.mutate(
      {
        runs: design.runs,
        parentId: parentId ? Number(parentId) : null,
        labsByBlock: byBlock,
        loadingMgCm2: loading ? Number(loading) : null,
        areaCm2: area ? Number(area) : null,
        note: note.trim() || undefined,
        designKind: design.kind,
        seed: info.seed,
        held,
        designSettings: { variant: info.variant ?? null, alpha: info.alpha ?? null, centerPoints: info.centerPoints, replicates: info.replicates, blocks: info.blocks, generators: info.generators ?? null, runsByType: info.runsByType },
      },
      { onSuccess: (created) => setDone(created) },
    );
  };

  if (done) {
    return (
      <div role="status" className="flex flex-col gap-2 text-sm">
        <p><strong>{done.length} planned builds</strong> added: <span className="num">{done[0]?.code}</span> to <span className="num">{done[done.length - 1]?.code}</span>, in build order, each linked to this design.</p>
        <p><Link to={`/projects/${projectId}`} className="text-copper-700 hover:underline">Open the builds table</Link> to record each one as it is made.</p>
        <div><Button onClick={() => { setDone(null); plan.reset(); }}>Plan again</Button></div>
      </div>
    );
  }
  return (
    <div className="flex flex-col gap-3">
      <div className="grid grid-cols-2 gap-3">
        <Field label="Parent build (optional)" hint="the build these recipes start from">
          {(p) => (
            <Select {...p} value={parentId} onChange={(e) => setParentId(e.target.value)}>
              <option value="">none</option>
              {parents.map((b) => <option key={b.id} value={b.id}>{b.code}{b.changeNote ? ` — ${b.changeNote.slice(0, 40)}` : ''}</option>)}
            </Select>
          )}
        </Field>
        <Field label="Note for every build" hint="written into each change note">
          {(p) => <Input {...p} value={note} maxLength={300} onChange={(e) => setNote(e.target.value)} placeholder="binder × activation screen" />}
        </Field>
        <Field label="Catalyst loading (mg/cm²)">{(p) => <Input {...p} inputMode="decimal" value={loading} onChange={(e) => setLoading(e.target.value)} placeholder="3.0" />}</Field>
        <Field label="Active area (cm²)">{(p) => <Input {...p} inputMode="decimal" value={area} onChange={(e) => setArea(e.target.value)} placeholder="25" />}</Field>
      </div>
      {outside.length > 0 && (
        <fieldset className="flex flex-col gap-2 rounded-md border border-line p-3">
          <legend className="px-1 text-xs font-medium text-ink-700">Held in every build (not varied by the design)</legend>
          <div className="grid grid-cols-2 gap-3">
            {outside.map((f) =>
              f.kind === 'continuous' ? (
                <Field key={f.key} label={`${f.label}${f.unit ? ` (${f.unit})` : ''}`} hint={`range ${f.low}–${f.high}${f.unit ? ` ${f.unit}` : ''}${parent ? `; ${parent.code} has ${parent.factors[f.key] ?? '—'}` : ''}`}>
                  {(p) => <Input {...p} inputMode="decimal" value={heldValue(f)} onChange={(e) => setHeldText((s) => ({ ...s, [f.key]: e.target.value }))} />}
                </Field>
              ) : (
                <Field key={f.key} label={f.label}>
                  {(p) => <Select {...p} value={heldValue(f)} onChange={(e) => setHeldText((s) => ({ ...s, [f.key]: e.target.value }))}>{(f.levels ?? []).map((l) => <option key={l} value={l}>{l}</option>)}</Select>}
                </Field>
              ),
            )}
          </div>
        </fieldset>
      )}
      <div className="grid grid-cols-2 gap-3">
        {blocks.map((block) => (
          <Field key={block} label={`Lab for block ${block}`}>
            {(p) => (
              <Select {...p} value={labsByBlock[String(block)] ?? (homeLabId != null ? String(homeLabId) : '')} onChange={(e) => setLabsByBlock((s) => ({ ...s, [String(block)]: e.target.value }))}>
                <option value="">not set</option>
                {labs.map((l) => <option key={l.id} value={l.id}>{l.name}</option>)}
              </Select>
            )}
          </Field>
        ))}
      </div>
      <ErrorNote error={plan.error} />
      <div>
        <Button variant="primary" onClick={submit} disabled={plan.isPending}>{plan.isPending ? 'Planning…' : `Plan ${design.runs.length} builds`}</Button>
      </div>
    </div>
  );
}
