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
export { factorName, factorWithUnit, columnLabel, termLabel, roundForText } from './labels';
export { checkModelSupport, type ModelSupport, type AliasedColumn } from './support';
export { modelQuality, QUALITY_RATIO_GOOD, QUALITY_RATIO_POOR, type ModelQuality, type QualityVerdict } from './quality';
export { surfaceEffects, type Effect, type EffectKind } from './effects';
export { checkSupport, type SupportCheck } from './trust-region';
export { chooseModel, MODEL_CHOICE_RULE, type ModelChoice, type ModelCandidate, type CandidateName, type ChooseModelInput } from './choose-model';
