// Import a reference curve (PIs): the polarization file and its provenance — where it comes from,
// its date, the loadings and conditions it was measured at — optionally made the benchmark.
import { useEffect, useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { referenceCurveFieldsSchema } from '@shared/schemas/benchmarks';
import { Field, Input, Textarea } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { ErrorNote } from '@/components/ui/panel';
import { ApiError } from '@/lib/api-client';

type Values = Record<string, string | boolean | undefined>;

export function ReferenceCurveForm({ onSubmit, pending, error, done }: { onSubmit: (form: FormData) => void; pending: boolean; error: unknown; done: boolean }) {
  const [file, setFile] = useState<File | null>(null);
  const [fileError, setFileError] = useState<string | null>(null);
  const { register, handleSubmit, formState, setError, reset } = useForm<Values>({ resolver: zodResolver(referenceCurveFieldsSchema) as never, defaultValues: { label: '', source: '', notes: '', makeBenchmark: false } });
  useEffect(() => {
    if (error instanceof ApiError) for (const [path, message] of Object.entries(error.fields)) setError(path as never, { message });
  }, [error, setError]);
  useEffect(() => {
    if (done) { reset(); setFile(null); }
  }, [done, reset]);
  const e = formState.errors as Record<string, { message?: string } | undefined>;
  const submit = handleSubmit((values) => {
    if (!file) { setFileError('Choose the curve file (CSV, TXT or XLSX: current density and voltage columns).'); return; }
    const form = new FormData();
    for (const [key, value] of Object.entries(values)) if (value !== undefined && value !== null && value !== '') form.append(key, String(value));
    form.append('file', file);
    onSubmit(form);
  });
  const text = (name: string, label: string, extra: { placeholder?: string; type?: string; hint?: string } = {}) => (
    <Field label={label} error={e[name]?.message} hint={extra.hint}>{(p) => <Input {...p} type={extra.type ?? 'text'} step="any" placeholder={extra.placeholder} {...register(name)} />}</Field>
  );
  return (
    <form noValidate onSubmit={submit} className="grid gap-3 md:grid-cols-4" aria-label="Reference curve form">
      <div className="md:col-span-2">
        <Field label="Curve file" error={fileError ?? undefined} hint="A polarization curve: current density and voltage columns, units in the headers (HFR optional).">
          {(p) => <Input {...p} type="file" accept=".csv,.txt,.tsv,.xlsx" onChange={(ev) => { setFile(ev.target.files?.[0] ?? null); setFileError(null); }} />}
        </Field>
      </div>
      <div className="md:col-span-2">{text('label', 'Name on plots', { placeholder: 'Published HT-PEM cathode, 160 °C' })}</div>
      <div className="md:col-span-3">{text('source', 'Source (provenance)', { placeholder: 'Report or paper, figure or table, digitised or as supplied' })}</div>
      {text('sourceDate', 'Date of the source', { type: 'date' })}
      {text('loadingMgCm2', 'Catalyst loading (mg/cm²)', { type: 'number' })}
      {text('metalLoadingMgCm2', 'Metal loading (mg/cm²)', { type: 'number' })}
      {text('areaCm2', 'Active area (cm²)', { type: 'number', hint: 'only for files in total current' })}
      {text('temperatureC', 'Cell temperature (°C)', { type: 'number' })}
      {text('anodeGas', 'Anode gas', { placeholder: 'H2' })}
      {text('cathodeGas', 'Cathode gas', { placeholder: 'air' })}
      {text('backPressureKPa', 'Back-pressure (kPa)', { type: 'number' })}
      <div className="md:col-span-4">
        <Field label="Notes" error={e.notes?.message}>{(p) => <Textarea {...p} rows={2} {...register('notes')} />}</Field>
      </div>
      <label className="inline-flex items-center gap-2 text-sm md:col-span-4"><input type="checkbox" {...register('makeBenchmark')} /> Make it the project’s benchmark</label>
      <div className="flex items-end gap-2 md:col-span-4">
        <Button type="submit" variant="primary" disabled={pending}>{pending ? 'Importing…' : 'Import reference curve'}</Button>
        <div className="flex-1"><ErrorNote error={error instanceof ApiError && Object.keys(error.fields).length ? null : error} /></div>
      </div>
    </form>
  );
}
