// The project's precious-metal prices, entered by the PI (never fetched): metal, price per g,
// currency, the date the price holds for and where it came from. Saving replaces the list.
import { useFieldArray, useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { metalPricesSchema, type MetalPricesBody } from '@shared/schemas/project';
import { api } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { Input } from '@/components/ui/field';
import { ErrorNote } from '@/components/ui/panel';

export function useSetMetalPrices(projectId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: MetalPricesBody) => api<{ metalPrices: MetalPricesBody['prices'] }>(`/projects/${projectId}/metal-prices`, { method: 'PUT', body }),
    onSuccess: () => {
      client.invalidateQueries({ queryKey: ['projects'] });
      client.invalidateQueries({ queryKey: ['builds', projectId] });
      client.invalidateQueries({ queryKey: ['build'] });
    },
  });
}

const today = () => new Date().toISOString().slice(0, 10);

export function MetalPricesForm({ projectId, prices, disabled }: { projectId: number; prices: MetalPricesBody['prices']; disabled: boolean }) {
  const save = useSetMetalPrices(projectId);
  const { register, control, handleSubmit, formState } = useForm<MetalPricesBody>({ resolver: zodResolver(metalPricesSchema), defaultValues: { prices } });
  const rows = useFieldArray({ control, name: 'prices' });
  const errors = formState.errors.prices;
  return (
    <form onSubmit={handleSubmit((body) => save.mutate(body))} className="space-y-2" aria-label="Metal prices">
      {rows.fields.length === 0 && <p className="text-sm text-ink-500">No prices yet. Add the price your team pays per gram of metal to see the metal cost per kW of every build.</p>}
      {rows.fields.length > 0 && (
        <table className="w-full text-sm">
          <caption className="sr-only">Precious-metal prices</caption>
          <thead className="text-left text-xs text-ink-500">
            <tr><th className="py-1 pr-2">Metal</th><th className="py-1 pr-2">Price per g</th><th className="py-1 pr-2">Currency</th><th className="py-1 pr-2">Price date</th><th className="py-1 pr-2">Source</th><th className="py-1"><span className="sr-only">Remove</span></th></tr>
          </thead>
          <tbody>
            {rows.fields.map((field, index) => (
              <tr key={field.id}>
                <td className="py-1 pr-2"><Input aria-label={`Metal ${index + 1}`} disabled={disabled} {...register(`prices.${index}.metal`)} placeholder="Pt" /></td>
                <td className="py-1 pr-2"><Input aria-label={`Price per g ${index + 1}`} type="number" step="any" disabled={disabled} {...register(`prices.${index}.pricePerGram`, { valueAsNumber: true })} /></td>
                <td className="py-1 pr-2"><Input aria-label={`Currency ${index + 1}`} disabled={disabled} {...register(`prices.${index}.currency`)} placeholder="EUR" /></td>
                <td className="py-1 pr-2"><Input aria-label={`Price date ${index + 1}`} type="date" disabled={disabled} {...register(`prices.${index}.date`)} /></td>
                <td className="py-1 pr-2"><Input aria-label={`Source ${index + 1}`} disabled={disabled} {...register(`prices.${index}.source`)} placeholder="supplier quote" /></td>
                <td className="py-1">{!disabled && <Button type="button" onClick={() => rows.remove(index)} aria-label={`Remove price ${index + 1}`}>Remove</Button>}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {errors && <p role="alert" className="text-xs text-rust-700">{(Array.isArray(errors) ? errors.flatMap((row, i) => (row ? Object.entries(row).map(([k, v]) => `price ${i + 1}, ${k}: ${(v as { message?: string }).message ?? 'invalid'}`) : [])) : [errors.message ?? errors.root?.message]).filter(Boolean).join('; ')}</p>}
      <ErrorNote error={save.error} />
      {!disabled && (
        <div className="flex gap-2">
          <Button type="button" onClick={() => rows.append({ metal: '', pricePerGram: Number.NaN, currency: prices[0]?.currency ?? 'EUR', date: today(), source: '' })}>Add a price</Button>
          <Button type="submit" variant="primary" disabled={save.isPending}>Save prices</Button>
          {save.isSuccess && <span role="status" className="self-center text-sm text-moss-700">Saved.</span>}
        </div>
      )}
    </form>
  );
}
