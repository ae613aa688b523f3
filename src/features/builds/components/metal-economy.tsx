// The build's precious-metal figures: metal loading, g of metal per kW at V_ref (or at peak power)
// and cost per kW with the date and source of the price; each with its method on hover.
import type { Build, ProjectSettings } from '@shared/api-types';
import { buildEconomy } from '@shared/economy';
import { Hint } from '@/components/ui/hint';
import { formatDate, formatNumber, formatSignificant } from '@/lib/format';

export function MetalEconomyFigures({ build, settings }: { build: Build; settings: ProjectSettings }) {
  const e = buildEconomy(build, settings);
  const figure = (label: string, value: string | null, method: string, note: string | null) => (
    <Hint hint={method} role="listitem">
      <div className="text-xs text-ink-500">{label}</div>
      <div className="num text-[15px] text-ink-950">{value ?? <span className="text-ink-500">— <span className="sr-only">not available</span></span>}</div>
      {note && <div className={`text-[11px] leading-tight ${value == null ? 'text-amber-700' : 'text-ink-500'}`}>{note}</div>}
    </Hint>
  );
  return (
    <div className="grid grid-cols-1 gap-x-6 gap-y-2 sm:grid-cols-3" role="list" aria-label="Precious-metal economy">
      {figure('Precious-metal loading', e.metalLoadingMgCm2 == null ? null : `${formatNumber(e.metalLoadingMgCm2, 3)} mg/cm²`, e.method.loading, e.loadingNote)}
      {figure(`Precious metal per kW${e.powerLabel ? ` ${e.powerLabel}` : ''}`, e.gPerKw == null ? null : `${formatSignificant(e.gPerKw, 3)} g/kW`, e.method.gPerKw, e.powerNote)}
      {figure('Metal cost per kW', e.costPerKw == null ? null : `${formatNumber(e.costPerKw, 1)} ${e.costUnit}`, e.method.cost, e.costPerKw != null ? `price of ${formatDate(e.priceDate)} · ${e.priceSource}` : e.costNote)}
    </div>
  );
}
