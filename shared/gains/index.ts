// Gains waterfall: step-by-step change of a response along a chain of builds, with noise intervals.
export { computeGains } from './compute-gains';
export type { GainsInput, GainsResult, GainStep, GainStepInput, GainMethod } from './compute-gains';
export { welchInterval } from './welch';
export type { WelchInterval } from './welch';
export { pooledReplicateSd } from './pooled-sd';
export type { PooledSd } from './pooled-sd';
export { summarizeSample } from './sample-summary';
export type { SampleSummary } from './sample-summary';
export { classifySteps, isTestConditionChange } from './classify-steps';
export type { ChangeClass, ClassifiedStep, StepChange, StepClasses } from './classify-steps';
