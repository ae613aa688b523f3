// What is fitted: the response (a curve metric or a hand-entered one), the model — chosen
// automatically from the builds, or a ladder step, or terms ticked by hand — and the factors.
// The values are checked by the surface request schema (fit-values.ts), errors inline.
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { FactorDef, ResponseDef } from '@shared/api-types';
import { Field, Select } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { ResponseOptions } from '@/components/ui/response-options';
import type { SurfaceRequest } from '../api/surface';
import { fitResolver, initialFitValues, pickedFactors, termChoices, type FitFormValues } from './fit-values';

function GroupError({ id, message }: { id: string; message?: string }) {
  return message ? <p id={id} role="alert" className="text-xs text-rust-700">{message}</p> : null;
}

export function FitForm({ factors, responses, initial, busy, onFit }: { factors: FactorDef[]; responses: ResponseDef[]; initial: SurfaceRequest; busy: boolean; onFit: (request: SurfaceRequest) => void }) {
  const [defaults] = useState(() => initialFitValues(initial, factors));
  const { register, handleSubmit, watch, formState } = useForm<FitFormValues>({ defaultValues: defaults, resolver: fitResolver(factors) });
  const e = formState.errors;
  const model = watch('model');
  const chosen = watch('chosen');
  const choices = termChoices(pickedFactors({ chosen }, factors));
  // the factor and term choices are one error each for the whole group
  const factorsError = (e.chosen as { message?: string } | undefined)?.message;
  const termsError = (e.terms as { message?: string } | undefined)?.message;
  return (
    <form noValidate onSubmit={handleSubmit((request) => onFit(request as unknown as SurfaceRequest))} aria-label="What is fitted" className="flex flex-col gap-3">
      <Field label="Response" error={e.response?.message}>
        {(p) => (
          <Select {...p} {...register('response')}>
            <ResponseOptions responses={responses} />
          </Select>
        )}
      </Field>
      <Field label="Model" hint="“chosen from the builds” is recommended: the simplest model they support that predicts well. Factors are scaled −1…+1 over their ranges; levels are compared with the first level.">
        {(p) => (
          <Select {...p} {...register('model')}>
            <option value="auto">chosen from the builds</option>
            <option value="linear">main effects only</option>
            <option value="interactions">main effects and every pair of factors</option>
            <option value="quadratic">pairs and curvature of every factor</option>
            <option value="terms">terms I tick</option>
          </Select>
        )}
      </Field>
      <fieldset className="flex flex-col gap-1" aria-describedby={factorsError ? 'fit-factors-error' : undefined}>
        <legend className="mb-1 text-xs font-medium text-ink-700">Factors</legend>
        {factors.map((f) => (
          <label key={f.key} className="flex items-center gap-2 text-sm">
            <input type="checkbox" {...register(`chosen.${f.key}`)} />
            {f.label}{f.unit ? <span className="text-xs text-ink-500">({f.unit})</span> : null}
          </label>
        ))}
        <GroupError id="fit-factors-error" message={factorsError} />
      </fieldset>
      {model === 'terms' && (
        <fieldset className="flex max-h-64 flex-col gap-1 overflow-y-auto rounded-md border border-line p-2" aria-describedby={termsError ? 'fit-terms-error' : undefined}>
          <legend className="px-1 text-xs font-medium text-ink-700">Terms (a term's factors are added when missing)</legend>
          {choices.map((c) => (
            <label key={c.name} className="flex items-center gap-2 text-sm">
              <input type="checkbox" {...register(`terms.${c.name}`)} />
              {c.label}
            </label>
          ))}
          <GroupError id="fit-terms-error" message={termsError} />
        </fieldset>
      )}
      <GroupError id="fit-form-error" message={e.root?.message} />
      <div><Button type="submit" variant="primary" disabled={busy}>{busy ? 'Fitting…' : 'Fit'}</Button></div>
    </form>
  );
}
