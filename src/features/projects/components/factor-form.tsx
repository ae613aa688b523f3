// Add or edit a factor: continuous (unit, low, high) or categorical (levels).
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { factorCreateSchema, type FactorCreate, responseCreateSchema, type ResponseCreate } from '@shared/schemas/project';
import { Field, Input, Select } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { ErrorNote } from '@/components/ui/panel';
import { ApiError } from '@/lib/api-client';
import { useEffect } from 'react';

type FactorFormValues = Omit<FactorCreate, 'levels'> & { levelsText?: string };

export function FactorForm({ initial, onSubmit, pending, error, onCancel }: { initial?: FactorCreate & { id?: number }; onSubmit: (v: FactorCreate) => void; pending: boolean; error: unknown; onCancel?: () => void }) {
  const { register, handleSubmit, watch, formState, setError } = useForm<FactorFormValues>({
    resolver: async (values) => {
      const levels = (values.levelsText ?? '').split(',').map((s) => s.trim()).filter(Boolean);
      const candidate = { ...values, levels: values.kind === 'categorical' ? levels : null };
      delete (candidate as { levelsText?: string }).levelsText;
      const parsed = factorCreateSchema.safeParse(candidate);
      if (parsed.success) return { values: parsed.data as never, errors: {} };
      const errors: Record<string, { type: string; message: string }> = {};
      for (const i of parsed.error.issues) errors[i.path[0] === 'levels' ? 'levelsText' : String(i.path[0])] = { type: 'zod', message: i.message };
      return { values: {}, errors: errors as never };
    },
    defaultValues: initial ? { ...initial, levelsText: (initial.levels ?? []).join(', ') } : { kind: 'continuous', unit: '' },
  });
  useEffect(() => {
    if (error instanceof ApiError) for (const [path, message] of Object.entries(error.fields)) setError(path as never, { message });
  }, [error, setError]);
  const kind = watch('kind');
  const e = formState.errors;
  const num = { setValueAs: (v: unknown) => (v === '' || v == null ? null : Number(v)) };
  return (
    <form noValidate onSubmit={handleSubmit((v) => onSubmit(v as unknown as FactorCreate))} className="grid gap-3 md:grid-cols-6" aria-label="Factor form">
      <Field label="Key" hint="used in files and the API" error={e.key?.message}>{(p) => <Input {...p} {...register('key')} disabled={Boolean(initial?.id)} placeholder="binder" />}</Field>
      <Field label="Label" error={e.label?.message}>{(p) => <Input {...p} {...register('label')} placeholder="PTFE binder" />}</Field>
      <Field label="Kind" error={e.kind?.message}>{(p) => <Select {...p} {...register('kind')}><option value="continuous">continuous</option><option value="categorical">categorical</option></Select>}</Field>
      {kind === 'continuous' ? (
        <>
          <Field label="Unit" error={e.unit?.message}>{(p) => <Input {...p} {...register('unit')} placeholder="wt %" />}</Field>
          <Field label="Low" error={e.low?.message}>{(p) => <Input {...p} type="number" step="any" {...register('low', num)} />}</Field>
          <Field label="High" error={e.high?.message}>{(p) => <Input {...p} type="number" step="any" {...register('high', num)} />}</Field>
        </>
      ) : (
        <div className="md:col-span-3">
          <Field label="Levels (comma-separated)" error={e.levelsText?.message}>{(p) => <Input {...p} {...register('levelsText')} placeholder="woven carbon, carbon paper" />}</Field>
        </div>
      )}
      <div className="flex items-end gap-2 md:col-span-6">
        <Button type="submit" variant="primary" disabled={pending}>{initial?.id ? 'Save factor' : 'Add factor'}</Button>
        {onCancel && <Button onClick={onCancel}>Cancel</Button>}
        <div className="flex-1"><ErrorNote error={error instanceof ApiError && Object.keys(error.fields).length ? null : error} /></div>
      </div>
    </form>
  );
}

export function ResponseForm({ onSubmit, pending, error }: { onSubmit: (v: ResponseCreate) => void; pending: boolean; error: unknown }) {
  const { register, handleSubmit, formState, reset } = useForm<ResponseCreate>({ resolver: zodResolver(responseCreateSchema) as never, defaultValues: { goal: 'maximize', unit: '' } });
  const e = formState.errors;
  return (
    <form noValidate onSubmit={handleSubmit((v) => { onSubmit(v); reset(); })} className="grid gap-3 md:grid-cols-5" aria-label="Response form">
      <Field label="Key" error={e.key?.message}>{(p) => <Input {...p} {...register('key')} placeholder="costPerCm2" />}</Field>
      <Field label="Label" error={e.label?.message}>{(p) => <Input {...p} {...register('label')} placeholder="Noble-metal cost" />}</Field>
      <Field label="Unit" error={e.unit?.message}>{(p) => <Input {...p} {...register('unit')} placeholder="€/cm²" />}</Field>
      <Field label="Goal" error={e.goal?.message}>{(p) => <Select {...p} {...register('goal')}><option value="maximize">maximize</option><option value="minimize">minimize</option><option value="target">target</option></Select>}</Field>
      <div className="flex items-end"><Button type="submit" variant="primary" disabled={pending}>Add response</Button></div>
      <div className="md:col-span-5"><ErrorNote error={error} /></div>
    </form>
  );
}
