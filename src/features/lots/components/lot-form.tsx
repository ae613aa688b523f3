// Record a catalyst lot or change its record: name, maker, batch size, synthesis or receipt date,
// metal content and notes, checked by the shared lot schema; the server's field errors land inline.
import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { lotCreateSchema, type LotCreate } from '@shared/schemas/lots';
import type { LotView } from '@shared/api-types';
import { Field, Input, Textarea } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { ErrorNote } from '@/components/ui/panel';
import { ApiError } from '@/lib/api-client';

const num = { setValueAs: (v: unknown) => (v === '' || v == null ? null : Number(v)) };
const optional = { setValueAs: (v: unknown) => (v === '' || v == null ? null : v) };

export function LotForm({ initial, submitLabel, onSubmit, pending, error, done }: { initial?: LotView; submitLabel: string; onSubmit: (v: LotCreate) => void; pending: boolean; error: unknown; done?: boolean }) {
  const { register, handleSubmit, formState, setError, reset } = useForm<LotCreate>({
    resolver: zodResolver(lotCreateSchema) as never,
    defaultValues: initial ? { name: initial.name, maker: initial.maker, batchSizeG: initial.batchSizeG, madeOn: initial.madeOn, metalWtPct: initial.metalWtPct, notes: initial.notes } : { name: '', maker: '', notes: '' },
  });
  useEffect(() => {
    if (error instanceof ApiError) for (const [path, message] of Object.entries(error.fields)) setError(path as never, { message });
  }, [error, setError]);
  useEffect(() => {
    if (done && !initial) reset();
  }, [done, initial, reset]);
  const e = formState.errors;
  return (
    <form noValidate onSubmit={handleSubmit((v) => onSubmit(v))} className="grid gap-3 md:grid-cols-6" aria-label="Lot form">
      <Field label="Lot name" error={e.name?.message}>{(p) => <Input {...p} {...register('name')} placeholder="FNC-26-03" />}</Field>
      <div className="md:col-span-2"><Field label="Maker (lab or supplier)" error={e.maker?.message}>{(p) => <Input {...p} {...register('maker')} />}</Field></div>
      <Field label="Batch size (g)" error={e.batchSizeG?.message}>{(p) => <Input {...p} type="number" step="any" {...register('batchSizeG', num)} />}</Field>
      <Field label="Made or received on" error={e.madeOn?.message}>{(p) => <Input {...p} type="date" {...register('madeOn', optional)} />}</Field>
      <Field label="Metal content (wt %)" hint="Metal loading follows from it unless measured" error={e.metalWtPct?.message}>{(p) => <Input {...p} type="number" step="any" {...register('metalWtPct', num)} />}</Field>
      <div className="md:col-span-6"><Field label="Notes" error={e.notes?.message}>{(p) => <Textarea {...p} rows={2} {...register('notes')} />}</Field></div>
      <div className="flex items-end gap-2 md:col-span-6">
        <Button type="submit" variant="primary" disabled={pending}>{pending ? 'Saving…' : submitLabel}</Button>
        <div className="flex-1"><ErrorNote error={error instanceof ApiError && Object.keys(error.fields).length ? null : error} /></div>
      </div>
    </form>
  );
}
