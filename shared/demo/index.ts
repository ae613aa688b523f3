// Invented demo data: series of polarization curves, impedance spectra, an open-circuit hold and
// an accelerated test with a failure onset — pure generators, seeded, for the demo seed and tests.
export { demoTemperatureSeries, demoPressureSeries } from './series-curves';
export type { DemoSeriesMember, DemoSeriesCommon, DemoTemperatureSeriesOptions, DemoPressureSeriesOptions } from './series-curves';
export { demoImpedanceSpectrum } from './impedance-spectra';
export type { DemoImpedanceOptions, DemoImpedanceSpectrum } from './impedance-spectra';
export { demoOcvHold } from './ocv-hold';
export type { DemoOcvHoldOptions } from './ocv-hold';
export { demoAcceleratedTest } from './accelerated-test';
export type { DemoAcceleratedTestOptions } from './accelerated-test';
