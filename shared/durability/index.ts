// Durability logs: degradation rate after break-in, interruptions, plotting and invented test logs.
export { durabilityMetrics } from './degradation-rate';
export type { DurabilityMetrics, DurabilityOptions, DurabilitySegment, DurabilityWindow, HoursWindow } from './degradation-rate';
export { detectBreakIn } from './detect-break-in';
export type { BreakInOptions, BreakInResult } from './detect-break-in';
export { detectInterruptions } from './detect-interruptions';
export type { Interruption, InterruptionKind, InterruptionOptions } from './detect-interruptions';
export { fitTrend } from './trend-fit';
export type { TrendFit, TrendFitOptions, TrendSegment } from './trend-fit';
export { downsampleForPlot } from './downsample';
export type { DownsampleOptions } from './downsample';
export { generateSyntheticLog } from './synthetic-log';
export type { SyntheticLogOptions } from './synthetic-log';
export { writeDurabilityCsv, DURABILITY_CSV_HEADER } from './write-durability-csv';
export { mulberry32, normalGenerator } from '../stats/random';
export { lowerBound, upperBound } from './sorted-search';
export { TYPICAL_DEGRADATION_BAND } from './typical-band';
export { checkBreakInTransient } from './break-in-transient';
export type { TransientCheck, TransientOptions } from './break-in-transient';
