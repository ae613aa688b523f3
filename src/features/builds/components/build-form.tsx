// The build form (create and edit): the sections of a build record in order, checked by the
// shared build schema plus the project's factor bounds, errors inline under each field. A new
// build with a parent starts from the parent's recipe; the server's field errors land on the
// matching inputs.
import { useEffect } from 'react';
import { FormProvider, useForm, type UseFormReturn } from 'react-hook-form';
import type { Build, FactorDef, ResponseDef, Lab, LotView } from '@shared/api-types';
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
function useStartFromParent(form: UseFormReturn<BuildFormValues>, builds: Build[], editing: boolean) {
  const { watch, setValue } = form;
  const parentId = watch('parentId');
  useEffect(() => {
    if (editing || !parentId) return;
    const parent = builds.find((b) => b.id === Number(parentId));
    if (!parent) return;
    setValue('factors', { ...parent.factors });
    if (parent.loadingMgCm2 != null) setValue('loadingMgCm2', parent.loadingMgCm2);
    if (parent.areaCm2 != null) setValue('areaCm2', parent.areaCm2);
    if (parent.catalystLot) setValue('catalystLot', parent.catalystLot);
    if (parent.lotId != null) setValue('lotId', parent.lotId);
    setValue('testConditions', { ...parent.testConditions });
  }, [parentId, builds, editing, setValue]);
}

export function BuildForm({ factors, responses, labs, lots = [], builds, initial, lockLabId, submitLabel, onSubmit, pending, serverError }: {
  factors: FactorDef[];
  responses: ResponseDef[];
  labs: Lab[];
  /** the project's catalyst lots: the build picks its lot from these */
  lots?: LotView[];
  builds: Build[];
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
  useStartFromParent(form, builds, Boolean(initial));

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
