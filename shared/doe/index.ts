// Designed experiments in one import: coded units, design generators, the response-surface
// model (fit, prediction, desirability) and next-build proposals. Pure code, used by the
// server routes and by the browser for what-if plots without a round trip.
export * from './coding';
export * from './designs/index';
export * from './model/index';
export * from './proposals/index';
export * from './limits/index';
