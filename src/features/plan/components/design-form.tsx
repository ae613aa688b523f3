// The design request form: which design, over which factors, with centre points, replicates,
// blocks and a seed. Options that only apply to one kind of design appear with it. The values
// are checked by the request schema the server uses (design-values.ts), errors shown inline.
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { FactorDef } from '@shared/api-types';
import type { DesignKind } from '@shared/doe/designs/types';
import { Field, Input, Select } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import type { DesignBody } from '../api/designs';
import { designResolver, initialDesignValues, type CcdVariantChoice, type DesignFormValues } from './design-values';

export const KIND_LABELS: Record<DesignKind, string> = {
  'full-factorial-2': '2-level full factorial (2^k)',
  'fractional-factorial': 'Fractional factorial 2^(k−p)',
  'full-factorial-3': '3-level full factorial (3^k)',
  'central-composite': 'Central composite',
  'box-behnken': 'Box–Behnken',
  'latin-hypercube': 'Latin hypercube',
};

/** What each central-composite variant does with the ranges, shown with the chosen one. */
export const VARIANT_HELP: Record<CcdVariantChoice, string> = {
  circumscribed: 'Corners at the ends of each range; the axial builds go α beyond them (outside the ranges set in the project), so check they can be made. Five levels per factor.',
  inscribed: 'The whole design is shrunk so the axial builds sit at the ends of each range and the corners at ±1/α inside them: every build stays in range. Five levels per factor.',
  'face-centred': 'Axial builds at the middle of each face of the box (α = 1): every build stays in range, three levels per factor, at the cost of rotatability.',
};

export function DesignForm({ factors, busy, onSubmit }: { factors: FactorDef[]; busy: boolean; onSubmit: (body: DesignBody) => void }) {
  const [defaults] = useState(() => initialDesignValues(factors, Math.floor(Math.random() * 100000)));
  const { register, handleSubmit, watch, formState } = useForm<DesignFormValues>({ defaultValues: defaults, resolver: designResolver(factors) });
  const e = formState.errors;
  // the factor choice is one error for the whole group (the schema's "choose at least one factor")
  const factorsError = (e.chosen as { message?: string } | undefined)?.message;
  const kind = watch('kind');
  const variant = watch('variant');
  const alpha = watch('alpha');
  const chosen = watch('chosen');
  const noneChosen = !factors.some((f) => chosen?.[f.key]);
  const continuous = factors.filter((f) => f.kind === 'continuous');
  const categorical = factors.filter((f) => f.kind === 'categorical');

  return (
    <form noValidate onSubmit={handleSubmit((body) => onSubmit(body as unknown as DesignBody))} className="flex flex-col gap-4" aria-label="Design request">
      <Field label="Design" error={e.kind?.message}>
        {(p) => (
          <Select {...p} {...register('kind')}>
            {Object.entries(KIND_LABELS).map(([k, label]) => <option key={k} value={k}>{label}</option>)}
          </Select>
        )}
      </Field>
      <fieldset className="flex flex-col gap-1.5" aria-describedby={factorsError ? 'design-factors-error' : undefined}>
        <legend className="mb-1 text-xs font-medium text-ink-700">Factors</legend>
        {continuous.map((f) => (
          <label key={f.key} className="flex items-center gap-2 text-sm">
            <input type="checkbox" {...register(`chosen.${f.key}`)} />
            <span>{f.label}</span>
            <span className="num text-xs text-ink-500">{f.low}–{f.high} {f.unit}</span>
          </label>
        ))}
        {categorical.map((f) => (
          <label key={f.key} className="flex items-center gap-2 text-sm">
            <input type="checkbox" {...register(`chosen.${f.key}`)} />
            <span>{f.label}</span>
            <span className="text-xs text-ink-500">crossed: {(f.levels ?? []).join(' / ')}</span>
          </label>
        ))}
        {factorsError && <p id="design-factors-error" role="alert" className="text-xs text-rust-700">{factorsError}</p>}
      </fieldset>
      {kind === 'fractional-factorial' && (
        <div className="grid grid-cols-2 gap-3">
          <Field label="Generators" hint="e.g. D=ABC, E=ABD (letters A, B, C… follow the continuous factors in order)" error={e.generators?.message}>
            {(p) => <Input {...p} {...register('generators')} placeholder="D=ABC" />}
          </Field>
          <Field label="Runs in the fraction" hint="used when no generators are given" error={e.fraction?.message}>
            {(p) => <Input {...p} inputMode="numeric" {...register('fraction')} placeholder="8" />}
          </Field>
        </div>
      )}
      {kind === 'central-composite' && (
        <div className="grid grid-cols-1 gap-3">
          <Field label="Variant" hint={VARIANT_HELP[variant]} error={e.variant?.message}>
            {(p) => (
              <Select {...p} {...register('variant')}>
                <option value="circumscribed">circumscribed</option>
                <option value="inscribed">inscribed</option>
                <option value="face-centred">face-centred (α = 1)</option>
              </Select>
            )}
          </Field>
          {variant !== 'face-centred' && (
            <Field label="Axial distance α" error={e.alphaValue?.message}>
              {(p) => (
                <div className="flex gap-2">
                  <Select {...p} {...register('alpha')}>
                    <option value="rotatable">rotatable</option>
                    <option value="orthogonal">orthogonal</option>
                    <option value="custom">set by hand</option>
                  </Select>
                  {alpha === 'custom' && <Input aria-label="α (coded units)" aria-invalid={Boolean(e.alphaValue)} className="w-20" inputMode="decimal" {...register('alphaValue')} />}
                </div>
              )}
            </Field>
          )}
        </div>
      )}
      {kind === 'latin-hypercube' && (
        <div className="grid grid-cols-2 gap-3">
          <Field label="Points" error={e.runs?.message}>{(p) => <Input {...p} inputMode="numeric" {...register('runs')} />}</Field>
          <label className="mt-6 flex items-center gap-2 text-sm"><input type="checkbox" {...register('maximin')} /> Spread out (maximin)</label>
        </div>
      )}
      <div className="grid grid-cols-3 gap-3">
        <Field label="Centre points" error={e.centerPoints?.message}>{(p) => <Input {...p} inputMode="numeric" {...register('centerPoints')} />}</Field>
        <Field label="Replicates" error={e.replicates?.message}>{(p) => <Input {...p} inputMode="numeric" {...register('replicates')} />}</Field>
        <Field label="Blocks" hint="e.g. one per lab or day" error={e.blocks?.message}>{(p) => <Input {...p} inputMode="numeric" {...register('blocks')} />}</Field>
      </div>
      <div className="grid grid-cols-2 items-end gap-3">
        <Field label="Seed" hint="the same seed gives the same run order" error={e.seed?.message}>{(p) => <Input {...p} inputMode="numeric" {...register('seed')} />}</Field>
        <label className="mb-6 flex items-center gap-2 text-sm"><input type="checkbox" {...register('randomize')} /> Randomise run order</label>
      </div>
      <div>
        <Button type="submit" variant="primary" disabled={busy || noneChosen}>{busy ? 'Generating…' : 'Generate design'}</Button>
      </div>
    </form>
  );
}
