// The precious-metal figures shown beside a build: its metal loading, g of metal per kW at the
// project's reference voltage (else at peak power) and the cost per kW from the project's prices.
import { metalEconomy } from './metal-economy';
import type { MetalEconomy } from './metal-economy';
import type { MetalPrice } from './cost-per-kw';

export interface BuildEconomyInput {
  /** whole-catalyst loading, mg/cm² */
  loadingMgCm2: number | null;
  /** measured precious-metal loading, mg/cm² */
  metalLoadingMgCm2: number | null;
  /** metal content of the catalyst lot the build was made from, wt % (used when no loading was measured) */
  lotMetalWtPct?: number | null;
  /** metric values of the build's polarization curve of record (jAtRef A/cm² at V_ref, peakPower W/cm²) */
  values: Record<string, unknown>;
}

export interface BuildEconomySettings {
  refVoltage: number;
  metalPrices?: readonly MetalPrice[];
}

export interface BuildEconomy {
  /** mg/cm², or null with `loadingNote` */
  metalLoadingMgCm2: number | null;
  loadingSource: 'measured' | 'lot' | null;
  loadingNote: string | null;
  gPerKw: number | null;
  powerLabel: string | null;
  powerNote: string | null;
  costPerKw: number | null;
  costUnit: string | null;
  priceDate: string | null;
  priceSource: string | null;
  costNote: string | null;
  /** one sentence per figure: how it was obtained */
  method: { loading: string; gPerKw: string; cost: string };
  economy: MetalEconomy | null;
}

const num = (value: unknown): number | null => (typeof value === 'number' && Number.isFinite(value) ? value : null);

/**
 * A build's precious-metal economy.
 * Definition: metal loading = the build's measured metal loading (a loading × metal content from
 * the catalyst's records is not available yet: "needs the catalyst's metal content"), counted as
 * precious only when the project names a precious metal by recording its price; power = V_ref
 * × j at V_ref on the measured cell voltage when the curve reaches V_ref, else the peak power;
 * g/kW and cost per kW by metalEconomy. The loading counts as one priced metal when the project
 * records exactly one metal price; with several prices the split by metal is needed for a cost.
 * Reference: as metalEconomy (unit algebra: 1 mg/W = 1 g/kW).
 * Cost: O(prices).
 * @throws never for stored values (non-finite inputs give nulls with notes).
 * @example buildEconomy({ loadingMgCm2: 1, metalLoadingMgCm2: 0.4, values: { peakPower: 0.5 } }, { refVoltage: 0.6, metalPrices: [ptPrice] }).gPerKw // 0.8
 */
export function buildEconomy(build: BuildEconomyInput, settings: BuildEconomySettings): BuildEconomy {
  const measured = num(build.metalLoadingMgCm2);
  const catalyst = num(build.loadingMgCm2);
  const content = num(build.lotMetalWtPct);
  // a measured loading wins; else catalyst loading × the lot's metal content (mass balance)
  const fromLot = measured === null && catalyst !== null && content !== null && content > 0 && content <= 100 ? (catalyst * content) / 100 : null;
  const metal = measured ?? fromLot;
  const prices = settings.metalPrices ?? [];
  const jAtRef = num(build.values.jAtRef);
  const peak = num(build.values.peakPower);
  const atVoltage = jAtRef !== null && jAtRef > 0 ? settings.refVoltage * jAtRef : null;
  const power = atVoltage ?? (peak !== null && peak > 0 ? peak : null);
  const powerLabel = atVoltage !== null ? `at ${settings.refVoltage} V` : power !== null ? 'at peak power (highest measured)' : null;
  const method = {
    loading: measured !== null || fromLot === null ? 'the build’s measured precious-metal loading, mg/cm² of active area' : `catalyst loading ${catalyst} mg/cm² × the lot’s metal content ${content} wt % ÷ 100, mg/cm² of active area`,
    gPerKw: `g of precious metal per kW = metal loading (mg/cm²) ÷ power density (W/cm²), ${atVoltage !== null ? `at V_ref = ${settings.refVoltage} V (P = V·j)` : 'at peak power (highest measured j·V), the curve not reaching V_ref'}`,
    cost: 'cost per kW = g/kW × price per g, with the price’s date and source as the project recorded it (entered by hand, never fetched)',
  };
  const empty: BuildEconomy = {
    metalLoadingMgCm2: metal, loadingSource: measured !== null ? 'measured' : fromLot !== null ? 'lot' : null, loadingNote: null, gPerKw: null, powerLabel, powerNote: null,
    costPerKw: null, costUnit: null, priceDate: null, priceSource: null, costNote: null, method, economy: null,
  };
  if (metal === null) return { ...empty, loadingNote: 'needs the catalyst’s metal content (or a measured metal loading)', powerNote: 'needs the metal loading', costNote: 'needs the metal loading' };
  // the project names its precious metals by pricing them; a metal loading of a PGM-free catalyst (Fe, Co) is not one
  if (prices.length === 0) {
    const why = 'no precious metal named: a PI records each precious metal with its price in the project settings (none for a PGM-free electrode)';
    return { ...empty, loadingSource: null, metalLoadingMgCm2: null, loadingNote: why, powerNote: why, costNote: why };
  }
  if (power === null) return { ...empty, powerNote: 'needs a polarization curve that reaches V_ref or gives a peak power', costNote: 'needs g/kW' };
  const priced = prices.length === 1 ? prices[0]! : null;
  const metalName = priced?.metal ?? prices.map((p) => p.metal).join('+');
  let economy: MetalEconomy;
  try {
    economy = metalEconomy({ electrodes: [{ electrode: 'MEA', metals: [{ metal: metalName, loadingMgCm2: metal }] }], powerDensityWcm2: power, powerLabel: powerLabel!, prices: priced ? [priced] : undefined });
  } catch (error) {
    if (!(error instanceof RangeError)) throw error;
    return { ...empty, costNote: error.message.replace(/^\w+: /, '') };
  }
  const result: BuildEconomy = { ...empty, gPerKw: economy.gPerKw, economy };
  if (!priced) result.costNote = `needs the catalyst’s metal content per metal to price ${prices.map((p) => p.metal).join(' and ')} separately`;
  else if (economy.cost) {
    result.costPerKw = economy.cost.costPerKw;
    result.costUnit = economy.cost.unit;
    result.priceDate = priced.date;
    result.priceSource = priced.source;
  }
  return result;
}
