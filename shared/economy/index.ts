// Precious-metal economy: loading per electrode and in total, g of metal per kW at a stated power,
// and cost per kW from prices the project records by hand.
export { preciousMetalLoading } from './metal-loading';
export type { ElectrodeLoading, ElectrodeMetalLoading, MetalContent, MetalLoadingResult } from './metal-loading';
export { specificMetalUse } from './specific-metal-use';
export { ratedPower } from './rated-power';
export type { PowerBasis, RatedPower } from './rated-power';
export { costPerKw } from './cost-per-kw';
export type { CostPerKw, MetalPrice } from './cost-per-kw';
export { metalEconomy } from './metal-economy';
export type { MetalEconomy, MetalEconomyInput } from './metal-economy';
export { buildEconomy } from './build-economy';
export type { BuildEconomy, BuildEconomyInput, BuildEconomySettings } from './build-economy';
