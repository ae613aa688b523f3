// Metadata lines above a curve file's header (`Active area: 25 cm2`, `# Cell temperature =
// 180 °C`, `Cathode gas; air`, `Back pressure 101 kPa`) → FileConditions.
import type { FileConditions } from './types';
import { toCelsius } from '../units/temperature';

const COMMENT_PREFIX = /^(?:#+|\/\/+|%+|!+|\*+|-{2,}|;+)\s*/;
const KEY_VALUE_SEPARATOR = /^([^:=]*[^:=\s])\s*[:=]\s*(.*)$/;
const NUMBER_WITH_UNIT = /^([+-]?(?:\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE][+-]?\d+)?)\s*(.*)$/;
const GAS_WORD = /^(h2|hydrogen|o2|oxygen|air|synthetic air|n2|nitrogen|reformate|methanol|meoh|ch3oh|dme|dimethyl ether|co|co2|ch4|methane|ethanol|ar|argon|he|helium)\b/i;

/** One metadata line split into key and value; null for lines that are not a pair. */
export interface MetadataPair {
  key: string;
  value: string;
}

// A title such as "Bench 2 (Lab A, invented)" is one cell: separators inside brackets do not split.
function splitOutsideBrackets(text: string, separator: string): string[] {
  const cells: string[] = [];
  let depth = 0;
  let start = 0;
  for (let index = 0; index < text.length; index++) {
    const char = text[index];
    if (char === '(' || char === '[' || char === '{') depth++;
    else if ((char === ')' || char === ']' || char === '}') && depth > 0) depth--;
    else if (char === separator && depth === 0) {
      cells.push(text.slice(start, index));
      start = index + 1;
    }
  }
  cells.push(text.slice(start));
  return cells;
}

function stripQuotes(text: string): string {
  const trimmed = text.trim();
  if (trimmed.length >= 2 && trimmed[0] === '"' && trimmed[trimmed.length - 1] === '"') return trimmed.slice(1, -1).trim();
  return trimmed;
}

/**
 * A metadata line → key and value. Tried in order: `key: value` / `key = value`; a line
 * split by the file's delimiter or `;`, `,`, tab (`Area,25,cm2` → `Area`, `25 cm2`); words
 * up to the first number (`Back pressure 101 kPa` → `Back pressure`, `101 kPa`).
 * Leading comment marks (#, //, %, !, *, --, ;) are dropped.
 * Cost: O(length of line).
 * @example splitMetadataLine('# Cell temperature = 180 °C', ',') // { key: 'Cell temperature', value: '180 °C' }
 */
export function splitMetadataLine(line: string, delimiter: string): MetadataPair | null {
  const text = line.trim().replace(COMMENT_PREFIX, '').trim();
  if (text.length === 0) return null;
  const separated = KEY_VALUE_SEPARATOR.exec(text);
  if (separated !== null) {
    const key = stripQuotes(separated[1]);
    const value = stripQuotes(separated[2]);
    if (key.length > 0 && value.length > 0) return { key, value };
    return null;
  }
  const separators = [delimiter, ';', ',', '\t'].filter((candidate) => candidate.length === 1);
  for (const separator of separators) {
    if (!text.includes(separator)) continue;
    const cells = splitOutsideBrackets(text, separator).map(stripQuotes).filter((cell) => cell.length > 0);
    if (cells.length === 1) continue;
    if (cells.length >= 2) return { key: cells[0], value: cells.slice(1).join(' ') };
    return null;
  }
  const words = text.split(/\s+/);
  for (let index = 1; index < words.length; index++) {
    if (/^[+-]?[.,]?\d/.test(words[index])) {
      return { key: words.slice(0, index).join(' '), value: words.slice(index).join(' ') };
    }
  }
  return null;
}

function readNumberWithUnit(value: string): { number: number; unit: string } | null {
  const match = NUMBER_WITH_UNIT.exec(value.trim());
  if (match === null) return null;
  const number = Number(match[1].replace(',', '.'));
  if (!Number.isFinite(number)) return null;
  return { number, unit: match[2].trim() };
}

// 1 atm = 101.325 kPa exactly (the standard atmosphere, BIPM SI Brochure 9th ed., table 8):
// the ambient pressure a gauge reading is taken to sit on when the file gives no barometer.
export const STANDARD_ATMOSPHERE_KPA = 101.325;

const LENGTH_TO_CM: Readonly<Record<string, number>> = { mm: 0.1, cm: 1, m: 100 };
// "5 cm x 5 cm", "5x5 cm", "5 × 5 cm²", "50 mm * 50 mm", "2,24 x 2,24 cm"
const DIMENSIONS = /^([+-]?\d+(?:[.,]\d+)?)\s*(mm|cm|m)?\s*[x×*]\s*(\d+(?:[.,]\d+)?)\s*(mm|cm|m)?\s*(?:2|²|\^2)?(?:\s|$|[;,(])/i;
// A specific surface area or electrochemical area is not the cell's geometric area.
const SPECIFIC_AREA_UNIT = /\/\s*(?:m?g|kg)\b|per\s+(?:m?g|gram)|m\s*(?:2|²)\s*(?:\/|per)|cm\s*(?:2|²)\s*_?\s*(?:pt|metal|cat)/i;
const SPECIFIC_AREA_KEY = /ecsa|electrochem|specific|bet\b|surface area|roughness|catalyst area|pt area|metal area|active site/i;

function number(text: string): number {
  return Number(text.replace(',', '.'));
}

type AreaReading = { cm2: number; stated: string | null; note: string | null } | { skip: string };

// Area in cm²: a plain number (mm² and m² converted; no unit means cm², the trade's unit), or
// two lengths multiplied ("5 cm x 5 cm" = 25 cm²). A value per gram is a specific area: skipped.
function readArea(key: string, value: string): AreaReading | null {
  const text = value.trim();
  if (SPECIFIC_AREA_KEY.test(key) || SPECIFIC_AREA_UNIT.test(text)) {
    return { skip: `"${key}: ${text}" is a specific or electrochemical surface area, not the cell's geometric area; not used as the active area` };
  }
  const dimensions = DIMENSIONS.exec(text);
  if (dimensions !== null) {
    const unitA = (dimensions[2] ?? dimensions[4] ?? 'cm').toLowerCase();
    const unitB = (dimensions[4] ?? dimensions[2] ?? 'cm').toLowerCase();
    const a = number(dimensions[1]) * LENGTH_TO_CM[unitA];
    const b = number(dimensions[3]) * LENGTH_TO_CM[unitB];
    if (!(a > 0 && b > 0)) return null;
    const cm2 = a * b;
    return { cm2, stated: text, note: `active area ${formatArea(cm2)} cm² from the dimensions "${text}"` };
  }
  const reading = readNumberWithUnit(text);
  if (reading === null || reading.number <= 0) return null;
  const unit = reading.unit.normalize('NFKC').toLowerCase().replace(/[\s^]/g, '');
  if (unit.startsWith('mm2')) return { cm2: reading.number / 100, stated: text, note: null };
  if (unit.startsWith('m2')) return { cm2: reading.number * 1e4, stated: text, note: null };
  return { cm2: reading.number, stated: null, note: null };
}

function formatArea(cm2: number): string {
  return String(Number(cm2.toPrecision(6)));
}

// Temperature in °C; K and °F are converted.
function readTemperature(value: string): number | null {
  const reading = readNumberWithUnit(value);
  if (reading === null) return null;
  const unit = reading.unit.normalize('NFKC').toLowerCase().replace(/[\s°]/g, '');
  try {
    if (unit === 'k' || unit === 'kelvin') return toCelsius(reading.number, 'K');
    if (unit === 'f' || unit === 'degf') return ((reading.number - 32) * 5) / 9;
    return toCelsius(reading.number, 'C');
  } catch {
    return null;
  }
}

interface PressureReading {
  /** as written, in kPa, before any gauge/absolute conversion */
  statedKPa: number;
  basis: 'absolute' | 'gauge' | 'unstated';
  /** the key, not the unit, said gauge or absolute */
  basisFromKey: boolean;
}

// Pressure in kPa and whether it is gauge or absolute ("50 kPag", "150 kPa(a)", "1.5 barg",
// "2 bar abs", "15 psig"; the key may say it too: "Back pressure (gauge)").
// Reference: 1 bar = 100 kPa (exact), 1 atm = 101.325 kPa (exact), 1 psi = 6.894757 kPa
// (NIST SP 811, appendix B.8).
function readPressure(key: string, value: string): PressureReading | null {
  const reading = readNumberWithUnit(value);
  if (reading === null) return null;
  const written = reading.unit.toLowerCase();
  const unit = written.replace(/[\s()[\]._-]/g, '');
  let factor: number;
  let rest: string;
  const prefixes: readonly [string, number][] = [['mbar', 0.1], ['bar', 100], ['kpa', 1], ['mpa', 1000], ['pa', 0.001], ['psi', 6.894757], ['atm', 101.325]];
  const found = prefixes.find(([prefix]) => unit.startsWith(prefix));
  if (found === undefined) {
    factor = 1;
    rest = unit;
  } else {
    factor = found[1];
    rest = unit.slice(found[0].length);
  }
  const keyText = key.toLowerCase();
  let basis: PressureReading['basis'] = 'unstated';
  let basisFromKey = false;
  if (/^(?:g|gauge|gage)/.test(rest)) basis = 'gauge';
  else if (/^(?:a|abs|absolute)/.test(rest)) basis = 'absolute';
  else if (/gauge|gage|\(g\)|\bg\b|relative|overpressure/.test(keyText)) {
    basis = 'gauge';
    basisFromKey = true;
  } else if (/absolute|\babs\b|\(a\)/.test(keyText)) {
    basis = 'absolute';
    basisFromKey = true;
  }
  // atm is absolute by definition unless marked otherwise
  if (found !== undefined && found[0] === 'atm' && basis === 'unstated') basis = 'absolute';
  return { statedKPa: reading.number * factor, basis, basisFromKey };
}

// Below this an unmarked back-pressure cannot be absolute for a cell test: it is gauge.
export const LOWEST_ABSOLUTE_KPA = 80;

function looksLikeGas(key: string, value: string): boolean {
  if (/^[+-]?\d/.test(value)) return false;
  if (/flow|stoich|lambda|pressure|temp|dew|humid|loading|catalyst|lot|gdl|ionomer|binder|membrane/.test(key)) return false;
  if (/gas|feed|fuel|oxidant/.test(key)) return true;
  return GAS_WORD.test(value);
}

/**
 * Metadata lines (above the header, below the table, or a workbook's key–value sheet) →
 * FileConditions: active area (cm²; "5 cm x 5 cm" multiplied; a specific or electrochemical
 * surface area such as "45 m2/g" is never taken; an area outside 0.5–1,000 cm² is noted),
 * cell temperature (°C), anode and cathode gas, back-pressure (stored absolute in kPa: gauge
 * readings such as "50 kPag" or "1.5 barg" get the standard atmosphere added; what was written
 * is kept in `backPressureStated`), and every key/value pair as text in `raw`.
 * A key naming the cell ("Cell temperature") wins over a plain "Temperature"; other
 * temperatures (dew point, humidifier, oven) are kept only in `raw`.
 * Reference: none — a reading of how lab exports write their headers (common practice).
 * Cost: O(total length of lines).
 * @example readConditions(['Active area: 25 cm2', 'Anode: H2'], ',') // { areaCm2: 25, anodeGas: 'H2', raw: {...} }
 */
export function readConditions(lines: readonly string[], delimiter: string): FileConditions {
  const conditions: FileConditions = { raw: {} };
  const notes: string[] = [];
  let pressureNote: string | null = null;
  let temperatureFromCellKey = false;
  let pressureFromBackKey = false;
  for (const line of lines) {
    const pair = splitMetadataLine(line, delimiter);
    if (pair === null) continue;
    if (!(pair.key in conditions.raw)) conditions.raw[pair.key] = pair.value;
    const key = pair.key.toLowerCase();
    if (key.includes('area') || key === 'ecsa') {
      const area = readArea(pair.key, pair.value);
      if (area === null) continue;
      if ('skip' in area) {
        notes.push(area.skip);
        continue;
      }
      if (conditions.areaCm2 !== undefined) continue;
      conditions.areaCm2 = area.cm2;
      if (area.stated !== null) conditions.areaStated = area.stated;
      if (area.note !== null) notes.push(area.note);
      if (area.cm2 < AREA_RANGE_CM2[0] || area.cm2 > AREA_RANGE_CM2[1]) {
        notes.push(`the file's active area ${formatArea(area.cm2)} cm² ("${pair.value}") is outside the ${AREA_RANGE_CM2[0]}–${AREA_RANGE_CM2[1].toLocaleString('en-US')} cm² of single test cells; check it`);
      }
      continue;
    }
    if (key.includes('temp') || key === 't' || key === 't_cell' || key === 'tcell') {
      if (/dew|humid|oven|room|ambient|gas|anode|cathode|line|inlet|outlet/.test(key) && !key.includes('cell')) continue;
      const isCellKey = key.includes('cell');
      if (conditions.temperatureC !== undefined && (temperatureFromCellKey || !isCellKey)) continue;
      const temperature = readTemperature(pair.value);
      if (temperature !== null) {
        conditions.temperatureC = temperature;
        temperatureFromCellKey = isCellKey;
      }
      continue;
    }
    if (key.includes('pressure') || key === 'p_back' || key === 'pback') {
      const isBackKey = key.includes('back');
      if (conditions.backPressureKPa !== undefined && (pressureFromBackKey || !isBackKey)) continue;
      const pressure = readPressure(pair.key, pair.value);
      if (pressure !== null) {
        pressureNote = setBackPressure(conditions, pressure, pair.value);
        pressureFromBackKey = isBackKey;
      }
      continue;
    }
    if ((key === 'gas' || key === 'gases' || key.includes('gas pair') || key === 'reactants') && pair.value.includes('/')) {
      const [anode, cathode] = pair.value.split('/').map((part) => part.trim());
      if (anode && conditions.anodeGas === undefined) conditions.anodeGas = anode;
      if (cathode && conditions.cathodeGas === undefined) conditions.cathodeGas = cathode;
      continue;
    }
    if ((key.includes('anode') || key === 'fuel') && conditions.anodeGas === undefined && looksLikeGas(key, pair.value)) {
      conditions.anodeGas = pair.value;
      continue;
    }
    if ((key.includes('cathode') || key === 'oxidant') && conditions.cathodeGas === undefined && looksLikeGas(key, pair.value)) {
      conditions.cathodeGas = pair.value;
    }
  }
  if (pressureNote !== null) notes.push(pressureNote);
  if (notes.length > 0) conditions.notes = notes;
  return conditions;
}

/** Active areas of single test cells (common practice in the trade: 1–100 cm², a few up to a few hundred). */
export const AREA_RANGE_CM2: readonly [number, number] = [0.5, 1000];

function formatKPa(value: number): string {
  return String(Number(value.toFixed(1)));
}

// Stores the absolute pressure and what was stated; returns the sentence saying how it was read.
function setBackPressure(conditions: FileConditions, pressure: PressureReading, stated: string): string | null {
  // keep what the file said, with the basis when only the key carried it ("Back pressure (gauge): 50 kPa")
  conditions.backPressureStated = pressure.basisFromKey ? `${stated.trim()} (${pressure.basis})` : stated.trim();
  conditions.backPressureBasis = pressure.basis;
  if (pressure.basis === 'absolute') {
    conditions.backPressureKPa = pressure.statedKPa;
    return null;
  }
  if (pressure.basis === 'gauge') {
    conditions.backPressureKPa = pressure.statedKPa + STANDARD_ATMOSPHERE_KPA;
    return `back-pressure "${stated.trim()}" is gauge: stored as ${formatKPa(conditions.backPressureKPa)} kPa absolute (plus the standard atmosphere, 101.325 kPa)`;
  }
  if (pressure.statedKPa < LOWEST_ABSOLUTE_KPA) {
    conditions.backPressureKPa = pressure.statedKPa + STANDARD_ATMOSPHERE_KPA;
    return `back-pressure "${stated.trim()}" does not say gauge or absolute; below ${LOWEST_ABSOLUTE_KPA} kPa it can only be gauge: stored as ${formatKPa(conditions.backPressureKPa)} kPa absolute`;
  }
  conditions.backPressureKPa = pressure.statedKPa;
  return `back-pressure "${stated.trim()}" does not say gauge or absolute; read as absolute (${formatKPa(pressure.statedKPa)} kPa); if it is gauge, the absolute pressure is ${formatKPa(pressure.statedKPa + STANDARD_ATMOSPHERE_KPA)} kPa`;
}

/**
 * Fills the conditions `target` does not state from `extra` (conditions below a table, or on a
 * workbook's key–value sheet): the first statement of each condition wins. Mutates `target`.
 * Cost: O(keys).
 * @example mergeConditions(fromHeader, fromSheet)
 */
export function mergeConditions(target: FileConditions, extra: FileConditions): string[] {
  const taken: string[] = [];
  const areaTaken = target.areaCm2 === undefined && extra.areaCm2 !== undefined;
  if (areaTaken) {
    target.areaCm2 = extra.areaCm2;
    if (extra.areaStated !== undefined) target.areaStated = extra.areaStated;
    taken.push('active area');
  }
  for (const [key, label] of [['temperatureC', 'cell temperature'], ['anodeGas', 'anode gas'], ['cathodeGas', 'cathode gas']] as const) {
    if (target[key] === undefined && extra[key] !== undefined) {
      (target as unknown as Record<string, unknown>)[key] = extra[key];
      taken.push(label);
    }
  }
  // the back-pressure and how it was stated belong together
  const pressureTaken = target.backPressureKPa === undefined && extra.backPressureKPa !== undefined;
  if (pressureTaken) {
    target.backPressureKPa = extra.backPressureKPa;
    if (extra.backPressureStated !== undefined) target.backPressureStated = extra.backPressureStated;
    if (extra.backPressureBasis !== undefined) target.backPressureBasis = extra.backPressureBasis;
    taken.push('back-pressure');
  }
  for (const [key, value] of Object.entries(extra.raw)) if (!(key in target.raw)) target.raw[key] = value;
  // notes about what was taken (area from dimensions, gauge pressure); a skipped specific area is always worth saying
  const notes = (extra.notes ?? []).filter((note) => (note.includes('area') ? areaTaken || note.includes('not used') : note.includes('back-pressure') ? pressureTaken : true));
  if (notes.length > 0) target.notes = [...(target.notes ?? []), ...notes];
  return taken;
}
