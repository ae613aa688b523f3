// Parsed table + confirmed column mapping → CurveData in internal units (A/cm², V, Ω·cm²,
// hours, °C), refusing values no cell can produce and naming the line and column.
import { CurveFileError } from './types';
import type { ColumnMapping, CurveData, CurveKind, CurrentUnit, HfrUnit, ParsedTable, TemperatureUnit, TimeUnit, VoltageUnit } from './types';
import { currentDensityFactor } from '../units/current-density';
import { voltageFactor } from '../units/voltage';
import { hfrFactor } from '../units/area-specific-resistance';
import { hoursFactor } from '../units/elapsed-time';
import { ZERO_CELSIUS_K } from '../units/temperature';
import { PLAUSIBLE } from './unit-plausibility';
import { findUnitSlips } from './detect-mapping';

/** Where the time column started again near zero (a station restart); hours are carried on. */
export interface TimeReset {
  /** 0-based row index of the first reading after the restart */
  row: number;
  /** 1-based file line of that reading */
  line: number;
  /** elapsed hours given to that reading, continuing from the previous segment */
  atHours: number;
  /** the file's time value before and after the restart, in hours */
  fromHours: number;
  toHours: number;
}

/** CurveData plus what was done on the way in. */
export interface AppliedCurve extends CurveData {
  /** the area used for total current / cell resistance, cm², or null when none was needed */
  areaCm2: number | null;
  timeResets: TimeReset[];
  /** 1-based file line of each row (copied from the table) */
  dataLines: Int32Array;
  notes: string[];
}

export interface ApplyMappingOptions {
  kind: CurveKind;
  /** active area in cm²; overrides the area read from the file's metadata */
  areaCm2?: number | null;
  /**
   * convert each mapped column in place instead of copying it (the table's columns then hold
   * internal units): for big logs, where a copy per column is the memory peak of an upload
   */
  reuseColumns?: boolean;
}

// Limits of what a single cell can show (common practice in the trade): the H2/O2 reversible
// voltage is ~1.23 V, no cell holds 2 V; ~5 A/cm² is beyond any PEM cell's limiting current;
// a negative current beyond −50 mA/cm² is a reversed sign, not a crossover current.
const MAX_CELL_VOLTAGE_V = PLAUSIBLE.maxCellVoltageV;
const MIN_CURRENT_DENSITY = -0.05;
const MAX_CURRENT_DENSITY = PLAUSIBLE.maxCurrentDensity;
const MAX_HFR_OHM_CM2 = 10;
// A time value this small against the previous one is a restart from zero, not disorder.
const RESTART_FRACTION = 0.05;
// Readings of the other sign smaller than this share of the column's largest are noise.
const SIGN_NOISE = 0.02;
// |j| up to this is open circuit for the purpose of a missing HFR (there is no current to measure it with).
const OPEN_CIRCUIT_J = 0.001;

const CURRENT_UNITS: readonly CurrentUnit[] = ['A/cm2', 'mA/cm2', 'A', 'mA'];
const VOLTAGE_UNITS: readonly VoltageUnit[] = ['V', 'mV'];
const HFR_UNITS: readonly HfrUnit[] = ['ohm*cm2', 'mohm*cm2', 'ohm', 'mohm'];
const TIME_UNITS: readonly TimeUnit[] = ['s', 'min', 'h', 'timestamp'];
const TEMPERATURE_UNITS: readonly TemperatureUnit[] = ['C', 'K'];

const UNIT_LABEL: Readonly<Record<string, string>> = {
  'A/cm2': 'A/cm²',
  'mA/cm2': 'mA/cm²',
  A: 'A',
  mA: 'mA',
  V: 'V',
  mV: 'mV',
  'ohm*cm2': 'Ω·cm²',
  'mohm*cm2': 'mΩ·cm²',
  ohm: 'Ω',
  mohm: 'mΩ',
  s: 's',
  min: 'min',
  h: 'h',
  timestamp: 's',
  C: '°C',
  K: 'K',
};

function formatValue(value: number): string {
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  if (magnitude >= 1e6 || magnitude < 1e-4) return value.toExponential(3);
  return String(Number(value.toPrecision(6)));
}

function checkColumn(table: ParsedTable, role: string, entry: { column: number; unit: string } | undefined, units: readonly string[]): Float64Array | null {
  if (entry === undefined) return null;
  if (entry === null || typeof entry !== 'object' || !Number.isInteger(entry.column) || entry.column < 0 || entry.column >= table.header.length) {
    throw new CurveFileError('bad-mapping', `mapping: ${role} column ${String(entry?.column)} is not one of the ${table.header.length} columns`, {
      line: table.headerLine,
    });
  }
  if (!units.includes(entry.unit)) {
    throw new CurveFileError('bad-mapping', `mapping: ${role} unit "${String(entry.unit)}" is not one of ${units.join(', ')}`, {
      line: table.headerLine,
      column: table.header[entry.column],
    });
  }
  const values = table.columns[entry.column];
  if (values === null || values === undefined) {
    throw new CurveFileError('bad-mapping', `line ${table.headerLine}, column "${table.header[entry.column]}": holds text, not numbers; it cannot be the ${role}`, {
      line: table.headerLine,
      column: table.header[entry.column],
    });
  }
  return values;
}

// "lines 5, 9, 14 and 3 more"
function lineList(lines: readonly number[], total: number): string {
  const shown = lines.slice(0, 5).join(', ');
  return total > 5 ? `${shown} and ${total - 5} more` : shown;
}

// The file's own wording of a cell that held no number, for messages.
function missingCellError(table: ParsedTable, column: number): CurveFileError | null {
  const entry = table.missingCells?.[column];
  if (entry === null || entry === undefined) return null;
  const name = table.header[column];
  const what = entry.firstText.length === 0 ? 'empty cell' : `not a number ("${entry.firstText}")`;
  return new CurveFileError('bad-number', `line ${entry.firstLine}, column "${name}": ${what}`, { line: entry.firstLine, column: name });
}

/**
 * Converts the mapped columns to internal units and checks every value.
 * Current → A/cm² (total A or mA ÷ area; load current logged negative is flipped: always with
 * `negated`, and by itself when the column is ≤ 0 throughout), voltage → V, the file's own
 * iR-free voltage → `vIrFree` (V; with no measured voltage, `v` = vIrFree − j·HFR where HFR
 * is known, else NaN), HFR → Ω·cm² (Ω or mΩ × area; readings of 0 and blank cells are missing,
 * NaN), time → hours elapsed from the first row, temperature → °C (blank → NaN). The area is
 * `options.areaCm2`, else the file's `Active area` line.
 * Refused (CurveFileError, with line and column): an empty or non-numeric cell in the voltage,
 * current or time column; |V| > 2 V; j < −0.05 A/cm² or > 5 A/cm²; HFR < 0 or > 10 Ω·cm²; a
 * column whose values cannot be what its unit says (`unit-slip`: volts under mV, mV under V,
 * a current no cell carries, an HFR no cell shows — with the likely unit); temperature below
 * absolute zero; time going backwards, except a restart near zero (kept, hours carried on
 * from the previous segment, listed in `timeResets`).
 * A polarization curve needs a current column; a hold without one gets j = 0, a durability
 * log without one gets j = NaN (the current is then the build's, not the file's).
 * Reference: limits are common practice in the trade for single PEM cells.
 * Cost: O(rows) time, one Float64Array per mapped quantity.
 * @throws CurveFileError `bad-mapping`, `bad-area`, `area-required`, `missing-current`,
 *   `bad-number`, `impossible-value`, `unit-slip`, `time-backwards`.
 * @example applyMapping(table, { current: { column: 0, unit: 'mA/cm2' }, voltage: { column: 1, unit: 'V' } }, { kind: 'polarization' }).j
 */
export function applyMapping(table: ParsedTable, mapping: ColumnMapping, options: ApplyMappingOptions): AppliedCurve {
  if (table === null || typeof table !== 'object' || !Array.isArray(table.columns)) throw new TypeError('applyMapping: table must be a ParsedTable');
  if (mapping === null || typeof mapping !== 'object') throw new CurveFileError('bad-mapping', 'mapping: no column mapping given');
  if (options === null || typeof options !== 'object' || !['polarization', 'durability', 'hold'].includes(options.kind)) {
    throw new CurveFileError('bad-mapping', `mapping: kind must be polarization, durability or hold, got ${String(options?.kind)}`);
  }
  const kind = options.kind;
  const notes: string[] = [];
  const rowCount = table.rowCount;
  const lines = table.dataLines;

  if (mapping.voltage === undefined && mapping.voltageIrFree === undefined) {
    throw new CurveFileError('bad-mapping', 'mapping: a voltage column (measured or iR-free) is required', { line: table.headerLine });
  }
  const voltageValues = checkColumn(table, 'voltage', mapping.voltage, VOLTAGE_UNITS);
  const irFreeValues = checkColumn(table, 'iR-free voltage', mapping.voltageIrFree, VOLTAGE_UNITS);
  const currentValues = checkColumn(table, 'current', mapping.current, CURRENT_UNITS);
  const hfrValues = checkColumn(table, 'HFR', mapping.hfr, HFR_UNITS);
  const timeValues = checkColumn(table, 'time', mapping.time, TIME_UNITS);
  const temperatureValues = checkColumn(table, 'temperature', mapping.temperature, TEMPERATURE_UNITS);
  // In-place conversion is safe only for a column that feeds one quantity.
  const mappedColumns = [mapping.voltage, mapping.voltageIrFree, mapping.current, mapping.hfr, mapping.time, mapping.temperature].filter((m) => m !== undefined).map((m) => m!.column);
  const output = (values: Float64Array, column: number): Float64Array =>
    options.reuseColumns === true && mappedColumns.filter((c) => c === column).length === 1 ? values : new Float64Array(rowCount);

  // ---- cells without a number: refused where a value is needed in every row
  let firstMissing: CurveFileError | null = null;
  for (const entry of [mapping.voltage, mapping.current, mapping.time]) {
    if (entry === undefined) continue;
    const error = missingCellError(table, entry.column);
    if (error !== null && (firstMissing === null || (error.line ?? 0) < (firstMissing.line ?? 0))) firstMissing = error;
  }
  if (firstMissing !== null) throw firstMissing;

  // ---- area
  let areaCm2: number | null = null;
  const givenArea = options.areaCm2;
  if (givenArea !== undefined && givenArea !== null) {
    if (typeof givenArea !== 'number' || !Number.isFinite(givenArea) || givenArea <= 0) {
      throw new CurveFileError('bad-area', `area: must be a positive number of cm², got ${String(givenArea)}`);
    }
    areaCm2 = givenArea;
    const fileArea = table.conditions.areaCm2;
    if (fileArea !== undefined && Math.abs(fileArea - givenArea) > 1e-9 * givenArea) {
      notes.push(`area ${givenArea} cm² given with the upload; the file says ${fileArea} cm²; used ${givenArea} cm²`);
    }
  } else if (table.conditions.areaCm2 !== undefined && table.conditions.areaCm2 > 0) {
    areaCm2 = table.conditions.areaCm2;
  }
  const needsArea: { column: number; what: string }[] = [];
  if (mapping.current !== undefined && (mapping.current.unit === 'A' || mapping.current.unit === 'mA')) {
    needsArea.push({ column: mapping.current.column, what: `total current in ${mapping.current.unit}` });
  }
  if (mapping.hfr !== undefined && (mapping.hfr.unit === 'ohm' || mapping.hfr.unit === 'mohm')) {
    needsArea.push({ column: mapping.hfr.column, what: `cell resistance in ${UNIT_LABEL[mapping.hfr.unit]}` });
  }
  if (needsArea.length > 0 && areaCm2 === null) {
    const first = needsArea[0];
    throw new CurveFileError(
      'area-required',
      `line ${table.headerLine}, column "${table.header[first.column]}": ${first.what} needs the active area (cm²); the file does not state it, so give it with the upload`,
      { line: table.headerLine, column: table.header[first.column] },
    );
  }
  const judgingArea = areaCm2;
  if (needsArea.length === 0) areaCm2 = null;

  // ---- unit slips, judged on the file's own values before anything is converted
  const slips = findUnitSlips(table, mapping, kind, judgingArea);
  // the summaries below describe the columns as read, which may now be converted in place
  const summaryOf = (entry: { column: number } | undefined) => (entry === undefined ? null : (table.columnSummaries?.[entry.column] ?? null));
  const currentSummary = summaryOf(mapping.current);
  const voltageSummary = summaryOf(mapping.voltage);
  const temperatureSummary = summaryOf(mapping.temperature);
  if (options.reuseColumns === true) delete table.columnSummaries;
  /**
   * A column converted in place by a factor of 1 whose summary shows every value passes the checks
   * is left as it is: the pass would write each value back unchanged.
   */
  const unchangedInPlace = (values: Float64Array, target: Float64Array, passes: boolean) => target === values && passes;
  if (slips.length > 0) {
    const slip = slips[0];
    const entry = mapping[slip.role] as { column: number };
    const name = table.header[entry.column];
    throw new CurveFileError('unit-slip', `line ${lines[slip.row]}, column "${name}": ${slip.message}`, { line: lines[slip.row], column: name });
  }

  // ---- voltage (measured) and the file's iR-free voltage
  const convertVoltage = (values: Float64Array, entry: { column: number; unit: VoltageUnit }, allowMissing: boolean): Float64Array => {
    const voltageUnit = entry.unit;
    const voltageScale = voltageFactor(voltageUnit);
    const target = output(values, entry.column);
    const voltageName = table.header[entry.column];
    // volts as read, none blank, none beyond a cell's: nothing to convert or refuse
    const summary = entry === mapping.voltage ? voltageSummary : null;
    if (voltageScale === 1 && summary && unchangedInPlace(values, target, summary.finite === rowCount && summary.maxAbs <= MAX_CELL_VOLTAGE_V)) return target;
    for (let row = 0; row < rowCount; row++) {
      const raw = values[row];
      if (raw !== raw && allowMissing) {
        target[row] = Number.NaN;
        continue;
      }
      const volts = raw * voltageScale;
      if (!(Math.abs(volts) <= MAX_CELL_VOLTAGE_V)) {
        const hint =
          voltageUnit === 'V' && Math.abs(raw) <= 2000 ? 'is the column in mV?' : voltageUnit === 'mV' && Math.abs(raw) <= 2e6 ? 'is the column in µV?' : 'is this the right column?';
        throw new CurveFileError(
          'impossible-value',
          `line ${lines[row]}, column "${voltageName}": ${formatValue(raw)} ${UNIT_LABEL[voltageUnit]} is not a possible cell voltage; ${hint}`,
          { line: lines[row], column: voltageName },
        );
      }
      target[row] = volts;
    }
    return target;
  };
  const measured = voltageValues !== null && mapping.voltage !== undefined ? convertVoltage(voltageValues, mapping.voltage, false) : null;
  let vIrFree: Float64Array | null = null;
  if (irFreeValues !== null && mapping.voltageIrFree !== undefined) {
    vIrFree = convertVoltage(irFreeValues, mapping.voltageIrFree, true);
    if (mapping.voltage !== undefined) {
      notes.push(`the file's own iR-free voltage "${table.header[mapping.voltageIrFree.column]}" is kept beside the measured "${table.header[mapping.voltage.column]}"`);
    }
    const blanks = table.missingCells?.[mapping.voltageIrFree.column];
    if (blanks) notes.push(`iR-free voltage "${table.header[mapping.voltageIrFree.column]}" blank or not a number on ${blanks.count} row${blanks.count === 1 ? '' : 's'} (first line ${blanks.firstLine}): read as missing`);
  }

  // ---- current
  let j: Float64Array;
  if (currentValues !== null && mapping.current !== undefined) {
    const currentUnit = mapping.current.unit;
    const currentName = table.header[mapping.current.column];
    // the file's range of the column (from the parser's summary when it has one)
    let low = currentSummary ? currentSummary.min : Infinity;
    let high = currentSummary ? currentSummary.max : -Infinity;
    for (let row = 0; row < (currentSummary ? 0 : rowCount); row++) {
      const value = currentValues[row];
      if (value < low) low = value;
      if (value > high) high = value;
    }
    const largest = Math.max(Math.abs(low), Math.abs(high));
    const allNegative = largest > 0 && low < -SIGN_NOISE * largest && high <= SIGN_NOISE * largest;
    const negate = mapping.current.negated === true || (mapping.current.negated === undefined && allNegative);
    const sign = negate ? -1 : 1;
    if (negate) {
      notes.push(
        `current "${currentName}" is logged negative (${formatValue(low)} to ${formatValue(high)} ${UNIT_LABEL[currentUnit]}): read as positive load current (values × −1)`,
      );
    }
    const scale = sign * currentDensityFactor(currentUnit, areaCm2);
    const total = currentUnit === 'A' || currentUnit === 'mA';
    j = output(currentValues, mapping.current.column);
    // A/cm² as read, every value above 0 (no −0 to make +0) and within a cell's: nothing to convert or refuse
    const asRead = scale === 1 && currentSummary !== null && unchangedInPlace(currentValues, j, currentSummary.finite === rowCount && currentSummary.min > 0 && currentSummary.max <= MAX_CURRENT_DENSITY);
    for (let row = 0; row < (asRead ? 0 : rowCount); row++) {
      const raw = currentValues[row];
      // 0 × −1 is −0: add 0 to keep open circuit a plain zero
      const density = raw * scale + 0;
      if (density < MIN_CURRENT_DENSITY || density > MAX_CURRENT_DENSITY || density !== density) {
        const shown = total ? `${formatValue(raw)} ${UNIT_LABEL[currentUnit]} on ${areaCm2} cm² (${formatValue(density)} A/cm²)` : `${formatValue(raw)} ${UNIT_LABEL[currentUnit]}`;
        const problem =
          density < MIN_CURRENT_DENSITY
            ? negate
              ? `${shown} is read as ${formatValue(density)} A/cm² once the negative logging is undone: the current changes sign mid-curve; check the column`
              : `${shown} is a negative current density below −0.05 A/cm²; is the sign reversed (some stations log load current as negative)?`
            : `${shown} is above ${MAX_CURRENT_DENSITY} A/cm², more than any cell carries; ${total ? 'is the area right, or the unit mA?' : currentUnit === 'A/cm2' ? 'is the column in mA/cm²?' : 'is this the right column?'}`;
        throw new CurveFileError('impossible-value', `line ${lines[row]}, column "${currentName}": ${problem}`, { line: lines[row], column: currentName });
      }
      j[row] = density;
    }
  } else if (kind === 'polarization') {
    throw new CurveFileError('missing-current', `mapping: a polarization curve needs a current column; none is mapped`, { line: table.headerLine });
  } else if (kind === 'hold') {
    j = new Float64Array(rowCount);
    notes.push('no current column: an open-circuit hold, j = 0 throughout');
  } else {
    j = new Float64Array(rowCount).fill(Number.NaN);
    notes.push('no current column: j is unknown (NaN); the durability current is the build’s');
  }

  const v = measured ?? new Float64Array(rowCount).fill(Number.NaN);
  const curve: AppliedCurve = { kind, j, v, areaCm2, timeResets: [], dataLines: lines, notes };
  if (vIrFree !== null) curve.vIrFree = vIrFree;

  // ---- HFR: 0 and blank are missing readings (NaN), not resistances
  if (hfrValues !== null && mapping.hfr !== undefined) {
    const hfrUnit = mapping.hfr.unit;
    const scale = hfrFactor(hfrUnit, areaCm2);
    const hfrName = table.header[mapping.hfr.column];
    const hfr = output(hfrValues, mapping.hfr.column);
    const zeroLines: number[] = [];
    let zeros = 0;
    let blankAtOpenCircuit = 0;
    const blankLoadedLines: number[] = [];
    let blankLoaded = 0;
    let readingsKept = 0;
    for (let row = 0; row < rowCount; row++) {
      const raw = hfrValues[row];
      if (raw !== raw) {
        if (Math.abs(j[row]) <= OPEN_CIRCUIT_J) blankAtOpenCircuit++;
        else {
          blankLoaded++;
          if (blankLoadedLines.length < 5) blankLoadedLines.push(lines[row]);
        }
        hfr[row] = Number.NaN;
        continue;
      }
      if (raw === 0) {
        zeros++;
        if (zeroLines.length < 5) zeroLines.push(lines[row]);
        hfr[row] = Number.NaN;
        continue;
      }
      const asr = raw * scale;
      if (!(asr >= 0 && asr <= MAX_HFR_OHM_CM2)) {
        const shown = hfrUnit === 'ohm' || hfrUnit === 'mohm' ? `${formatValue(raw)} ${UNIT_LABEL[hfrUnit]} on ${areaCm2} cm² (${formatValue(asr)} Ω·cm²)` : `${formatValue(raw)} ${UNIT_LABEL[hfrUnit]}`;
        const hint = asr < 0 ? 'a resistance cannot be negative' : hfrUnit === 'ohm*cm2' ? 'is the column in mΩ·cm²?' : hfrUnit === 'ohm' ? 'is the column in mΩ?' : 'is this the right column?';
        throw new CurveFileError('impossible-value', `line ${lines[row]}, column "${hfrName}": ${shown} is not a possible HFR (0–10 Ω·cm²); ${hint}`, {
          line: lines[row],
          column: hfrName,
        });
      }
      hfr[row] = asr;
      readingsKept++;
    }
    if (zeros > 0) notes.push(`HFR "${hfrName}" logged as 0 on ${zeros} row${zeros === 1 ? '' : 's'} (line${zeros === 1 ? '' : 's'} ${lineList(zeroLines, zeros)}): read as missing, not as a resistance`);
    if (blankLoaded > 0) notes.push(`HFR "${hfrName}" blank on ${blankLoaded} row${blankLoaded === 1 ? '' : 's'} under load (line${blankLoaded === 1 ? '' : 's'} ${lineList(blankLoadedLines, blankLoaded)}): read as missing`);
    if (blankAtOpenCircuit > 0) notes.push(`HFR blank on ${blankAtOpenCircuit} open-circuit row${blankAtOpenCircuit === 1 ? '' : 's'} (no current to measure it with): read as missing`);
    if (readingsKept > 0) curve.hfr = hfr;
    else notes.push(`HFR "${hfrName}" holds no readings: no HFR kept`);
  }

  // ---- a file with only an iR-free voltage: the measured voltage is V_iR-free − j·HFR
  if (measured === null && vIrFree !== null) {
    const name = table.header[(mapping.voltageIrFree as { column: number }).column];
    if (curve.hfr !== undefined) {
      const hfr = curve.hfr;
      let derived = 0;
      for (let row = 0; row < rowCount; row++) {
        const resistance = hfr[row];
        if (Math.abs(j[row]) <= OPEN_CIRCUIT_J && resistance !== resistance) v[row] = vIrFree[row];
        else v[row] = vIrFree[row] - j[row] * resistance;
        if (v[row] === v[row]) derived++;
      }
      notes.push(`the file gives only an iR-free voltage ("${name}"): the cell voltage is computed as V_iR-free − j·HFR (${derived} of ${rowCount} rows; missing where the HFR is)`);
    } else {
      notes.push(`the file gives only an iR-free voltage ("${name}") and no HFR: the measured cell voltage is unknown; only iR-free metrics can be read`);
    }
  }
  // ---- time
  if (timeValues !== null && mapping.time !== undefined) {
    const timeUnit = mapping.time.unit;
    const scale = hoursFactor(timeUnit);
    const timeName = table.header[mapping.time.column];
    const tHours = output(timeValues, mapping.time.column);
    // Epoch seconds (~1.7e9) lose resolution when scaled first: subtract the first value.
    const origin = timeUnit === 'timestamp' ? timeValues[0] : 0;
    let base = (timeValues[0] - origin) * scale;
    let offset = 0;
    // the file's previous value, kept aside because tHours may overwrite timeValues in place
    let previousValue = timeValues[0];
    for (let row = 0; row < rowCount; row++) {
      const value = timeValues[row];
      const raw = (value - origin) * scale;
      if (row > 0) {
        const previousRaw = (previousValue - origin) * scale;
        if (raw < previousRaw) {
          const isRestart = timeUnit !== 'timestamp' && raw >= 0 && raw <= RESTART_FRACTION * previousRaw;
          if (!isRestart) {
            throw new CurveFileError(
              'time-backwards',
              `line ${lines[row]}, column "${timeName}": time goes back from ${formatValue(previousValue)} to ${formatValue(value)} ${UNIT_LABEL[timeUnit]}; rows must be in time order (a restart from 0 is allowed)`,
              { line: lines[row], column: timeName },
            );
          }
          // The restarted clock counts from the restart, which came after the last reading:
          // carry on from there; a restart logged at exactly 0 gets one sampling interval.
          const previousInterval = row >= 2 ? tHours[row - 1] - tHours[row - 2] : 0;
          base = 0;
          offset = tHours[row - 1] + (raw > 0 ? 0 : previousInterval);
          curve.timeResets.push({ row, line: lines[row], atHours: raw + offset, fromHours: previousRaw, toHours: raw });
        }
      }
      tHours[row] = raw - base + offset;
      previousValue = value;
    }
    if (curve.timeResets.length > 0) {
      notes.push(`time restarted near 0 at ${curve.timeResets.length === 1 ? 'line' : 'lines'} ${curve.timeResets.map((reset) => reset.line).join(', ')}; elapsed hours carried on`);
    }
    curve.tHours = tHours;
  }

  // ---- temperature
  if (temperatureValues !== null && mapping.temperature !== undefined) {
    const temperatureUnit = mapping.temperature.unit;
    const temperatureName = table.header[mapping.temperature.column];
    const temperatureC = output(temperatureValues, mapping.temperature.column);
    const shift = temperatureUnit === 'K' ? -ZERO_CELSIUS_K : 0;
    const blanks = table.missingCells?.[mapping.temperature.column];
    if (blanks) notes.push(`temperature "${temperatureName}" blank or not a number on ${blanks.count} row${blanks.count === 1 ? '' : 's'} (first line ${blanks.firstLine}): read as missing`);
    // °C as read, every value above 0 (no −0 to make +0): nothing to convert or refuse (blanks stay NaN)
    const asRead = shift === 0 && temperatureSummary !== null && unchangedInPlace(temperatureValues, temperatureC, temperatureSummary.min > 0);
    for (let row = 0; row < (asRead ? 0 : rowCount); row++) {
      const celsius = temperatureValues[row] + shift;
      if (celsius !== celsius) {
        temperatureC[row] = Number.NaN;
        continue;
      }
      if (!(celsius >= -ZERO_CELSIUS_K)) {
        throw new CurveFileError(
          'impossible-value',
          `line ${lines[row]}, column "${temperatureName}": ${formatValue(temperatureValues[row])} ${UNIT_LABEL[temperatureUnit]} is below absolute zero; is the unit right?`,
          { line: lines[row], column: temperatureName },
        );
      }
      temperatureC[row] = celsius;
    }
    curve.temperatureC = temperatureC;
  }

  return curve;
}
