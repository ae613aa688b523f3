// Add a target: a curve metric or hand-entered response, ≥ or ≤ a value in a unit of the same
// kind, the basis for activities per mass, the conditions it is stated at, a due date and a name.
import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { targetCreateSchema, type TargetCreate } from '@shared/schemas/targets';
import { unitsLike } from '@shared/targets/target-units';
import { Field, Input, Select } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { ErrorNote } from '@/components/ui/panel';
import { ApiError } from '@/lib/api-client';

export interface MetricChoice { key: string; label: string; unit: string }

export function TargetForm({ metrics, onSubmit, pending, error }: { metrics: MetricChoice[]; onSubmit: (v: TargetCreate) => void; pending: boolean; error: unknown }) {
  const first = metrics[0];
  const { register, handleSubmit, formState, watch, setValue, setError } = useForm<TargetCreate>({
    resolver: zodResolver(targetCreateSchema) as never,
    defaultValues: { metric: first?.key ?? '', comparator: '>=', unit: first?.unit ?? '', conditions: '', name: '' },
  });
  const metricKey = watch('metric');
  const metric = metrics.find((m) => m.key === metricKey);
  const units = metric ? unitsLike(metric.unit) : [];
  useEffect(() => {
    if (metric) setValue('unit', metric.unit);
  }, [metric, setValue]);
  useEffect(() => {
    if (error instanceof ApiError) for (const [path, message] of Object.entries(error.fields)) setError(path as never, { message });
  }, [error, setError]);
  const e = formState.errors;
  const num = { setValueAs: (v: unknown) => (v === '' || v == null ? undefined : Number(v)) };
  const optional = { setValueAs: (v: unknown) => (v === '' || v == null ? null : v) };
  return (
    <form noValidate onSubmit={handleSubmit((v) => onSubmit(v))} className="grid gap-3 md:grid-cols-6" aria-label="Target form">
      <div className="md:col-span-2">
        <Field label="Metric or response" error={e.metric?.message}>
          {(p) => <Select {...p} {...register('metric')}>{metrics.map((m) => <option key={m.key} value={m.key}>{m.label}{m.unit ? ` (${m.unit})` : ''}</option>)}</Select>}
        </Field>
      </div>
      <Field label="Is" error={e.comparator?.message}>{(p) => <Select {...p} {...register('comparator')}><option value=">=">at least (≥)</option><option value="<=">at most (≤)</option></Select>}</Field>
      <Field label="Value" error={e.value?.message}>{(p) => <Input {...p} type="number" step="any" {...register('value', num)} />}</Field>
      <Field label="Unit" error={e.unit?.message}>{(p) => <Select {...p} {...register('unit')}>{units.map((u) => <option key={u} value={u}>{u}</option>)}</Select>}</Field>
      {metricKey === 'massActivity' ? (
        <Field label="Per gram of" error={e.basis?.message}>{(p) => <Select {...p} {...register('basis', optional)}><option value="">project’s basis</option><option value="catalyst">catalyst</option><option value="metal">metal</option></Select>}</Field>
      ) : <div />}
      <div className="md:col-span-2">
        <Field label="Name the programme uses" error={e.name?.message}>{(p) => <Input {...p} {...register('name')} placeholder="Durability gate" />}</Field>
      </div>
      <div className="md:col-span-3">
        <Field label="Stated at (conditions)" error={e.conditions?.message}>{(p) => <Input {...p} {...register('conditions')} placeholder="0.2 A/cm², 180 °C, H2/air" />}</Field>
      </div>
      <Field label="Due date" error={e.dueDate?.message}>{(p) => <Input {...p} type="date" {...register('dueDate', optional)} />}</Field>
      <div className="flex items-end gap-2 md:col-span-6">
        <Button type="submit" variant="primary" disabled={pending}>Add target</Button>
        <div className="flex-1"><ErrorNote error={error instanceof ApiError && Object.keys(error.fields).length ? null : error} /></div>
      </div>
    </form>
  );
}
