// The build form (create and edit): recipe factors checked against bounds and levels with
// inline errors, loading and area, lot, lab, dates, test conditions and hand-entered responses.
import { useForm, type Resolver } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import type { Build, FactorDef, ResponseDef, Lab } from '@shared/api-types';
import { buildCreateSchema, checkFactorValues, BUILD_STATUSES, type BuildCreate } from '@shared/schemas/build';
import { Field, Input, Select, Textarea } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { ErrorNote, Panel, SafetyNote } from '@/components/ui/panel';
import { ApiError } from '@/lib/api-client';
import { useEffect } from 'react';
import { isFlammableFuel } from '@shared/builds/flammable-fuel';

const num = (v: unknown) => (v === '' || v == null || (typeof v === 'number' && Number.isNaN(v)) ? undefined : Number(v));

/** Drop the empty inputs (undefined, '' or NaN) inside the nested records before validating. */
function dropEmpty(input: unknown): unknown {
  if (!input || typeof input !== 'object') return input;
  const v = { ...(input as Record<string, unknown>) };
  for (const key of ['factors', 'responses', 'testConditions']) {
    const rec = v[key] as Record<string, unknown> | undefined;
    if (rec && typeof rec === 'object') v[key] = Object.fromEntries(Object.entries(rec).filter(([, x]) => x !== undefined && x !== '' && x !== null && !(typeof x === 'number' && Number.isNaN(x))));
  }
  return v;
}

function formSchema(factors: FactorDef[]) {
  return z.preprocess(dropEmpty, buildCreateSchema).superRefine((value, ctx) => {
    for (const issue of checkFactorValues(value.factors ?? {}, factors, { requireAll: (value.status ?? 'built') !== 'planned' })) {
      ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
    }
  });
}

type FormValues = z.input<typeof buildCreateSchema>;

export function buildToForm(b: Build): FormValues {
  return {
    code: b.code,
    parentId: b.parentId,
    changeNote: b.changeNote,
    factors: b.factors,
    loadingMgCm2: b.loadingMgCm2,
    metalLoadingMgCm2: b.metalLoadingMgCm2,
    areaCm2: b.areaCm2,
    catalystLot: b.catalystLot,
    labId: b.labId,
    status: b.status,
    builtOn: b.builtOn,
    testedOn: b.testedOn,
    replicateOf: b.replicateOf,
    testConditions: b.testConditions,
    responses: b.responses,
    notes: b.notes,
  };
}

const mentionsFuel = isFlammableFuel;

export function BuildForm({ factors, responses, labs, builds, initial, lockLabId, submitLabel, onSubmit, pending, serverError }: {
  factors: FactorDef[];
  responses: ResponseDef[];
  labs: Lab[];
  builds: Build[];
  initial?: FormValues;
  lockLabId?: number | null;
  submitLabel: string;
  onSubmit: (values: BuildCreate) => void;
  pending: boolean;
  serverError: unknown;
}) {
  const { register, handleSubmit, formState, watch, setError, setValue } = useForm<FormValues>({
    resolver: zodResolver(formSchema(factors) as never) as unknown as Resolver<FormValues>,
    defaultValues: initial ?? { factors: {}, testConditions: { temperatureC: 180, anodeGas: 'H2', cathodeGas: 'air' }, status: 'built', areaCm2: 25 },
  });
  const errors = formState.errors as Record<string, unknown> & { factors?: Record<string, { message?: string }>; testConditions?: Record<string, { message?: string }>; responses?: Record<string, { message?: string }> };

  // Server-side field errors land on the matching inputs.
  useEffect(() => {
    if (serverError instanceof ApiError) {
      for (const [path, message] of Object.entries(serverError.fields)) setError(path as never, { type: 'server', message });
    }
  }, [serverError, setError]);

  const parentId = watch('parentId');
  useEffect(() => {
    if (initial || !parentId) return;
    const parent = builds.find((b) => b.id === Number(parentId));
    if (parent) {
      // Start from the parent's recipe: one change at a time is the usual campaign step.
      setValue('factors', { ...parent.factors });
      if (parent.loadingMgCm2 != null) setValue('loadingMgCm2', parent.loadingMgCm2);
      if (parent.areaCm2 != null) setValue('areaCm2', parent.areaCm2);
      if (parent.catalystLot) setValue('catalystLot', parent.catalystLot);
      setValue('testConditions', { ...parent.testConditions });
    }
  }, [parentId, builds, initial, setValue]);

  const conditions = watch('testConditions');
  const temperature = Number(conditions?.temperatureC ?? 0);
  const showSafety = mentionsFuel(conditions?.anodeGas) || temperature >= 120 || Number(conditions?.backPressureKPa ?? 0) > 0;

  return (
    <form
      noValidate
      className="space-y-5"
      onSubmit={handleSubmit((values) => onSubmit(values as BuildCreate))}
      aria-label="Build form"
    >
      <Panel title="Identity and lineage">
        <div className="grid gap-4 md:grid-cols-3">
          <Field label="Build code" hint="Leave empty for the next free code" error={(errors.code as { message?: string })?.message}>
            {(p) => <Input {...p} {...register('code', { setValueAs: (v) => (v === '' ? undefined : v) })} placeholder="auto" />}
          </Field>
          <Field label="Parent build" hint="The build this one changes" error={(errors.parentId as { message?: string })?.message}>
            {(p) => (
              <Select {...p} {...register('parentId', { setValueAs: (v) => (v === '' || v == null ? null : Number(v)) })}>
                <option value="">— none (a new baseline) —</option>
                {builds.map((b) => <option key={b.id} value={b.id}>{b.code}{b.changeNote ? ` — ${b.changeNote}` : ''}</option>)}
              </Select>
            )}
          </Field>
          <Field label="Replicate of" hint="Same recipe as another build" error={(errors.replicateOf as { message?: string })?.message}>
            {(p) => (
              <Select {...p} {...register('replicateOf', { setValueAs: (v) => (v === '' || v == null ? null : Number(v)) })}>
                <option value="">— not a replicate —</option>
                {builds.map((b) => <option key={b.id} value={b.id}>{b.code}</option>)}
              </Select>
            )}
          </Field>
          <div className="md:col-span-3">
            <Field label="Change note" hint="What changed from the parent, in a few words" error={(errors.changeNote as { message?: string })?.message}>
              {(p) => <Input {...p} {...register('changeNote')} placeholder="e.g. activation 2 h → 4 h" />}
            </Field>
          </div>
        </div>
      </Panel>

      <Panel title="Recipe">
        {factors.length === 0 ? (
          <p className="text-sm text-ink-500">This project has no factors yet; a PI or researcher adds them under Settings.</p>
        ) : (
          <div className="grid gap-4 md:grid-cols-3">
            {factors.map((f) => (
              <Field
                key={f.key}
                label={`${f.label}${f.unit ? ` (${f.unit})` : ''}`}
                hint={f.kind === 'continuous' ? `${f.low} – ${f.high} ${f.unit}` : `one of: ${(f.levels ?? []).join(', ')}`}
                error={errors.factors?.[f.key]?.message}
              >
                {(p) =>
                  f.kind === 'continuous' ? (
                    <Input {...p} type="number" step="any" inputMode="decimal" {...register(`factors.${f.key}` as const, { setValueAs: num })} />
                  ) : (
                    <Select {...p} {...register(`factors.${f.key}` as const, { setValueAs: (v) => (v === '' ? undefined : v) })}>
                      <option value="">— choose —</option>
                      {(f.levels ?? []).map((l) => <option key={l} value={l}>{l}</option>)}
                    </Select>
                  )
                }
              </Field>
            ))}
          </div>
        )}
      </Panel>

      <Panel title="Electrode and MEA">
        <div className="grid gap-4 md:grid-cols-4">
          <Field label="Catalyst loading (mg/cm²)" error={(errors.loadingMgCm2 as { message?: string })?.message}>
            {(p) => <Input {...p} type="number" step="any" {...register('loadingMgCm2', { setValueAs: num })} />}
          </Field>
          <Field label="Metal loading (mg/cm²)" hint="Needed for a metal loading basis" error={(errors.metalLoadingMgCm2 as { message?: string })?.message}>
            {(p) => <Input {...p} type="number" step="any" {...register('metalLoadingMgCm2', { setValueAs: num })} />}
          </Field>
          <Field label="Active area (cm²)" error={(errors.areaCm2 as { message?: string })?.message}>
            {(p) => <Input {...p} type="number" step="any" {...register('areaCm2', { setValueAs: num })} />}
          </Field>
          <Field label="Catalyst lot" error={(errors.catalystLot as { message?: string })?.message}>
            {(p) => <Input {...p} {...register('catalystLot')} />}
          </Field>
          <Field label="Lab" hint={lockLabId ? 'Partners record builds for their own lab' : undefined} error={(errors.labId as { message?: string })?.message}>
            {(p) => (
              <Select {...p} disabled={Boolean(lockLabId)} {...register('labId', { setValueAs: (v) => (v === '' || v == null ? null : Number(v)) })}>
                <option value="">— my lab —</option>
                {labs.map((l) => <option key={l.id} value={l.id}>{l.name}</option>)}
              </Select>
            )}
          </Field>
          <Field label="Status" error={(errors.status as { message?: string })?.message}>
            {(p) => (
              <Select {...p} {...register('status')}>
                {BUILD_STATUSES.filter((s) => s !== 'reviewed' || initial?.status === 'reviewed').map((s) => <option key={s} value={s}>{s}</option>)}
              </Select>
            )}
          </Field>
          <Field label="Built on" error={(errors.builtOn as { message?: string })?.message}>
            {(p) => <Input {...p} type="date" {...register('builtOn', { setValueAs: (v) => (v === '' ? null : v) })} />}
          </Field>
          <Field label="Tested on" error={(errors.testedOn as { message?: string })?.message}>
            {(p) => <Input {...p} type="date" {...register('testedOn', { setValueAs: (v) => (v === '' ? null : v) })} />}
          </Field>
        </div>
      </Panel>

      <Panel title="Test conditions">
        <div className="grid gap-4 md:grid-cols-3">
          <Field label="Cell temperature (°C)" error={errors.testConditions?.temperatureC?.message}>
            {(p) => <Input {...p} type="number" step="any" {...register('testConditions.temperatureC', { setValueAs: num })} />}
          </Field>
          <Field label="Anode gas or fuel" error={errors.testConditions?.anodeGas?.message}>
            {(p) => <Input {...p} {...register('testConditions.anodeGas')} placeholder="H2" />}
          </Field>
          <Field label="Cathode gas" error={errors.testConditions?.cathodeGas?.message}>
            {(p) => <Input {...p} {...register('testConditions.cathodeGas')} placeholder="air" />}
          </Field>
          <Field label="Back-pressure (kPa gauge)" error={errors.testConditions?.backPressureKPa?.message}>
            {(p) => <Input {...p} type="number" step="any" {...register('testConditions.backPressureKPa', { setValueAs: num })} />}
          </Field>
          <Field label="Anode stoichiometry" error={errors.testConditions?.anodeStoich?.message}>
            {(p) => <Input {...p} type="number" step="any" {...register('testConditions.anodeStoich', { setValueAs: num })} />}
          </Field>
          <Field label="Cathode stoichiometry" error={errors.testConditions?.cathodeStoich?.message}>
            {(p) => <Input {...p} type="number" step="any" {...register('testConditions.cathodeStoich', { setValueAs: num })} />}
          </Field>
          <Field label="H₂ crossover (mA/cm²)" hint="Optional. Measured on H₂/N₂ (e.g. a slow linear sweep). Added to the cell current for the Tafel slope, mass activity and iR-free j at V_ref." error={errors.testConditions?.h2CrossoverMAcm2?.message}>
            {(p) => <Input {...p} type="number" step="any" min={0} {...register('testConditions.h2CrossoverMAcm2', { setValueAs: num })} />}
          </Field>
        </div>
        {showSafety && (
          <div className="mt-4">
            <SafetyNote>
              Hydrogen and fuel vapours are flammable, hot phosphoric acid is corrosive and pressurised lines store energy. Run the test under your lab’s standard operating procedure and local codes; your safety officer decides.
            </SafetyNote>
          </div>
        )}
      </Panel>

      {responses.length > 0 && (
        <Panel title="Hand-entered responses">
          <div className="grid gap-4 md:grid-cols-3">
            {responses.map((r) => (
              <Field key={r.key} label={`${r.label}${r.unit ? ` (${r.unit})` : ''}`} hint={`goal: ${r.goal}`} error={errors.responses?.[r.key]?.message}>
                {(p) => <Input {...p} type="number" step="any" {...register(`responses.${r.key}` as const, { setValueAs: num })} />}
              </Field>
            ))}
          </div>
        </Panel>
      )}

      <Panel title="Notes">
        <Field label="Notes" error={(errors.notes as { message?: string })?.message}>
          {(p) => <Textarea {...p} rows={3} {...register('notes')} />}
        </Field>
      </Panel>

      <ErrorNote error={serverError} />
      <div className="flex justify-end gap-2">
        <Button type="submit" variant="primary" disabled={pending}>{pending ? 'Saving…' : submitLabel}</Button>
      </div>
    </form>
  );
}

/** Drop empty hand-entered responses so the server sees only numbers. */
export function cleanBuildInput(values: BuildCreate): BuildCreate {
  const responses = Object.fromEntries(Object.entries(values.responses ?? {}).filter(([, v]) => typeof v === 'number' && Number.isFinite(v)));
  const factors = Object.fromEntries(Object.entries(values.factors ?? {}).filter(([, v]) => v !== undefined && v !== '' && !(typeof v === 'number' && Number.isNaN(v))));
  const testConditions = Object.fromEntries(Object.entries(values.testConditions ?? {}).filter(([, v]) => v !== undefined && v !== '' && v !== null));
  return { ...values, responses, factors, testConditions };
}
