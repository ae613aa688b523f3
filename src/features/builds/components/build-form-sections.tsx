// The build form's sections, one per part of a build record: lineage and change note, recipe
// factors, electrode and MEA (loading, area, lot, lab, status, dates), test conditions with
// the safety caution, and hand-entered responses. Each reads the form through its context.
import { isFlammableFuel } from '@shared/builds/flammable-fuel';
import { useFormContext, type FieldErrors } from 'react-hook-form';
import type { BuildBrief, FactorDef, ResponseDef, Lab, LotView } from '@shared/api-types';
import { formatNumber } from '@/lib/format';
import { BUILD_STATUSES } from '@shared/schemas/build';
import { Field, Input, Select, Textarea } from '@/components/ui/field';
import { Panel, SafetyNote } from '@/components/ui/panel';
import { asId, asNumber, blankAsNull, blankAsUndefined, type BuildFormValues } from './build-form-values';

/** The message of the error at a dotted path (`factors.pt_loading`), if any. */
function errorAt(errors: FieldErrors<BuildFormValues>, path: string): string | undefined {
  let node: unknown = errors;
  for (const part of path.split('.')) node = (node as Record<string, unknown> | undefined)?.[part];
  const message = (node as { message?: unknown } | undefined)?.message;
  return typeof message === 'string' ? message : undefined;
}

function useBuildForm() {
  const form = useFormContext<BuildFormValues>();
  return { register: form.register, error: (path: string) => errorAt(form.formState.errors, path), watch: form.watch };
}

const withUnit = (label: string, unit?: string | null) => `${label}${unit ? ` (${unit})` : ''}`;

/** Code, parent, replicate and what changed from the parent. */
export function LineageSection({ builds }: { builds: BuildBrief[] }) {
  const { register, error } = useBuildForm();
  return (
    <Panel title="Identity and lineage">
      <div className="grid gap-4 md:grid-cols-3">
        <Field label="Build code" hint="Leave empty for the next free code" error={error('code')}>
          {(p) => <Input {...p} {...register('code', { setValueAs: blankAsUndefined })} placeholder="auto" />}
        </Field>
        <Field label="Parent build" hint="The build this one changes" error={error('parentId')}>
          {(p) => (
            <Select {...p} {...register('parentId', { setValueAs: asId })}>
              <option value="">— none (a new baseline) —</option>
              {builds.map((b) => <option key={b.id} value={b.id}>{b.code}{b.changeNote ? ` — ${b.changeNote}` : ''}</option>)}
            </Select>
          )}
        </Field>
        <Field label="Replicate of" hint="Same recipe as another build" error={error('replicateOf')}>
          {(p) => (
            <Select {...p} {...register('replicateOf', { setValueAs: asId })}>
              <option value="">— not a replicate —</option>
              {builds.map((b) => <option key={b.id} value={b.id}>{b.code}</option>)}
            </Select>
          )}
        </Field>
        <div className="md:col-span-3">
          <Field label="Change note" hint="What changed from the parent, in a few words" error={error('changeNote')}>
            {(p) => <Input {...p} {...register('changeNote')} placeholder="e.g. activation 2 h → 4 h" />}
          </Field>
        </div>
      </div>
    </Panel>
  );
}

/** One input per project factor: a number within its range, or one of its levels. */
export function RecipeSection({ factors }: { factors: FactorDef[] }) {
  const { register, error } = useBuildForm();
  return (
    <Panel title="Recipe">
      {factors.length === 0 ? (
        <p className="text-sm text-ink-500">This project has no factors yet; a PI or researcher adds them under Settings.</p>
      ) : (
        <div className="grid gap-4 md:grid-cols-3">
          {factors.map((f) => (
            <Field
              key={f.key}
              label={withUnit(f.label, f.unit)}
              hint={f.kind === 'continuous' ? `${f.low} – ${f.high} ${f.unit}` : `one of: ${(f.levels ?? []).join(', ')}`}
              error={error(`factors.${f.key}`)}
            >
              {(p) =>
                f.kind === 'continuous' ? (
                  <Input {...p} type="number" step="any" inputMode="decimal" {...register(`factors.${f.key}` as const, { setValueAs: asNumber })} />
                ) : (
                  <Select {...p} {...register(`factors.${f.key}` as const, { setValueAs: blankAsUndefined })}>
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
  );
}

/** Loading, area, lot, lab (fixed for a partner), status and dates. */
/** Metal loading as it follows from the lot: catalyst loading × the lot's metal content, or why not. */
export function derivedMetalLoading(loadingMgCm2: unknown, lot: Pick<LotView, 'name' | 'metalWtPct'> | undefined): string | null {
  if (!lot) return null;
  if (lot.metalWtPct == null) return `Lot ${lot.name} records no metal content: enter the measured metal loading.`;
  const loading = typeof loadingMgCm2 === 'number' ? loadingMgCm2 : Number(loadingMgCm2);
  if (!(loading > 0)) return `Lot ${lot.name}: ${formatNumber(lot.metalWtPct, 1)} wt % metal; enter the catalyst loading to derive the metal loading.`;
  return `From lot ${lot.name}: ${formatNumber(loading, 2)} mg/cm² × ${formatNumber(lot.metalWtPct, 1)} wt % = ${formatNumber((loading * lot.metalWtPct) / 100, 3)} mg/cm², used unless you enter a measured value.`;
}

export function ElectrodeSection({ labs, lots = [], lockLabId, wasReviewed }: { labs: Lab[]; lots?: LotView[]; lockLabId?: number | null; wasReviewed: boolean }) {
  const { register, error, watch } = useBuildForm();
  const lotId = watch('lotId');
  const lot = lotId != null ? lots.find((l) => l.id === Number(lotId)) : undefined;
  const metalGiven = watch('metalLoadingMgCm2');
  const derived = metalGiven == null || Number.isNaN(metalGiven as number) ? derivedMetalLoading(watch('loadingMgCm2'), lot) : null;
  return (
    <Panel title="Electrode and MEA">
      <div className="grid gap-4 md:grid-cols-4">
        <Field label="Catalyst loading (mg/cm²)" error={error('loadingMgCm2')}>
          {(p) => <Input {...p} type="number" step="any" {...register('loadingMgCm2', { setValueAs: asNumber })} />}
        </Field>
        <Field label="Metal loading (mg/cm²)" hint={derived ?? 'Measured; needed for a metal loading basis'} error={error('metalLoadingMgCm2')}>
          {(p) => <Input {...p} type="number" step="any" {...register('metalLoadingMgCm2', { setValueAs: asNumber })} />}
        </Field>
        <Field label="Active area (cm²)" error={error('areaCm2')}>
          {(p) => <Input {...p} type="number" step="any" {...register('areaCm2', { setValueAs: asNumber })} />}
        </Field>
        {lots.length > 0 && (
          <Field label="Catalyst lot" hint="The project’s recorded lots (Catalyst lots page)" error={error('lotId')}>
            {(p) => (
              <Select {...p} {...register('lotId', { setValueAs: asId })}>
                <option value="">— not a recorded lot —</option>
                {lots.map((l) => <option key={l.id} value={l.id}>{l.name}{l.metalWtPct != null ? ` · ${formatNumber(l.metalWtPct, 1)} wt % metal` : ''}</option>)}
              </Select>
            )}
          </Field>
        )}
        {!lot && (
          <Field label={lots.length ? 'Lot name (not recorded)' : 'Catalyst lot'} error={error('catalystLot')}>
            {(p) => <Input {...p} {...register('catalystLot')} />}
          </Field>
        )}
        <Field label="Lab" hint={lockLabId ? 'Partners record builds for their own lab' : undefined} error={error('labId')}>
          {(p) => (
            <Select {...p} disabled={Boolean(lockLabId)} {...register('labId', { setValueAs: asId })}>
              <option value="">— my lab —</option>
              {labs.map((l) => <option key={l.id} value={l.id}>{l.name}</option>)}
            </Select>
          )}
        </Field>
        <Field label="Status" error={error('status')}>
          {(p) => (
            <Select {...p} {...register('status')}>
              {/* "reviewed" comes from a verdict; it is offered only to keep a reviewed build as it is */}
              {BUILD_STATUSES.filter((s) => s !== 'reviewed' || wasReviewed).map((s) => <option key={s} value={s}>{s}</option>)}
            </Select>
          )}
        </Field>
        <Field label="Built on" error={error('builtOn')}>
          {(p) => <Input {...p} type="date" {...register('builtOn', { setValueAs: blankAsNull })} />}
        </Field>
        <Field label="Tested on" error={error('testedOn')}>
          {(p) => <Input {...p} type="date" {...register('testedOn', { setValueAs: blankAsNull })} />}
        </Field>
      </div>
    </Panel>
  );
}

/** Temperature, gases, pressure, stoichiometry and crossover; the caution when the test is hot, pressurised or fuelled. */
export function TestConditionsSection() {
  const { register, error, watch } = useBuildForm();
  const conditions = watch('testConditions');
  const showSafety = isFlammableFuel(conditions?.anodeGas ?? '') || Number(conditions?.temperatureC ?? 0) >= 120 || Number(conditions?.backPressureKPa ?? 0) > 0;
  const numberInput = (path: `testConditions.${'temperatureC' | 'backPressureKPa' | 'anodeStoich' | 'cathodeStoich' | 'h2CrossoverMAcm2'}`, label: string, hint?: string) => (
    <Field label={label} hint={hint} error={error(path)}>
      {(p) => <Input {...p} type="number" step="any" {...register(path, { setValueAs: asNumber })} />}
    </Field>
  );
  return (
    <Panel title="Test conditions">
      <div className="grid gap-4 md:grid-cols-3">
        {numberInput('testConditions.temperatureC', 'Cell temperature (°C)')}
        <Field label="Anode gas or fuel" error={error('testConditions.anodeGas')}>
          {(p) => <Input {...p} {...register('testConditions.anodeGas')} placeholder="H2" />}
        </Field>
        <Field label="Cathode gas" error={error('testConditions.cathodeGas')}>
          {(p) => <Input {...p} {...register('testConditions.cathodeGas')} placeholder="air" />}
        </Field>
        {numberInput('testConditions.backPressureKPa', 'Back-pressure (kPa gauge)')}
        {numberInput('testConditions.anodeStoich', 'Anode stoichiometry')}
        {numberInput('testConditions.cathodeStoich', 'Cathode stoichiometry')}
        {numberInput('testConditions.h2CrossoverMAcm2', 'H₂ crossover (mA/cm²)', 'Optional. Measured on H₂/N₂ (e.g. a slow linear sweep). Added to the cell current for the Tafel slope, mass activity and iR-free j at V_ref.')}
      </div>
      {showSafety && (
        <div className="mt-4">
          <SafetyNote>
            Hydrogen and fuel vapours are flammable, hot phosphoric acid is corrosive and pressurised lines store energy. Run the test under your lab’s standard operating procedure and local codes; your safety officer decides.
          </SafetyNote>
        </div>
      )}
    </Panel>
  );
}

/** The project's hand-entered responses (none: the section is left out). */
export function ResponsesSection({ responses }: { responses: ResponseDef[] }) {
  const { register, error } = useBuildForm();
  if (responses.length === 0) return null;
  return (
    <Panel title="Hand-entered responses">
      <div className="grid gap-4 md:grid-cols-3">
        {responses.map((r) => (
          <Field key={r.key} label={withUnit(r.label, r.unit)} hint={`goal: ${r.goal}`} error={error(`responses.${r.key}`)}>
            {(p) => <Input {...p} type="number" step="any" {...register(`responses.${r.key}` as const, { setValueAs: asNumber })} />}
          </Field>
        ))}
      </div>
    </Panel>
  );
}

export function NotesSection() {
  const { register, error } = useBuildForm();
  return (
    <Panel title="Notes">
      <Field label="Notes" error={error('notes')}>
        {(p) => <Textarea {...p} rows={3} {...register('notes')} />}
      </Field>
    </Panel>
  );
}
