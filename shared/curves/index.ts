// Public API of curve files: sniff and decode bytes, parse delimited text, guess and apply a
// column mapping, step-average, polarization metrics, and the semi-empirical model.
export * from './types';
export { sniffBytes, decodeText, createChunkDecoder } from './sniff';
export type { SniffedKind, ChunkDecoder } from './sniff';
export { createDelimitedParser, parseDelimitedText } from './parse-delimited';
export type { DelimitedParser, DelimitedParserOptions } from './parse-delimited';
export { readConditions, splitMetadataLine } from './read-conditions';
export type { MetadataPair } from './read-conditions';
export { detectMapping } from './detect-mapping';
export type { MappingDetection, ColumnReading } from './detect-mapping';
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
