// Physical limits on predicted responses: the reversible cell voltage and non-negative currents.
export { reversibleCellVoltage } from './reversible-voltage';
export { limitsAt, boundPrediction, type LimitContext, type LimitAtPoint, type BoundedValue } from './response-limits';
