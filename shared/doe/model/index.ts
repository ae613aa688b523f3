// Response-surface modelling: terms, fitting, prediction, canonical analysis, desirability.
export type * from './types';
export { DoeInputError, type DoeErrorCode } from './errors';
export { buildModelTerms, parseTerm, termName, modelRow, type ModelTerms } from './terms';
export { encodePoint, decodeValue } from './encode';
export { fitSurface, type FitSurfaceInput } from './fit';
export { predict, isExtrapolation, checkExtrapolation, type Prediction, type ExtrapolationCheck } from './predict';
export { canonicalAnalysis, type CanonicalAnalysis, type StationaryNature } from './canonical';
export {
  individualDesirability,
  overallDesirability,
  paretoSet,
  type DesirabilityGoal,
  type ParetoGoal,
} from './desirability';
