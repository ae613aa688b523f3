// Public API of curve files: sniff and decode bytes, parse delimited text, guess and apply a
// column mapping, step-average, polarization metrics, and the semi-empirical model.
export * from './types';
export { sniffBytes, decodeText, createChunkDecoder } from './sniff';
export type { SniffedKind, ChunkDecoder } from './sniff';
export { createDelimitedParser, parseDelimitedText } from './parse-delimited';
export type { DelimitedParser, DelimitedParserOptions } from './parse-delimited';
export { readConditions, mergeConditions, splitMetadataLine, STANDARD_ATMOSPHERE_KPA, AREA_RANGE_CM2 } from './read-conditions';
export type { MetadataPair } from './read-conditions';
export { detectMapping, findUnitSlips } from './detect-mapping';
export type { MappingDetection, ColumnReading, DetectMappingOptions } from './detect-mapping';
export { voltageSlip, currentSlip, hfrSlip, PLAUSIBLE } from './unit-plausibility';
export type { UnitSlip } from './unit-plausibility';
export { countCurrentLevels } from './current-levels';
export type { CurrentLevel, CurrentLevelsOptions, CurrentLevelsResult } from './current-levels';
export { checkEnoughData, checkHoursAfterBreakIn, MIN_POLARIZATION_STEPS, MIN_DURABILITY_POINTS, MIN_HOURS_AFTER_BREAK_IN } from './check-enough-data';
export { compareConditions, canonicalGas } from './compare-conditions';
export type { ConditionField, ConditionMismatch, BuildConditionRecord } from './compare-conditions';
export { importNotes } from './import-notes';
export { applyMapping } from './apply-mapping';
export type { AppliedCurve, ApplyMappingOptions, TimeReset } from './apply-mapping';
export { stepAverage } from './step-average';
export type { CurveStep, CurveSweep, StepAverageOptions, StepAverageResult } from './step-average';
export { polarizationMetrics } from './polarization-metrics';
export type { PolarizationMetricsOptions } from './polarization-metrics';
export {
  GAS_CONSTANT,
  FARADAY_CONSTANT,
  tafelSlopeTheory,
  semiEmpiricalVoltage,
  mulberry32,
  generatePolarizationCurve,
  writeCurveCsv,
} from './semi-empirical';
export type { SemiEmpiricalParams, GenerateCurveOptions, CurveCsvShape, WriteCurveCsvOptions } from './semi-empirical';
export * from './metric-catalogue';
