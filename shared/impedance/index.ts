// Impedance spectra: sign convention and units, high-frequency intercept, analytic circuit
// impedance, equivalent-circuit fit by complex nonlinear least squares, Bode points and metrics.
export type { ImpedanceSpectrum, CircuitKind, CircuitParameters, CircuitParameterKey } from './types';
export { detectSignConvention } from './sign-convention';
export type { SignConvention } from './sign-convention';
export { normaliseSpectrum } from './normalise-spectrum';
export type { RawSpectrum, NormaliseOptions, NormalisedSpectrum } from './normalise-spectrum';
export { sortSpectrum } from './prepare-spectrum';
export type { SortedSpectrum } from './prepare-spectrum';
export { circuitImpedance, circuitDerivatives, CIRCUIT_PARAMETERS } from './circuit-impedance';
export type { ComplexArrays } from './circuit-impedance';
export { leastSquares } from './levenberg-marquardt';
export type { LeastSquaresProblem, LeastSquaresOptions, LeastSquaresResult } from './levenberg-marquardt';
export { fitCircuit, SpectrumFitError } from './fit-circuit';
export type { CircuitFit, CircuitFitOptions, FittedParameter } from './fit-circuit';
export { highFrequencyIntercept } from './hfr-intercept';
export type { HighFrequencyIntercept } from './hfr-intercept';
export { bode } from './bode';
export type { BodePoints } from './bode';
export { impedanceMetrics } from './impedance-metrics';
export type { ImpedanceMetricsResult, ImpedanceMetricValues, ImpedanceMetricKey } from './impedance-metrics';
export { detectImpedanceColumns, looksLikeImpedance, impedanceUnit } from './detect-columns';
export type { ImpedanceColumnDetection } from './detect-columns';
export { spectrumFromTable, MIN_SPECTRUM_POINTS } from './spectrum-from-table';
export type { SpectrumFromTable } from './spectrum-from-table';
