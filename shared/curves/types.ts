// Shared shapes for curve files, parsed columns and the metrics pulled from them.
// Units inside the code: A/cm², V, Ω·cm², °C, mg/cm², hours.
import type { CURVE_METRICS, CurveMetricKey } from './metric-catalogue';

export type CurveKind = 'polarization' | 'durability' | 'hold' | 'impedance';

export type CurrentUnit = 'A/cm2' | 'mA/cm2' | 'A' | 'mA';
export type VoltageUnit = 'V' | 'mV';
export type HfrUnit = 'ohm*cm2' | 'mohm*cm2' | 'ohm' | 'mohm';
export type TimeUnit = 's' | 'min' | 'h' | 'timestamp';
export type TemperatureUnit = 'C' | 'K';

/**
 * Which column (0-based index into the header) holds which quantity, and in what unit.
 * A curve needs a cell voltage (`voltage`) or an iR-free voltage (`voltageIrFree`), or both.
 */
export interface ColumnMapping {
  /**
   * `negated`: the file logs load current as negative and every value is multiplied by −1;
   * left out, a column that is entirely ≤ 0 is flipped (and said so), one that is not stays.
   */
  current?: { column: number; unit: CurrentUnit; negated?: boolean };
  /** the measured cell voltage */
  voltage?: { column: number; unit: VoltageUnit };
  /** a voltage the file has already corrected for the ohmic loss (V + j·HFR) */
  voltageIrFree?: { column: number; unit: VoltageUnit };
  hfr?: { column: number; unit: HfrUnit };
  time?: { column: number; unit: TimeUnit };
  temperature?: { column: number; unit: TemperatureUnit };
  /** impedance spectra: frequency, Z′ and Z″ (or |Z| and phase); see ImpedanceMapping */
  frequency?: ImpedanceMapping['frequency'];
  zReal?: ImpedanceMapping['zReal'];
  zImag?: ImpedanceMapping['zImag'];
  magnitude?: ImpedanceMapping['magnitude'];
  phase?: ImpedanceMapping['phase'];
}

/**
 * The columns of an impedance spectrum. `zImag.negatedHeader`: the header writes −Z″ (the sign is
 * detected from the values either way). |Z| with phase stands in for Z′ and Z″.
 */
export interface ImpedanceMapping {
  frequency: { column: number; unit: 'Hz' | 'kHz' | 'MHz' | 'rad/s' };
  zReal?: { column: number; unit: HfrUnit };
  zImag?: { column: number; unit: HfrUnit; negatedHeader?: boolean };
  magnitude?: { column: number; unit: HfrUnit };
  phase?: { column: number; unit: 'deg' | 'rad' };
}

/** Conditions read from a file's metadata lines (or a workbook's key–value sheet), when present. */
export interface FileConditions {
  areaCm2?: number;
  /** the area as written when it was not a plain number of cm² (e.g. "5 cm x 5 cm") */
  areaStated?: string;
  temperatureC?: number;
  anodeGas?: string;
  cathodeGas?: string;
  /** back-pressure, kPa ABSOLUTE (a gauge reading plus the standard atmosphere, 101.325 kPa) */
  backPressureKPa?: number;
  /** the back-pressure as written, e.g. "50 kPag", "150 kPa(a)", "1.5 barg" */
  backPressureStated?: string;
  /** what the file said the reading is; `unstated` readings are assumed (see `notes`) */
  backPressureBasis?: 'absolute' | 'gauge' | 'unstated';
  /** how the conditions were read, in sentences (dimensions multiplied, gauge converted, …) */
  notes?: string[];
  /** every "key: value" / "key,value" pair found above the header, as text */
  raw: Record<string, string>;
}

/** Curve data in internal units, ready for metrics. Arrays have equal length, in file order.
 * `v` may hold NaN (all NaN when the file gives only an iR-free voltage). */
export interface CurveData {
  kind: CurveKind;
  /** current density, A/cm² */
  j: Float64Array;
  /** cell voltage, V */
  v: Float64Array;
  /** high-frequency resistance, Ω·cm² (area-specific); NaN where a reading is missing */
  hfr?: Float64Array;
  /** the file's own iR-free voltage column, V; NaN where missing (then `v` may be all NaN) */
  vIrFree?: Float64Array;
  /** elapsed time, hours from the first row */
  tHours?: Float64Array;
  /** cell temperature, °C */
  temperatureC?: Float64Array;
  /** impedance spectra: frequency, Hz (falling), and Z′, Z″ in Ω·cm² with Z″ = Im Z; j and v are then NaN */
  frequencyHz?: Float64Array;
  zReal?: Float64Array;
  zImag?: Float64Array;
}

/** The project's reference point: where metrics are read off every curve. */
export interface ReferencePoint {
  /** j_ref, A/cm² */
  refCurrentDensity: number;
  /** V_ref, V */
  refVoltage: number;
  /** read mass activity (and jAtRef for display) on iR-free voltage */
  irFree: boolean;
  /** loading basis for mass-specific activity */
  loadingBasis: 'catalyst' | 'metal';
}

/** Loading of the build the curve belongs to. */
export interface BuildLoading {
  /** whole-catalyst loading, mg/cm² */
  loadingMgCm2: number | null;
  /** metal-only loading, mg/cm² (needed when loadingBasis = 'metal') */
  metalLoadingMgCm2?: number | null;
}

type PolarizationMetricKey = { [K in CurveMetricKey]: 'polarization' extends (typeof CURVE_METRICS)[K]['kinds'][number] ? K : never }[CurveMetricKey];

/**
 * The metrics object of a curve, keyed and unit-fixed by the catalogue (metric-catalogue.ts):
 * every polarization metric is present, the other kinds' metrics when that kind computed them.
 * null = could not be computed (see metricNotes).
 */
export type CurveMetrics = { [K in PolarizationMetricKey]: number | null } & { [K in Exclude<CurveMetricKey, PolarizationMetricKey>]?: number | null };

export type MetricKey = CurveMetricKey;

/** How one metric was obtained: a short human sentence plus the inputs used. */
export interface MetricMethod {
  method: string;
  inputs: Record<string, number | string | boolean | null>;
}

export interface MetricsResult {
  metrics: CurveMetrics;
  /** reason per metric that is null, or a caveat for one that is not */
  metricNotes: Partial<Record<MetricKey, string>>;
  method: Partial<Record<MetricKey, MetricMethod>>;
  /** extra facts about the curve (sweeps, steps averaged, outliers flagged, ...) */
  summary: Record<string, number | string | boolean | null>;
}

/** A problem with a file: code, human message, and where (1-based line, column name or index). */
export class CurveFileError extends Error {
  readonly code: string;
  readonly line?: number;
  readonly column?: number | string;
  constructor(code: string, message: string, where: { line?: number; column?: number | string } = {}) {
    super(message);
    this.name = 'CurveFileError';
    this.code = code;
    this.line = where.line;
    this.column = where.column;
  }
}

// ---- Added with the delimited-text parser (new types only; the ones above are unchanged). ----

/** How cells are separated in a text file; 'whitespace' means runs of spaces and/or tabs. */
export type Delimiter = ',' | ';' | '\t' | '|' | 'whitespace';

/**
 * What a column holds: numbers; date-times (kept as epoch seconds, UTC when no zone is given);
 * durations `H:MM:SS` (kept as seconds); text (ignored); or nothing at all (ignored).
 */
export type ColumnKind = 'number' | 'timestamp' | 'duration' | 'text' | 'empty';

/** A delimited text file read into columns. Lines are 1-based file lines. */
export interface ParsedTable {
  delimiter: Delimiter;
  /** numbers are written with a decimal comma (0,652) */
  decimalComma: boolean;
  /** 1-based line of the header row */
  headerLine: number;
  /** 1-based line of a separate unit row right under the header, merged into `header`; null if none */
  unitLine: number | null;
  /** column names as written (with the unit row merged as "name (unit)"), trailing empty columns dropped */
  header: string[];
  /** conditions read from metadata lines above the header */
  conditions: FileConditions;
  /** one entry per header column: values for number/timestamp/duration columns, null for ignored ones */
  columns: (Float64Array | null)[];
  columnKinds: ColumnKind[];
  /** indices of the text/empty columns that were ignored */
  ignoredColumns: number[];
  rowCount: number;
  /** 1-based line of the first data row */
  firstDataLine: number;
  /** the 1-based file line of each data row, so later errors can name lines */
  dataLines: Int32Array;
  /** the first data rows as text cells (trimmed), one array per row, header-length each */
  preview: string[][];
  /**
   * per header column: cells that held no number (blank, NaN, n/a, …) and are stored as NaN;
   * null when there were none. Whether that is allowed depends on the quantity (applyMapping).
   */
  missingCells?: ({ count: number; firstLine: number; firstText: string } | null)[];
  /** lines after the end of the table (summary blocks, end-of-test lines), left out */
  afterTable?: { firstLine: number; lastLine: number; lineCount: number; samples: string[] } | null;
  /** text lines inside the data (not comments, not data), skipped */
  skippedLines?: { count: number; lines: number[]; samples: string[] } | null;
  /** per header column: how many cells were written with thousands separators ("1.000,0", "1,000.0") */
  groupedCells?: number[];
  /** the decimal mark was decided on cells that could also be thousands separators ("1,500") */
  decimalMarkAmbiguous?: boolean;
  /**
   * per header column (as `columns`): the extremes of its values as read, worked out piece by piece
   * while the rows came in (null for ignored columns). Absent for a table built otherwise, and
   * dropped once a mapping converts the columns in place.
   */
  columnSummaries?: (ColumnSummary | null)[];
}

/** The extremes of a column's values, blank cells (NaN) passed over. */
export interface ColumnSummary {
  min: number;
  max: number;
  /** the largest |value| (0 when every value is blank) */
  maxAbs: number;
  /** values that are not blank */
  finite: number;
}
