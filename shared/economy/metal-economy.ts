// A build's precious-metal figures in one call: loading per electrode and in total, g/kW at the
// stated power, and cost per kW from the recorded prices.
import { preciousMetalLoading } from './metal-loading';
import type { ElectrodeLoading, MetalLoadingResult } from './metal-loading';
import { specificMetalUse } from './specific-metal-use';
import { costPerKw } from './cost-per-kw';
import type { CostPerKw, MetalPrice } from './cost-per-kw';

export interface MetalEconomyInput {
  electrodes: readonly ElectrodeLoading[];
  /** power density the figures are quoted at, W/cm² (ratedPower), or null when the curve does not give it */
  powerDensityWcm2: number | null;
  /** the condition of that power, e.g. "at 0.6 V" (ratedPower().label) */
  powerLabel: string;
  prices?: readonly MetalPrice[];
}

export interface MetalEconomy {
  loading: MetalLoadingResult;
  /** g of all precious metal per kW, or null without a power density (or a PGM-free MEA) */
  gPerKw: number | null;
  /** g/kW per metal */
  gPerKwByMetal: Record<string, number>;
  powerDensityWcm2: number | null;
  powerLabel: string;
  /** null when no prices were given */
  cost: CostPerKw | null;
  notes: string[];
}

/**
 * Precious-metal economy of one build.
 * Definition: loading by preciousMetalLoading; g/kW = loading (mg/cm²) / power density (W/cm²) for
 * the total and for each metal (specificMetalUse); cost per kW by costPerKw. A PGM-free MEA has no
 * precious metal: g/kW is null with a note rather than 0 g/kW.
 * Reference: as preciousMetalLoading, specificMetalUse and costPerKw.
 * Cost: O(electrodes × metals).
 * @throws RangeError as those functions, or when the power density is given but not positive.
 * @example metalEconomy({ electrodes, powerDensityWcm2: 0.5, powerLabel: 'at peak power (highest measured)' }).gPerKw
 */
export function metalEconomy(input: MetalEconomyInput): MetalEconomy {
  if (input === null || typeof input !== 'object') throw new RangeError('metalEconomy: input must be an object');
  const loading = preciousMetalLoading(input.electrodes);
  const power = input.powerDensityWcm2;
  if (power !== null && !(Number.isFinite(power) && power > 0)) throw new RangeError(`metalEconomy: powerDensityWcm2 must be a positive number of W/cm² or null, got ${power}`);
  const label = typeof input.powerLabel === 'string' && input.powerLabel.trim() !== '' ? input.powerLabel.trim() : 'at the stated power';
  const notes: string[] = [];
  const gPerKwByMetal: Record<string, number> = {};
  let gPerKw: number | null = null;
  if (loading.totalMgCm2 === 0) {
    notes.push('no precious metal recorded on this MEA (PGM-free): no g/kW');
  } else if (power === null) {
    notes.push(`no power density ${label}: no g/kW`);
  } else {
    gPerKw = specificMetalUse(loading.totalMgCm2, power);
    for (const [metal, value] of Object.entries(loading.byMetal)) gPerKwByMetal[metal] = specificMetalUse(value, power);
  }
  let cost: CostPerKw | null = null;
  if (input.prices !== undefined && gPerKw !== null) {
    cost = costPerKw(gPerKwByMetal, input.prices);
    notes.push(...cost.notes.filter((note) => note.startsWith('no price')));
  }
  return { loading, gPerKw, gPerKwByMetal, powerDensityWcm2: power, powerLabel: label, cost, notes };
}
