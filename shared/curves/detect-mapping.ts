// Guesses which column holds current, voltage, HFR, time and temperature, and in which unit,
// so the upload page can show a preview with the guess filled in for the user to confirm.
import type { ColumnMapping, ColumnSummary, CurrentUnit, CurveKind, HfrUnit, ParsedTable, TemperatureUnit, TimeUnit, VoltageUnit } from './types';
import { recogniseHeaderUnit } from '../units/recognise-header-unit';
import type { HeaderQuantity, HeaderUnitMatch } from '../units/recognise-header-unit';
import { currentSlip, hfrSlip, PLAUSIBLE, unitLabel, voltageSlip } from './unit-plausibility';
import type { UnitSlip } from './unit-plausibility';
import { countCurrentLevels } from './current-levels';

export interface DetectMappingOptions {
  /** the active area the upload will use (form, file or build), cm²: lets totals be judged */
  areaCm2?: number | null;
}

/** How one column was read, for the preview. */
export interface ColumnReading {
  index: number;
  header: string;
  quantity: HeaderQuantity | null;
  unit: string | null;
  irFree: boolean;
  /** the unit came from the header text, from the values, or from the column's cell format */
  unitSource: 'header' | 'values' | 'cells' | null;
}

export interface MappingDetection {
  /** null when we cannot even guess (no voltage column, or a polarization file without current) */
  mapping: ColumnMapping | null;
  /** true when the user should look at the preview and confirm before the curve is stored */
  ambiguous: boolean;
  /** why, in plain sentences: every guess and every doubt */
  reasons: string[];
  kind: CurveKind;
  columns: ColumnReading[];
}

interface ColumnStats {
  min: number;
  max: number;
  maxAbs: number;
  median: number;
}

const MEDIAN_SAMPLE = 10_001;

// Min and max in one pass (or from the parser's summary), median from an evenly strided sample: the detection only needs
// magnitudes, and this stays O(n) on a 1,000,000-row log. Blank cells (NaN) are passed over.
function columnStats(values: Float64Array, summary?: ColumnSummary | null): ColumnStats {
  let min = summary ? summary.min : Infinity;
  let max = summary ? summary.max : -Infinity;
  for (let index = 0; index < (summary ? 0 : values.length); index++) {
    const value = values[index];
    if (value < min) min = value;
    if (value > max) max = value;
  }
  const stride = Math.max(1, Math.floor(values.length / MEDIAN_SAMPLE));
  const sample = new Float64Array(Math.ceil(values.length / stride));
  for (let index = 0, at = 0; index < values.length; index += stride) sample[at++] = values[index];
  // a typed array sorts numerically, blank cells (NaN) last
  sample.sort();
  const middle = sample.length >> 1;
  const median = sample.length % 2 === 1 ? sample[middle] : (sample[middle - 1] + sample[middle]) / 2;
  return { min, max, maxAbs: Math.max(Math.abs(min), Math.abs(max)), median };
}

function formatRange(stats: ColumnStats, unit?: string | null): string {
  const digits = stats.maxAbs >= 100 ? 0 : stats.maxAbs >= 10 ? 1 : 3;
  const range = `${stats.min.toFixed(digits)} to ${stats.max.toFixed(digits)}`;
  return unit ? `${range} ${unitLabel(unit)}` : range;
}

// Share of the column's largest magnitude under which readings of the other sign are noise.
const SIGN_NOISE = 0.02;

function quoted(table: ParsedTable, index: number): string {
  return `"${table.header[index]}"`;
}

/** What the detection knows while it reads a table: each column's reading and statistics, and the reasons so far. */
interface Detection {
  table: ParsedTable;
  areaCm2: number | null;
  reasons: string[];
  /** set when a person should confirm the mapping */
  ambiguous: boolean;
  readings: ColumnReading[];
  matches: (HeaderUnitMatch | null)[];
  stats: (ColumnStats | null)[];
  ofQuantity: (quantity: HeaderQuantity) => ColumnReading[];
  /** numeric columns whose header names no quantity */
  unknownNumeric: ColumnReading[];
  /** a header unit text was present but not understood (and the cells did not give one) */
  unitTextIgnored: (reading: ColumnReading) => boolean;
}

/** Step 1: each column's header reading (quantity, unit, iR-free) and its statistics. */
function readColumns(table: ParsedTable, areaCm2: number | null): Detection {
  const reasons: string[] = [];
  const readings: ColumnReading[] = [];
  const matches: (HeaderUnitMatch | null)[] = [];
  const stats: (ColumnStats | null)[] = [];
  for (let index = 0; index < table.header.length; index++) {
    const values = table.columns[index];
    const columnKind = table.columnKinds[index];
    const match = recogniseHeaderUnit(table.header[index]);
    matches.push(values === null ? null : match);
    stats.push(values === null || values.length === 0 ? null : columnStats(values, table.columnSummaries?.[index]));
    let quantity: HeaderQuantity | null = values === null ? null : match.quantity;
    let unit: string | null = values === null ? null : match.unit;
    let unitSource: ColumnReading['unitSource'] = unit === null ? null : 'header';
    if (columnKind === 'timestamp') {
      quantity = 'time';
      unit = 'timestamp';
      unitSource = 'cells';
    } else if (columnKind === 'duration') {
      quantity = 'time';
      unit = 's';
      unitSource = 'cells';
    }
    readings.push({ index, header: table.header[index], quantity, unit, irFree: match.irFree, unitSource });
  }

  const ofQuantity = (quantity: HeaderQuantity): ColumnReading[] => readings.filter((reading) => reading.quantity === quantity);
  const unknownNumeric = readings.filter((reading) => reading.quantity === null && table.columns[reading.index] !== null && table.columnKinds[reading.index] === 'number');
  const unitTextIgnored = (reading: ColumnReading): boolean => {
    const match = matches[reading.index];
    return match !== null && match.unitText !== null && match.unit === null && reading.unitSource !== 'cells';
  };
  return { table, areaCm2, reasons, ambiguous: false, readings, matches, stats, ofQuantity, unknownNumeric, unitTextIgnored };
}

/** Step 2: the measured cell voltage, and an iR-free (iR-corrected) one when named so; units from the values when the header gives none. */
function findVoltage(d: Detection) {
  const { table, reasons, readings, stats, ofQuantity, unknownNumeric, unitTextIgnored } = d;
  let voltageReading: ColumnReading | null = null;
  let irFreeReading: ColumnReading | null = null;
  const voltageCandidates = ofQuantity('voltage');
  if (voltageCandidates.length > 0) {
    const measured = voltageCandidates.filter((reading) => !reading.irFree);
    const corrected = voltageCandidates.filter((reading) => reading.irFree);
    voltageReading = measured[0] ?? null;
    irFreeReading = corrected[0] ?? null;
    if (measured.length > 1) {
      d.ambiguous = true;
      const names = measured.map((reading) => quoted(table, reading.index)).join(' and ');
      reasons.push(`${measured.length} voltage columns: ${names}; using ${quoted(table, measured[0].index)} as the cell voltage; confirm`);
    }
    if (corrected.length > 1) {
      d.ambiguous = true;
      const names = corrected.map((reading) => quoted(table, reading.index)).join(' and ');
      reasons.push(`${corrected.length} iR-free voltage columns: ${names}; using ${quoted(table, corrected[0].index)}; confirm`);
    }
    if (irFreeReading !== null && voltageReading !== null) {
      reasons.push(`${quoted(table, irFreeReading.index)} is read as the file's own iR-free voltage, ${quoted(table, voltageReading.index)} as the measured cell voltage`);
    } else if (irFreeReading !== null) {
      reasons.push(`the only voltage column, ${quoted(table, irFreeReading.index)}, is iR-corrected: read as iR-free voltage, not as the measured cell voltage`);
    }
  } else {
    // Without names, a cell voltage is the column in a voltage range whose smallest value is
    // the largest: current starts at ~0, a cell voltage stays well above 0 until the limit.
    const ranges: readonly [VoltageUnit, number, number][] = [
      ['V', -0.1, 1.5],
      ['mV', -100, 1500],
    ];
    for (const [unit, low, high] of ranges) {
      let best: ColumnReading | null = null;
      let bestMin = -Infinity;
      for (const reading of unknownNumeric) {
        const columnStatistics = stats[reading.index];
        if (columnStatistics === null || columnStatistics.min < low || columnStatistics.max > high || columnStatistics.max <= 0) continue;
        if (unit === 'mV' && columnStatistics.max <= 2) continue;
        if (columnStatistics.min > bestMin) {
          best = reading;
          bestMin = columnStatistics.min;
        }
      }
      if (best !== null) {
        const columnStatistics = stats[best.index] as ColumnStats;
        voltageReading = { ...best, quantity: 'voltage', unit, unitSource: 'values' };
        readings[best.index] = voltageReading;
        d.ambiguous = true;
        reasons.push(`no header names a voltage; ${quoted(table, best.index)} (${formatRange(columnStatistics, unit)}) read as the cell voltage; confirm`);
        break;
      }
    }
  }
  const unitFromValues = (reading: ColumnReading | null): ColumnReading | null => {
    if (reading === null || reading.unit !== null) return reading;
    const columnStatistics = stats[reading.index];
    if (columnStatistics === null) return reading;
    const unit: VoltageUnit = columnStatistics.maxAbs <= 2 ? 'V' : 'mV';
    const filled: ColumnReading = { ...reading, unit, unitSource: 'values' };
    readings[reading.index] = filled;
    if (unitTextIgnored(filled) || columnStatistics.maxAbs > 2000) d.ambiguous = true;
    reasons.push(`${quoted(table, reading.index)} has no unit we read; values ${formatRange(columnStatistics)} read as ${unit}`);
    return filled;
  };
  voltageReading = unitFromValues(voltageReading);
  irFreeReading = unitFromValues(irFreeReading);
  return { voltageReading, irFreeReading };
}

/** Step 3: the current column and its unit; a load current logged negative is flipped, one that changes sign asks. */
function findCurrent(d: Detection, voltageReading: ColumnReading | null) {
  const { table, areaCm2, reasons, readings, stats, ofQuantity, unknownNumeric } = d;
  let currentReading: ColumnReading | null = null;
  const currentCandidates = ofQuantity('current');
  if (currentCandidates.length > 0) {
    const densities = currentCandidates.filter((reading) => reading.unit === 'A/cm2' || reading.unit === 'mA/cm2');
    currentReading = densities.length > 0 ? densities[0] : currentCandidates[0];
    if (currentCandidates.length > 1 && densities.length !== 1) {
      d.ambiguous = true;
      const names = currentCandidates.map((reading) => quoted(table, reading.index)).join(' and ');
      reasons.push(`${currentCandidates.length} current columns: ${names}; using ${quoted(table, currentReading.index)}; confirm`);
    } else if (currentCandidates.length > 1) {
      reasons.push(`several current columns; using ${quoted(table, currentReading.index)}, the current density`);
    }
  } else {
    for (const reading of unknownNumeric) {
      if (voltageReading !== null && reading.index === voltageReading.index) continue;
      const columnStatistics = stats[reading.index];
      if (columnStatistics === null || columnStatistics.min < -0.1 * Math.max(columnStatistics.maxAbs, 1e-12)) continue;
      currentReading = { ...reading, quantity: 'current', unit: null, unitSource: null };
      d.ambiguous = true;
      reasons.push(`no header names a current; ${quoted(table, reading.index)} read as current; confirm`);
      break;
    }
  }
  if (currentReading !== null && currentReading.unit === null) {
    const columnStatistics = stats[currentReading.index];
    if (columnStatistics !== null) {
      // the units under which the largest current is a cell's (5 mA/cm² to 5 A/cm²)
      const candidates: CurrentUnit[] = areaCm2 !== null && areaCm2 > 0 ? ['A/cm2', 'mA/cm2', 'A', 'mA'] : ['A/cm2', 'mA/cm2'];
      const plausible = candidates.filter((unit) => {
        const factor = unit === 'A/cm2' ? 1 : unit === 'mA/cm2' ? 1e-3 : (unit === 'A' ? 1 : 1e-3) / (areaCm2 as number);
        const peak = columnStatistics.maxAbs * factor;
        return peak >= PLAUSIBLE.minPolarizationPeak && peak <= PLAUSIBLE.maxCurrentDensity;
      });
      const fallback: CurrentUnit = columnStatistics.maxAbs <= 4 ? 'A/cm2' : 'mA/cm2';
      const unit: CurrentUnit = plausible.length === 1 ? plausible[0] : plausible.includes(fallback) || plausible.length === 0 ? fallback : plausible[0];
      currentReading = { ...currentReading, unit, unitSource: 'values' };
      if (plausible.length === 1 && areaCm2 !== null) {
        reasons.push(`${quoted(table, currentReading.index)} has no unit we read; ${formatRange(columnStatistics)} can only be ${unitLabel(unit)} on ${areaCm2} cm² (other units give less than 5 mA/cm² or more than 5 A/cm²)`);
      } else {
        d.ambiguous = true;
        const others = plausible.filter((other) => other !== unit).map(unitLabel);
        const alternatives = others.length > 0 ? others.join(' or ') : areaCm2 === null ? 'a total current in A or mA' : 'another unit';
        reasons.push(`${quoted(table, currentReading.index)} has no unit we read; values ${formatRange(columnStatistics)} read as ${unitLabel(unit)} (${alternatives} would look the same); confirm`);
      }
    }
  }
  if (currentReading !== null) readings[currentReading.index] = currentReading;
  // Load current logged negative: a column that is ≤ 0 throughout (noise aside) is flipped; one
  // that changes sign mid-curve is asked about.
  let currentNegated = false;
  if (currentReading !== null) {
    const columnStatistics = stats[currentReading.index];
    if (columnStatistics !== null && columnStatistics.maxAbs > 0) {
      const noise = SIGN_NOISE * columnStatistics.maxAbs;
      if (columnStatistics.min < -noise && columnStatistics.max <= noise) {
        currentNegated = true;
        reasons.push(`${quoted(table, currentReading.index)} is negative throughout (${formatRange(columnStatistics, currentReading.unit)}): read as load current logged with a negative sign, values × −1`);
      } else if (columnStatistics.min < -noise && columnStatistics.max > noise) {
        d.ambiguous = true;
        const values = table.columns[currentReading.index] as Float64Array;
        let change = -1;
        for (let row = 1; row < values.length; row++) {
          if ((values[row] > noise && values[row - 1] < -noise) || (values[row] < -noise && values[row - 1] > noise)) {
            change = row;
            break;
          }
        }
        const where = change >= 0 ? ` (first at line ${table.dataLines[change]})` : '';
        reasons.push(`${quoted(table, currentReading.index)} changes sign mid-curve${where}, from ${formatRange(columnStatistics, currentReading.unit)}; a cell's load current has one sign: say whether the file logs it negative, or choose another column`);
      }
    }
  }
  return { currentReading, currentNegated };
}

/** Step 4: the HFR column and its unit (from the values when the header gives none). */
function findHfr(d: Detection): ColumnReading | null {
  const { table, areaCm2, reasons, readings, stats, ofQuantity } = d;
  let hfrReading: ColumnReading | null = null;
  const hfrCandidates = ofQuantity('hfr');
  if (hfrCandidates.length > 0) {
    hfrReading = hfrCandidates[0];
    if (hfrCandidates.length > 1) {
      d.ambiguous = true;
      reasons.push(`${hfrCandidates.length} resistance columns; using ${quoted(table, hfrReading.index)}; confirm`);
    }
    if (hfrReading.unit === null) {
      const columnStatistics = stats[hfrReading.index];
      if (columnStatistics !== null) {
        const guess: HfrUnit = Math.abs(columnStatistics.median) <= 2 ? 'ohm*cm2' : 'mohm*cm2';
        const values = table.columns[hfrReading.index] as Float64Array;
        const candidates: HfrUnit[] = areaCm2 !== null && areaCm2 > 0 ? ['ohm*cm2', 'mohm*cm2', 'ohm', 'mohm'] : ['ohm*cm2', 'mohm*cm2'];
        const plausible = candidates.filter((unit) => hfrSlip(values, unit, areaCm2) === null);
        const unit: HfrUnit = plausible.length === 1 ? plausible[0] : plausible.includes(guess) || plausible.length === 0 ? guess : plausible[0];
        hfrReading = { ...hfrReading, unit, unitSource: 'values' };
        if (plausible.length === 1 && areaCm2 !== null) {
          reasons.push(`${quoted(table, hfrReading.index)} has no unit we read; ${formatRange(columnStatistics)} can only be ${unitLabel(unit)}${unit === 'ohm' || unit === 'mohm' ? ` on ${areaCm2} cm²` : ''} (other units give no cell's HFR)`);
        } else {
          d.ambiguous = true;
          reasons.push(`${quoted(table, hfrReading.index)} has no unit we read; values ${formatRange(columnStatistics)} read as ${unitLabel(unit)} (a cell resistance in Ω or mΩ would need the area); confirm`);
        }
      }
    }
    readings[hfrReading.index] = hfrReading;
  }
  return hfrReading;
}

/** Step 5: the time column: an elapsed time before a clock. */
function findTime(d: Detection): ColumnReading | null {
  const { table, reasons, readings, ofQuantity } = d;
  let timeReading: ColumnReading | null = null;
  const timeCandidates = ofQuantity('time');
  if (timeCandidates.length > 0) {
    const clocks = timeCandidates.filter((reading) => reading.unit === 'timestamp');
    const elapsed = timeCandidates.filter((reading) => reading.unit !== 'timestamp' && reading.unit !== null);
    // an elapsed-time column is closer to what we store than a clock, and is free of clock changes
    timeReading = elapsed[0] ?? clocks[0] ?? timeCandidates[0];
    if (timeReading.unit === null) {
      timeReading = { ...timeReading, unit: 's', unitSource: 'values' };
      d.ambiguous = true;
      reasons.push(`${quoted(table, timeReading.index)} has no unit we read; read as seconds; confirm`);
    }
    if (timeCandidates.length > 1) reasons.push(`several time columns; using ${quoted(table, timeReading.index)}`);
    readings[timeReading.index] = timeReading;
  }
  return timeReading;
}

/** Step 6: the temperature column, the cell's when several. */
function findTemperature(d: Detection): ColumnReading | null {
  const { table, reasons, readings, stats, ofQuantity } = d;
  let temperatureReading: ColumnReading | null = null;
  const temperatureCandidates = ofQuantity('temperature');
  if (temperatureCandidates.length > 0) {
    const cellNamed = temperatureCandidates.filter((reading) => /cell/i.test(reading.header));
    temperatureReading = cellNamed[0] ?? temperatureCandidates[0];
    if (temperatureReading.unit === null) {
      const columnStatistics = stats[temperatureReading.index];
      const unit: TemperatureUnit = columnStatistics !== null && columnStatistics.median > 250 ? 'K' : 'C';
      temperatureReading = { ...temperatureReading, unit, unitSource: 'values' };
      reasons.push(`${quoted(table, temperatureReading.index)} has no unit we read; read as ${unit === 'K' ? 'K' : '°C'}`);
    }
    readings[temperatureReading.index] = temperatureReading;
  }
  return temperatureReading;
}

/** The columns found for each role. */
interface Found {
  voltageReading: ColumnReading | null;
  irFreeReading: ColumnReading | null;
  currentReading: ColumnReading | null;
  currentNegated: boolean;
  hfrReading: ColumnReading | null;
  timeReading: ColumnReading | null;
  temperatureReading: ColumnReading | null;
}

/** Step 7: the curve kind: the caller's, else from the time column and how the current steps. */
function detectKind(d: Detection, found: Found, kind: CurveKind | undefined): CurveKind {
  const { table, reasons, stats } = d;
  const { voltageReading, irFreeReading, currentReading, timeReading } = found;
  let detectedKind: CurveKind;
  let timeUnitGuessed = false;
  if (timeReading !== null && timeReading.unitSource === 'values') timeUnitGuessed = true;
  if (kind !== undefined) {
    detectedKind = kind;
  } else if (timeReading !== null) {
    detectedKind = 'durability';
    const currentStatistics = currentReading === null ? null : stats[currentReading.index];
    if (currentStatistics !== null && currentReading !== null) {
      const hold = currentReading.unit === 'A/cm2' || currentReading.unit === 'A' ? currentStatistics.maxAbs < 0.001 : currentStatistics.maxAbs < 1;
      const currentValues = table.columns[currentReading.index] as Float64Array;
      const { levels, modalShare } = countCurrentLevels(currentValues, { relativeTolerance: 0.03, absoluteTolerance: 0.002 * currentStatistics.maxAbs });
      const spansRange = currentStatistics.max - currentStatistics.min > 0.5 * currentStatistics.maxAbs;
      const voltageStatistics = voltageReading !== null ? stats[voltageReading.index] : irFreeReading !== null ? stats[irFreeReading.index] : null;
      const voltageScale = (voltageReading ?? irFreeReading)?.unit === 'mV' ? 1e-3 : 1;
      const voltageSpan = voltageStatistics === null ? 0 : (voltageStatistics.max - voltageStatistics.min) * voltageScale;
      const range = formatRange(currentStatistics, currentReading.unit);
      if (hold) {
        detectedKind = 'hold';
        reasons.push(`time column and current ≈ 0 throughout: read as an open-circuit hold`);
      } else if (spansRange && levels.length >= 4 && modalShare < 0.5 && voltageSpan > 0.1) {
        detectedKind = 'polarization';
        reasons.push(`time column present, and the current steps through ${levels.length} levels over ${range}: read as a polarization curve logged against time`);
      } else if (!spansRange || levels.length <= 2 || modalShare >= 0.8) {
        reasons.push(`time column present and the current held at one level (${Math.round(modalShare * 100)} % of readings): read as a durability log`);
      } else {
        d.ambiguous = true;
        detectedKind = modalShare < 0.65 && voltageSpan > 0.1 ? 'polarization' : 'durability';
        reasons.push(
          `time column present; the current takes ${levels.length} levels over ${range} with ${Math.round(modalShare * 100)} % of readings at the most common one: read as ${detectedKind === 'polarization' ? 'a polarization curve' : 'a durability log'}; confirm the kind`,
        );
      }
    } else {
      reasons.push('time column present: read as a durability log');
    }
  } else {
    detectedKind = 'polarization';
  }
  if (timeUnitGuessed && timeReading !== null && detectedKind !== 'polarization') {
    d.ambiguous = true;
    reasons.push(`${quoted(table, timeReading.index)} has no unit we read; read as seconds; confirm`);
  }
  return detectedKind;
}

/** Step 8: the mapping from the columns found. */
function mappingOf(d: Detection, found: Found): ColumnMapping {
  const { areaCm2, reasons } = d;
  const { voltageReading, irFreeReading, currentReading, currentNegated, hfrReading, timeReading, temperatureReading } = found;
  const mapping: ColumnMapping = {};
  if (voltageReading !== null && voltageReading.unit !== null) mapping.voltage = { column: voltageReading.index, unit: voltageReading.unit as VoltageUnit };
  if (irFreeReading !== null && irFreeReading.unit !== null) mapping.voltageIrFree = { column: irFreeReading.index, unit: irFreeReading.unit as VoltageUnit };
  if (currentReading !== null && currentReading.unit !== null) {
    mapping.current = { column: currentReading.index, unit: currentReading.unit as CurrentUnit };
    if (currentNegated) mapping.current.negated = true;
  }
  if (hfrReading !== null && hfrReading.unit !== null) mapping.hfr = { column: hfrReading.index, unit: hfrReading.unit as HfrUnit };
  if (timeReading !== null && timeReading.unit !== null) mapping.time = { column: timeReading.index, unit: timeReading.unit as TimeUnit };
  if (temperatureReading !== null && temperatureReading.unit !== null) {
    mapping.temperature = { column: temperatureReading.index, unit: temperatureReading.unit as TemperatureUnit };
  }
  if ((mapping.current?.unit === 'A' || mapping.current?.unit === 'mA' || mapping.hfr?.unit === 'ohm' || mapping.hfr?.unit === 'mohm') && areaCm2 === null) {
    reasons.push('total current or cell resistance: the active area (cm²) is needed, and neither the file nor the build states it');
  }
  return mapping;
}

/** Step 9: unit slips: propose the unit that makes each column a cell's, and ask. */
function askAboutUnitSlips(d: Detection, mapping: ColumnMapping, detectedKind: CurveKind): void {
  const { table, areaCm2, reasons } = d;
  for (const slip of findUnitSlips(table, mapping, detectedKind, areaCm2)) {
    d.ambiguous = true;
    const entry = mapping[slip.role] as { column: number; unit: string };
    const line = table.dataLines[slip.row];
    reasons.push(`line ${line}, column ${quoted(table, entry.column)}: ${slip.message}`);
    if (slip.proposed !== null) entry.unit = slip.proposed;
  }
}

/**
 * Parsed table → a column mapping guess. Header units are believed first
 * (recogniseHeaderUnit); a header with no unit gets one from the values: voltage up to ~2 → V,
 * up to ~2000 → mV; current and HFR take the one unit (A/cm², mA/cm², and with the area A, mA;
 * Ω·cm², mΩ·cm², Ω, mΩ) under which the values are a cell's (5 mA/cm²–5 A/cm²; 0.02–3 Ω·cm²),
 * and ask (`ambiguous`) when several fit. An iR-corrected voltage column ("E_iR-free (V)")
 * maps to `voltageIrFree`, beside the measured voltage or alone. Two measured voltage columns →
 * the first, ambiguous. A current column ≤ 0 throughout is marked `negated`; one that changes
 * sign asks. A time column makes the kind `durability` unless `kind` is given — except when the
 * current steps through ≥ 4 levels over its range with no level holding half the readings,
 * which is a polarization curve with a clock (no question); in between, it asks. A current
 * ≈ 0 throughout with a time column → `hold`. Finally every mapped column is checked for unit
 * slips (findUnitSlips): the plausible unit is proposed and the detection asks, naming the line.
 * Reference: magnitudes are those of single cells (common practice in the trade):
 * 0–1.2 V, 0–3 A/cm², HFR 0.05–1 Ω·cm².
 * Cost: O(rows × columns).
 * @example detectMapping(parseDelimitedText('j (A/cm2),U (V)\n0.2,0.65\n')).mapping // { current: {column:0,unit:'A/cm2'}, voltage: {column:1,unit:'V'} }
 */
export function detectMapping(table: ParsedTable, kind?: CurveKind, options: DetectMappingOptions = {}): MappingDetection {
  const areaCm2 = options.areaCm2 ?? table.conditions.areaCm2 ?? null;
  if (table === null || typeof table !== 'object' || !Array.isArray(table.header) || !Array.isArray(table.columns)) {
    throw new TypeError('detectMapping: table must be a ParsedTable');
  }
  const d = readColumns(table, areaCm2);
  const { reasons, readings } = d;
  const { voltageReading, irFreeReading } = findVoltage(d);
  const { currentReading, currentNegated } = findCurrent(d, voltageReading);
  const found: Found = { voltageReading, irFreeReading, currentReading, currentNegated, hfrReading: findHfr(d), timeReading: findTime(d), temperatureReading: findTemperature(d) };
  const { timeReading } = found;
  const detectedKind = detectKind(d, found, kind);

  const anyVoltage = voltageReading ?? irFreeReading;
  if (anyVoltage === null || anyVoltage.unit === null) {
    reasons.push('no voltage column found: name it e.g. "Voltage (V)" or "U (mV)", or choose the columns by hand');
    return { mapping: null, ambiguous: true, reasons, kind: detectedKind, columns: readings };
  }
  if (detectedKind === 'polarization' && (currentReading === null || currentReading.unit === null)) {
    reasons.push('no current column found for a polarization curve: name it e.g. "Current density (A/cm2)", or choose the columns by hand');
    return { mapping: null, ambiguous: true, reasons, kind: detectedKind, columns: readings };
  }
  if (detectedKind === 'durability' && timeReading === null) {
    reasons.push('no time column found for a durability log: name it e.g. "Time (h)", or choose the columns by hand');
    return { mapping: null, ambiguous: true, reasons, kind: detectedKind, columns: readings };
  }

  const mapping = mappingOf(d, found);
  askAboutUnitSlips(d, mapping, detectedKind);
  return { mapping, ambiguous: d.ambiguous, reasons, kind: detectedKind, columns: readings };
}

/**
 * Every mapped column whose values cannot be what its unit says (see unit-plausibility):
 * voltage and iR-free voltage, current (sign as the mapping says), HFR.
 * Cost: O(rows) per mapped column.
 */
export function findUnitSlips(table: ParsedTable, mapping: ColumnMapping, kind: CurveKind, areaCm2: number | null): (UnitSlip & { role: keyof ColumnMapping })[] {
  const slips: (UnitSlip & { role: keyof ColumnMapping })[] = [];
  const values = (column: number): Float64Array | null => table.columns[column] ?? null;
  // the parser's summaries spare a pass over each column (while the columns are as read)
  const summary = (column: number) => table.columnSummaries?.[column] ?? null;
  for (const role of ['voltage', 'voltageIrFree'] as const) {
    const entry = mapping[role];
    const column = entry === undefined ? null : values(entry.column);
    if (entry === undefined || column === null) continue;
    const slip = voltageSlip(column, entry.unit, summary(entry.column));
    if (slip !== null) slips.push({ ...slip, role });
  }
  if (mapping.current !== undefined) {
    const column = values(mapping.current.column);
    if (column !== null) {
      const slip = currentSlip(column, mapping.current.unit, areaCm2, kind, summary(mapping.current.column));
      if (slip !== null) slips.push({ ...slip, role: 'current' });
    }
  }
  if (mapping.hfr !== undefined) {
    const column = values(mapping.hfr.column);
    if (column !== null) {
      const slip = hfrSlip(column, mapping.hfr.unit, areaCm2);
      if (slip !== null) slips.push({ ...slip, role: 'hfr' });
    }
  }
  return slips;
}
