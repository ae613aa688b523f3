// The build form (create and edit): the sections of a build record in order, checked by the
// shared build schema plus the project's factor bounds, errors inline under each field. A new
// build with a parent starts from the parent's recipe; the server's field errors land on the
// matching inputs.
import { useEffect, useRef } from 'react';
import { useQuery } from '@tanstack/react-query';
import { FormProvider, useForm, useFormState, type UseFormReturn } from 'react-hook-form';
import type { Build, BuildBrief, FactorDef, ResponseDef, Lab, LotView } from '@shared/api-types';
import { buildQueryOptions } from '../api/builds';
import type { BuildCreate } from '@shared/schemas/build';
import { Button } from '@/components/ui/button';
import { ErrorNote } from '@/components/ui/panel';
import { ApiError } from '@/lib/api-client';
import { buildFormResolver, newBuildValues, type BuildFormValues } from './build-form-values';
import { ElectrodeSection, LineageSection, NotesSection, RecipeSection, ResponsesSection, TestConditionsSection } from './build-form-sections';

export { buildToForm, cleanBuildInput } from './build-form-values';

/** Put each field error of a refused request on its input. */
function useServerFieldErrors(form: UseFormReturn<BuildFormValues>, serverError: unknown) {
  const { setError } = form;
  useEffect(() => {
    if (serverError instanceof ApiError) {
      for (const [path, message] of Object.entries(serverError.fields)) setError(path as never, { type: 'server', message });
    }
  }, [serverError, setError]);
}

/** A new build that names a parent starts from the parent's recipe: one change at a time is the usual campaign step. */
function useStartFromParent(form: UseFormReturn<BuildFormValues>, editing: boolean) {
  const { watch, setValue, getFieldState } = form;
  const parentId = watch('parentId');
  // subscribed, so a field's dirtiness is known (what the user typed is dirty; the parent's values are not)
  const formState = useFormState({ control: form.control });
  // the picker lists builds briefly; the chosen parent's recipe is read on its own, and what was
  // typed meanwhile (before the recipe arrived) is kept
  const detail = useQuery({ ...buildQueryOptions(Number(parentId)), enabled: !editing && !!parentId });
  const parent = detail.data?.build;
  // once per parent chosen: later edits are the user's
  const applied = useRef<number | null>(null);
  useEffect(() => {
    if (editing || !parentId || !parent || parent.id !== Number(parentId) || applied.current === parent.id) return;
    applied.current = parent.id;
    const untouched = (name: string) => !getFieldState(name as never, formState).isDirty;
    for (const [key, value] of Object.entries(parent.factors)) if (untouched(`factors.${key}`)) setValue(`factors.${key}` as never, value as never);
    if (parent.loadingMgCm2 != null && untouched('loadingMgCm2')) setValue('loadingMgCm2', parent.loadingMgCm2);
    if (parent.areaCm2 != null && untouched('areaCm2')) setValue('areaCm2', parent.areaCm2);
    if (parent.catalystLot && untouched('catalystLot')) setValue('catalystLot', parent.catalystLot);
    if (parent.lotId != null && untouched('lotId')) setValue('lotId', parent.lotId);
    for (const [key, value] of Object.entries(parent.testConditions)) if (untouched(`testConditions.${key}`)) setValue(`testConditions.${key}` as never, value as never);
  }, [parentId, parent, editing, setValue, getFieldState, formState]);
}

export function BuildForm({ factors, responses, labs, lots = [], builds, initial, lockLabId, submitLabel, onSubmit, pending, serverError }: {
  factors: FactorDef[];
  responses: ResponseDef[];
  labs: Lab[];
  /** the project's catalyst lots: the build picks its lot from these */
  lots?: LotView[];
  /** the project's builds as the parent and replicate pickers list them */
  builds: BuildBrief[];
  /** the build being edited; a new build opens with the usual test point */
  initial?: BuildFormValues;
  /** a partner's lab: the lab choice is fixed to it */
  lockLabId?: number | null;
  submitLabel: string;
  onSubmit: (values: BuildCreate) => void;
  pending: boolean;
  serverError: unknown;
}) {
  const form = useForm<BuildFormValues>({ resolver: buildFormResolver(factors), defaultValues: initial ?? newBuildValues() });
  useServerFieldErrors(form, serverError);
  useStartFromParent(form, Boolean(initial));

  return (
    <FormProvider {...form}>
      <form noValidate className="space-y-5" onSubmit={form.handleSubmit((values) => {
        // a build made from a recorded lot carries that lot's name
        const lot = values.lotId != null ? lots.find((l) => l.id === Number(values.lotId)) : undefined;
        onSubmit({ ...(values as BuildCreate), ...(lot && { catalystLot: lot.name }) });
      })} aria-label="Build form">
        <LineageSection builds={builds} />
        <RecipeSection factors={factors} />
        <ElectrodeSection labs={labs} lots={lots} lockLabId={lockLabId} wasReviewed={initial?.status === 'reviewed'} />
        <TestConditionsSection />
        <ResponsesSection responses={responses} />
        <NotesSection />
        <ErrorNote error={serverError} />
        <div className="flex justify-end gap-2">
          <Button type="submit" variant="primary" disabled={pending}>{pending ? 'Saving…' : submitLabel}</Button>
        </div>
      </form>
    </FormProvider>
  );
}
