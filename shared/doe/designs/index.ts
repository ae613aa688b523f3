// Public face of the experimental-design generators: call generateDesign with a request and
// get a finished, randomised design back; designToCsv turns it into a file for the lab.
export { generateDesign } from './finish-design';
export { designToCsv } from './design-to-csv';
export { codedToActual } from './coded-to-actual';
export { DesignInputError } from './design-input-error';
export { fullFactorial2, MAX_DESIGN_RUNS } from './full-factorial-2';
export { fractionalFactorial, parseGenerators, definingWords, aliasChains, DEFAULT_GENERATORS } from './fractional-factorial';
export { fullFactorial3 } from './full-factorial-3';
export { centralComposite, rotatableAlpha, orthogonalAlpha } from './central-composite';
export { boxBehnken } from './box-behnken';
export { latinHypercube, minPairwiseDistance } from './latin-hypercube';
export { FACTOR_LETTERS } from './factor-letters';
export { blockTwoLevel } from './block-two-level';
export { checkDesignRequest } from './validate-design-request';
export type {
  AliasChain,
  BlockBy,
  CcdAlpha,
  CcdVariant,
  CoreDesign,
  CorePoint,
  Design,
  DesignFactor,
  DesignInfo,
  DesignKind,
  DesignRequest,
  DesignRun,
  PointType,
} from './types';
export type { ParsedGenerator, SignedWord } from './fractional-factorial';
export type { TwoLevelBlocking } from './block-two-level';
export type { CheckedDesignRequest } from './validate-design-request';
