// Project form: name, description, build-code prefix and the reference point every metric uses.
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { projectCreateSchema, type ProjectCreate } from '@shared/schemas/project';
import { Field, Input, Select, Textarea } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { ErrorNote } from '@/components/ui/panel';

export function ProjectForm({ initial, onSubmit, pending, error, submitLabel, disabled }: { initial?: ProjectCreate; onSubmit: (v: ProjectCreate) => void; pending: boolean; error: unknown; submitLabel: string; disabled?: boolean }) {
  const { register, handleSubmit, formState, watch } = useForm<ProjectCreate>({
    resolver: zodResolver(projectCreateSchema) as never,
    defaultValues: initial ?? { name: '', description: '', codePrefix: 'B', settings: { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'catalyst' } },
  });
  const e = formState.errors;
  const prefix = (watch('codePrefix') || 'B').trim() || 'B';
  const num = { setValueAs: (v: unknown) => (v === '' ? undefined : Number(v)) };
  return (
    <form noValidate onSubmit={handleSubmit(onSubmit)} className="space-y-4" aria-label="Project form">
      <fieldset disabled={disabled} className="space-y-4">
        <div className="grid gap-4 md:grid-cols-[1fr_8rem]">
          <Field label="Project name" error={e.name?.message}>{(p) => <Input {...p} {...register('name')} placeholder="e.g. PGM-free cathode for 180 °C stacks" />}</Field>
          <Field label="Build code prefix" hint={`Builds are numbered ${prefix}-001, ${prefix}-002 …`} error={e.codePrefix?.message}>{(p) => <Input {...p} {...register('codePrefix')} />}</Field>
        </div>
        <Field label="Description" error={e.description?.message}>{(p) => <Textarea {...p} rows={2} {...register('description')} />}</Field>
        <fieldset className="rounded-md border border-line p-3">
          <legend className="px-1 text-xs font-semibold text-ink-700">Reference point (every curve’s metrics are read here)</legend>
          <div className="grid gap-4 md:grid-cols-4">
            <Field label="j_ref (A/cm²)" hint="0.2 is the usual normal-operation point" error={e.settings?.refCurrentDensity?.message}>{(p) => <Input {...p} type="number" step="any" {...register('settings.refCurrentDensity', num)} />}</Field>
            <Field label="V_ref (V)" hint="for j at V_ref and mass activity" error={e.settings?.refVoltage?.message}>{(p) => <Input {...p} type="number" step="any" {...register('settings.refVoltage', num)} />}</Field>
            <Field label="Mass activity on" error={e.settings?.irFree?.message}>
              {(p) => <Select {...p} {...register('settings.irFree', { setValueAs: (v) => v === true || v === 'true' })}><option value="true">iR-free voltage</option><option value="false">measured voltage</option></Select>}
            </Field>
            <Field label="Loading basis" error={e.settings?.loadingBasis?.message}>
              {(p) => <Select {...p} {...register('settings.loadingBasis')}><option value="catalyst">whole catalyst</option><option value="metal">metal only</option></Select>}
            </Field>
          </div>
        </fieldset>
        <ErrorNote error={error} />
        <div className="flex justify-end"><Button type="submit" variant="primary" disabled={pending}>{pending ? 'Saving…' : submitLabel}</Button></div>
      </fieldset>
    </form>
  );
}
