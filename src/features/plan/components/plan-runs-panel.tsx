// Turns a generated design into planned builds in one step: optional parent, the values every
// build holds for the factors the design does not vary, a lab per block, loading and area, and
// a note that ends up in each change note. The design is stored and each build points to it.
// The values are checked by the plan request schema (plan-runs-values.ts), errors inline.
import { useEffect, useState } from 'react';
import { Link } from 'react-router-dom';
import { useForm } from 'react-hook-form';
import type { Build, FactorDef, Lab } from '@shared/api-types';
import type { Design } from '@shared/doe/designs/types';
import { Field, Input, Select } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { ErrorNote } from '@/components/ui/panel';
import { usePlanRuns, type PlanRunsBody } from '../api/designs';
import { defaultHeld, heldFactors, initialPlanRunsValues, planRunsResolver, type PlanRunsFormValues } from './plan-runs-values';

function PlannedNote({ projectId, done, onAgain }: { projectId: number; done: Build[]; onAgain: () => void }) {
  return (
    <div role="status" className="flex flex-col gap-2 text-sm">
      <p><strong>{done.length} planned builds</strong> added: <span className="num">{done[0]?.code}</span> to <span className="num">{done[done.length - 1]?.code}</span>, in build order, each linked to this design.</p>
      <p><Link to={`/projects/${projectId}`} className="text-copper-700 hover:underline">Open the builds table</Link> to record each one as it is made.</p>
      <div><Button onClick={onAgain}>Plan again</Button></div>
    </div>
  );
}

export function PlanRunsPanel({ projectId, design, factors, builds, labs, homeLabId }: { projectId: number; design: Design; factors: FactorDef[]; builds: Build[]; labs: Lab[]; homeLabId: number | null }) {
  const plan = usePlanRuns(projectId);
  const [done, setDone] = useState<Build[] | null>(null);
  const [defaults] = useState(() => initialPlanRunsValues(design, factors, homeLabId));
  const { register, handleSubmit, watch, setValue, getFieldState, formState } = useForm<PlanRunsFormValues>({ defaultValues: defaults, resolver: planRunsResolver(design, factors) });
  const e = formState.errors;
  const blocks = Object.keys(defaults.labsByBlock);
  const parents = builds.filter((b) => b.status !== 'planned' && b.status !== 'discarded');
  const parentId = watch('parentId');
  const parent = parents.find((b) => String(b.id) === parentId);
  const outside = heldFactors(design, factors);

  // A chosen parent supplies the held values not typed by hand.
  useEffect(() => {
    for (const f of outside) if (!getFieldState(`held.${f.key}`).isDirty) setValue(`held.${f.key}`, defaultHeld(f, parent));
  }, [parent]);

  if (done) return <PlannedNote projectId={projectId} done={done} onAgain={() => { setDone(null); plan.reset(); }} />;
  return (
    <form noValidate aria-label="Turn into planned builds" className="flex flex-col gap-3" onSubmit={handleSubmit((body) => plan.mutate(body as unknown as PlanRunsBody, { onSuccess: (created) => setDone(created) }))}>
      <div className="grid grid-cols-2 gap-3">
        <Field label="Parent build (optional)" hint="the build these recipes start from" error={e.parentId?.message}>
          {(p) => (
            <Select {...p} {...register('parentId')}>
              <option value="">none</option>
              {parents.map((b) => <option key={b.id} value={b.id}>{b.code}{b.changeNote ? ` — ${b.changeNote.slice(0, 40)}` : ''}</option>)}
            </Select>
          )}
        </Field>
        <Field label="Note for every build" hint="written into each change note" error={e.note?.message}>
          {(p) => <Input {...p} maxLength={300} {...register('note')} placeholder="binder × activation screen" />}
        </Field>
        <Field label="Catalyst loading (mg/cm²)" error={e.loading?.message}>{(p) => <Input {...p} inputMode="decimal" {...register('loading')} placeholder="3.0" />}</Field>
        <Field label="Active area (cm²)" error={e.area?.message}>{(p) => <Input {...p} inputMode="decimal" {...register('area')} placeholder="25" />}</Field>
      </div>
      {outside.length > 0 && (
        <fieldset className="flex flex-col gap-2 rounded-md border border-line p-3">
          <legend className="px-1 text-xs font-medium text-ink-700">Held in every build (not varied by the design)</legend>
          <div className="grid grid-cols-2 gap-3">
            {outside.map((f) =>
              f.kind === 'continuous' ? (
                <Field key={f.key} label={`${f.label}${f.unit ? ` (${f.unit})` : ''}`} hint={`range ${f.low}–${f.high}${f.unit ? ` ${f.unit}` : ''}${parent ? `; ${parent.code} has ${parent.factors[f.key] ?? '—'}` : ''}`} error={e.held?.[f.key]?.message}>
                  {(p) => <Input {...p} inputMode="decimal" {...register(`held.${f.key}`)} />}
                </Field>
              ) : (
                <Field key={f.key} label={f.label} error={e.held?.[f.key]?.message}>
                  {(p) => <Select {...p} {...register(`held.${f.key}`)}>{(f.levels ?? []).map((l) => <option key={l} value={l}>{l}</option>)}</Select>}
                </Field>
              ),
            )}
          </div>
        </fieldset>
      )}
      <div className="grid grid-cols-2 gap-3">
        {blocks.map((block) => (
          <Field key={block} label={`Lab for block ${block}`} error={e.labsByBlock?.[block]?.message}>
            {(p) => (
              <Select {...p} {...register(`labsByBlock.${block}`)}>
                <option value="">not set</option>
                {labs.map((l) => <option key={l.id} value={l.id}>{l.name}</option>)}
              </Select>
            )}
          </Field>
        ))}
      </div>
      {e.root?.message && <p role="alert" className="text-xs text-rust-700">{e.root.message}</p>}
      <ErrorNote error={plan.error} />
      <div>
        <Button type="submit" variant="primary" disabled={plan.isPending}>{plan.isPending ? 'Planning…' : `Plan ${design.runs.length} builds`}</Button>
      </div>
    </form>
  );
}
