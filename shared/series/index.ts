// Series analyses across builds: apparent activation energy (temperature series), apparent
// reaction order (pressure or concentration series), the current at a fixed iR-free voltage, and
// the choice of builds that differ only in the series variable.
export { slopeWithInterval } from './slope-interval';
export { activationEnergy } from './activation-energy';
export type { TemperaturePoint, ActivationEnergyOptions } from './activation-energy';
export { reactionOrder } from './reaction-order';
export type { PressurePoint, ReactionOrderOptions } from './reaction-order';
export { currentAtIrFreeVoltage } from './current-at-voltage';
export type { CurvePoints, CurrentAtVoltage, CurrentAtVoltageOptions } from './current-at-voltage';
export { pickSeries } from './pick-series';
export type { SeriesCandidate, SeriesMismatch, SeriesSelection, PickSeriesOptions } from './pick-series';
export { analyseSeries } from './analyse-series';
export type { SeriesAnalysis, SeriesMember, SeriesRequest } from './analyse-series';
export type { SeriesPoint, SeriesResult, SlopeInterval } from './types';
