// Open-circuit holds: voltage decay (mV/h) and loss (mV) after a stated settling rule.
export { holdMetrics, DEFAULT_HOLD_RULE } from './hold-metrics';
export type { HoldInput, HoldMetrics, HoldRule } from './hold-metrics';
