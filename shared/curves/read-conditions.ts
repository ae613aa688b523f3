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

// Area in cm²; mm² and m² are converted; anything else is read as cm², the trade's unit.
function readArea(value: string): number | null {
  const reading = readNumberWithUnit(value);
  if (reading === null || reading.number <= 0) return null;
  const unit = reading.unit.normalize('NFKC').toLowerCase().replace(/[\s^]/g, '');
  if (unit.startsWith('mm2')) return reading.number / 100;
  if (unit.startsWith('m2')) return reading.number * 1e4;
  return reading.number;
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

// Pressure in kPa. Reference: 1 bar = 100 kPa (exact), 1 atm = 101.325 kPa (exact),
// 1 psi = 6.894757 kPa (NIST SP 811, appendix B.8).
function readPressure(value: string): number | null {
  const reading = readNumberWithUnit(value);
  if (reading === null) return null;
  const unit = reading.unit.toLowerCase().replace(/[\s()]/g, '');
  if (unit.startsWith('mbar')) return reading.number * 0.1;
  if (unit.startsWith('bar')) return reading.number * 100;
  if (unit.startsWith('kpa')) return reading.number;
  if (unit.startsWith('mpa')) return reading.number * 1000;
  if (unit.startsWith('pa')) return reading.number / 1000;
  if (unit.startsWith('psi')) return reading.number * 6.894757;
  if (unit.startsWith('atm')) return reading.number * 101.325;
  return reading.number;
}

function looksLikeGas(key: string, value: string): boolean {
  if (/^[+-]?\d/.test(value)) return false;
  if (/flow|stoich|lambda|pressure|temp|dew|humid|loading|catalyst|lot|gdl|ionomer|binder|membrane/.test(key)) return false;
  if (/gas|feed|fuel|oxidant/.test(key)) return true;
  return GAS_WORD.test(value);
}

/**
 * Metadata lines above the header → FileConditions: active area (cm²), cell temperature (°C),
 * anode and cathode gas, back pressure (kPa), and every key/value pair as text in `raw`.
 * A key naming the cell ("Cell temperature") wins over a plain "Temperature"; other
 * temperatures (dew point, humidifier, oven) are kept only in `raw`.
 * Reference: none — a reading of how lab exports write their headers (common practice).
 * Cost: O(total length of lines).
 * @example readConditions(['Active area: 25 cm2', 'Anode: H2'], ',') // { areaCm2: 25, anodeGas: 'H2', raw: {...} }
 */
export function readConditions(lines: readonly string[], delimiter: string): FileConditions {
  const conditions: FileConditions = { raw: {} };
  let temperatureFromCellKey = false;
  let pressureFromBackKey = false;
  for (const line of lines) {
    const pair = splitMetadataLine(line, delimiter);
    if (pair === null) continue;
    if (!(pair.key in conditions.raw)) conditions.raw[pair.key] = pair.value;
    const key = pair.key.toLowerCase();
    if (key.includes('area')) {
      const area = readArea(pair.value);
      if (area !== null && conditions.areaCm2 === undefined) conditions.areaCm2 = area;
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
      const pressure = readPressure(pair.value);
      if (pressure !== null) {
        conditions.backPressureKPa = pressure;
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
  return conditions;
}
