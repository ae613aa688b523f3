// Reads a column header such as `Current density (mA/cm²)`, `U_cell / mV` or `R_HF [mΩ]`
// into the quantity it names and the unit it is in, so an import can be mapped without asking.
import type { CurrentUnit, HfrUnit, TemperatureUnit, TimeUnit, VoltageUnit } from '../curves/types';

export type PowerUnit = 'W/cm2' | 'mW/cm2';
export type PressureUnit = 'kPa' | 'bar' | 'mbar' | 'Pa' | 'psi' | 'atm';

interface HeaderUnitBase {
  /** the header text without its unit part, trimmed */
  name: string;
  /** the unit part as written (inside brackets, after a slash, or trailing), or null */
  unitText: string | null;
  /** the name says the voltage is iR-corrected (iR-free, iR-compensated) */
  irFree: boolean;
}

/** What a header names. `unit` is null when the header names the quantity but not its unit. */
export type HeaderUnitMatch = HeaderUnitBase &
  (
    | { quantity: 'current'; unit: CurrentUnit | null }
    | { quantity: 'voltage'; unit: VoltageUnit | null }
    | { quantity: 'hfr'; unit: HfrUnit | null }
    | { quantity: 'time'; unit: TimeUnit | null }
    | { quantity: 'temperature'; unit: TemperatureUnit | null }
    | { quantity: 'power'; unit: PowerUnit | null }
    | { quantity: 'pressure'; unit: PressureUnit | null }
    | { quantity: null; unit: null }
  );

export type HeaderQuantity = NonNullable<HeaderUnitMatch['quantity']>;

type UnitEntry = readonly [HeaderQuantity, string];

// Keys are unit text after normaliseUnitKey (lower case, no separators, no slash, "cm-2" → "cm2").
// Writing "Ω/cm²" for Ω·cm² is a frequent slip; both normalise to the same key on purpose.
const UNIT_TABLE: ReadonlyMap<string, UnitEntry> = new Map<string, UnitEntry>([
  ['acm2', ['current', 'A/cm2']],
  ['ampcm2', ['current', 'A/cm2']],
  ['ampscm2', ['current', 'A/cm2']],
  ['macm2', ['current', 'mA/cm2']],
  ['a', ['current', 'A']],
  ['amp', ['current', 'A']],
  ['amps', ['current', 'A']],
  ['ampere', ['current', 'A']],
  ['amperes', ['current', 'A']],
  ['ma', ['current', 'mA']],
  ['milliamp', ['current', 'mA']],
  ['milliamps', ['current', 'mA']],
  ['milliampere', ['current', 'mA']],
  ['v', ['voltage', 'V']],
  ['volt', ['voltage', 'V']],
  ['volts', ['voltage', 'V']],
  ['mv', ['voltage', 'mV']],
  ['millivolt', ['voltage', 'mV']],
  ['millivolts', ['voltage', 'mV']],
  ['ohmcm2', ['hfr', 'ohm*cm2']],
  ['mohmcm2', ['hfr', 'mohm*cm2']],
  ['milliohmcm2', ['hfr', 'mohm*cm2']],
  ['ohm', ['hfr', 'ohm']],
  ['mohm', ['hfr', 'mohm']],
  ['milliohm', ['hfr', 'mohm']],
  ['s', ['time', 's']],
  ['sec', ['time', 's']],
  ['secs', ['time', 's']],
  ['second', ['time', 's']],
  ['seconds', ['time', 's']],
  ['hhmmss', ['time', 's']],
  ['min', ['time', 'min']],
  ['mins', ['time', 'min']],
  ['minute', ['time', 'min']],
  ['minutes', ['time', 'min']],
  ['h', ['time', 'h']],
  ['hr', ['time', 'h']],
  ['hrs', ['time', 'h']],
  ['hour', ['time', 'h']],
  ['hours', ['time', 'h']],
  ['iso8601', ['time', 'timestamp']],
  ['utc', ['time', 'timestamp']],
  ['yyyymmddhhmmss', ['time', 'timestamp']],
  ['c', ['temperature', 'C']],
  ['degc', ['temperature', 'C']],
  ['degreec', ['temperature', 'C']],
  ['degreesc', ['temperature', 'C']],
  ['celsius', ['temperature', 'C']],
  ['oc', ['temperature', 'C']],
  ['k', ['temperature', 'K']],
  ['kelvin', ['temperature', 'K']],
  ['wcm2', ['power', 'W/cm2']],
  ['mwcm2', ['power', 'mW/cm2']],
  ['kpa', ['pressure', 'kPa']],
  ['kpaa', ['pressure', 'kPa']],
  ['kpag', ['pressure', 'kPa']],
  ['bar', ['pressure', 'bar']],
  ['bara', ['pressure', 'bar']],
  ['barg', ['pressure', 'bar']],
  ['mbar', ['pressure', 'mbar']],
  ['pa', ['pressure', 'Pa']],
  ['psi', ['pressure', 'psi']],
  ['psig', ['pressure', 'psi']],
  ['psia', ['pressure', 'psi']],
  ['atm', ['pressure', 'atm']],
]);

/**
 * Unit text → lookup key: NFKC (so ² → 2, Ω → Ω, ℃ → °C), lower case, µ/μ → u, ω → ohm,
 * separators and the degree sign dropped, "per cm2" and "cm-2" → "cm2", slash dropped.
 * Cost: O(length).
 * @example normaliseUnitKey('mΩ·cm²') // 'mohmcm2'
 */
export function normaliseUnitKey(unitText: string): string {
  let key = unitText.normalize('NFKC').toLowerCase();
  key = key.replace(/[µμ]/g, 'u').replace(/ω/g, 'ohm').replace(/ohms/g, 'ohm');
  key = key.replace(/[\s·*.×⋅∙^_°'"()[\]{}:,;\-−–—‐]/g, '');
  key = key.replace(/percm/g, 'cm').replace(/\//g, '');
  return key;
}

/**
 * Unit text alone → the quantity and unit it denotes, or null when it is not a unit we read.
 * Cost: O(length).
 * @example lookUpUnit('mA cm-2') // ['current', 'mA/cm2']
 */
export function lookUpUnit(unitText: string): UnitEntry | null {
  const key = normaliseUnitKey(unitText);
  if (key.length === 0) return null;
  return UNIT_TABLE.get(key) ?? null;
}

interface NameReading {
  quantity: HeaderQuantity | null;
  irFree: boolean;
  impliedTimeUnit: TimeUnit | null;
}

const FIRST_LETTER_QUANTITY: Readonly<Record<string, HeaderQuantity>> = {
  U: 'voltage',
  u: 'voltage',
  V: 'voltage',
  v: 'voltage',
  E: 'voltage',
  e: 'voltage',
  I: 'current',
  i: 'current',
  J: 'current',
  j: 'current',
  R: 'hfr',
  r: 'hfr',
  T: 'temperature',
  t: 'time',
  P: 'power',
  p: 'pressure',
};

// The name part → quantity, by keywords of the trade. Order matters: "power density" must
// not read as current density, "iR-free voltage" is still a voltage.
function readName(name: string): NameReading {
  const tokens = name.normalize('NFKC').split(/[^A-Za-z0-9]+/).filter((token) => token.length > 0);
  const lower = tokens.map((token) => token.toLowerCase());
  const joined = lower.join('');
  const has = (word: string): boolean => lower.includes(word);
  // "E_iR-free", "V_iR-corrected", "IR-free voltage", "iR-compensated potential", "HFR-free voltage"
  const irFree =
    /(?:ir|hfr|ohmic)(?:free|corr|comp|less)/.test(joined) ||
    ((has('ir') || has('hfr') || has('ohmic')) && (has('free') || has('corrected') || has('compensated') || has('corr')));
  const namesVoltage = joined.includes('volt') || joined.includes('potential') || has('ecell') || has('ucell') || has('vcell');
  let quantity: HeaderQuantity | null = null;
  let impliedTimeUnit: TimeUnit | null = null;

  if (irFree && (namesVoltage || (tokens.length > 0 && tokens[0].length === 1 && FIRST_LETTER_QUANTITY[tokens[0]] === 'voltage') || lower.length <= 3)) {
    // an iR-corrected voltage, even when its name mentions the HFR it was corrected with
    quantity = 'voltage';
  } else if (joined.includes('hfr') || joined.includes('resistance') || has('asr') || has('rhf') || has('rohm') || joined.includes('impedance') || (has('r') && has('hf'))) {
    quantity = 'hfr';
  } else if (joined.includes('power')) {
    quantity = 'power';
  } else if (joined.includes('temp') || has('tcell') || has('celltemp')) {
    quantity = 'temperature';
  } else if (joined.includes('pressure') || has('pback')) {
    quantity = 'pressure';
  } else if (
    joined.includes('time') ||
    joined.includes('elapsed') ||
    has('date') ||
    has('datetime') ||
    joined.startsWith('date') ||
    joined.includes('duration') ||
    joined.includes('clock') ||
    has('hours') ||
    has('hrs') ||
    has('minutes') ||
    has('seconds')
  ) {
    quantity = 'time';
    if (joined.includes('timestamp') || joined.includes('date') || joined.includes('clock')) impliedTimeUnit = 'timestamp';
    else if (has('hours') || has('hrs') || has('hour')) impliedTimeUnit = 'h';
    else if (has('minutes') || has('min')) impliedTimeUnit = 'min';
    else if (has('seconds') || has('sec')) impliedTimeUnit = 's';
  } else if (joined.includes('volt') || joined.includes('potential') || has('ecell') || has('ucell') || has('vcell')) {
    quantity = 'voltage';
  } else if (joined.includes('current') || joined.includes('density') || has('amps') || has('icell') || has('jcell') || has('cd')) {
    quantity = 'current';
  } else if (tokens.length > 0 && tokens[0].length === 1 && FIRST_LETTER_QUANTITY[tokens[0]] !== undefined) {
    // single-letter symbols: U, V, E (voltage), I, j (current), R (resistance), T (temperature), t (time)
    quantity = FIRST_LETTER_QUANTITY[tokens[0]];
  }
  return { quantity, irFree, impliedTimeUnit };
}

interface SplitHeader {
  name: string;
  unitText: string | null;
  unit: UnitEntry | null;
}

// Finds where the unit is written: a trailing bracket group, after a slash, after a comma,
// as trailing words, or as an underscore suffix (`Voltage_V`).
function splitHeader(header: string): SplitHeader {
  const text = header.trim();
  const bracket = /^(.*?)\s*[([{]([^()[\]{}]*)[)\]}]\s*$/.exec(text);
  if (bracket !== null) {
    return { name: bracket[1].trim(), unitText: bracket[2].trim(), unit: lookUpUnit(bracket[2]) };
  }
  for (let slash = text.indexOf('/'); slash > 0; slash = text.indexOf('/', slash + 1)) {
    const right = text.slice(slash + 1);
    const unit = lookUpUnit(right);
    if (unit !== null) return { name: text.slice(0, slash).trim(), unitText: right.trim(), unit };
  }
  const comma = text.lastIndexOf(',');
  if (comma > 0) {
    const right = text.slice(comma + 1);
    const unit = lookUpUnit(right);
    if (unit !== null) return { name: text.slice(0, comma).trim(), unitText: right.trim(), unit };
  }
  const words = text.split(/\s+/);
  for (let take = Math.min(3, words.length - 1); take >= 1; take--) {
    const right = words.slice(words.length - take).join(' ');
    const unit = lookUpUnit(right);
    if (unit !== null && acceptsBareUnit(words.slice(0, words.length - take).join(' '), right, unit)) {
      return { name: words.slice(0, words.length - take).join(' '), unitText: right, unit };
    }
  }
  const underscore = text.lastIndexOf('_');
  if (underscore > 0) {
    for (let cut = underscore; cut > 0; cut = text.lastIndexOf('_', cut - 1)) {
      const right = text.slice(cut + 1);
      const unit = lookUpUnit(right);
      if (unit !== null && acceptsBareUnit(text.slice(0, cut), right, unit)) {
        return { name: text.slice(0, cut), unitText: right, unit };
      }
    }
  }
  return { name: text, unitText: null, unit: null };
}

// A unit written without brackets is believed only when it is clearly a unit (two or more
// letters, e.g. "mV") or agrees with the name ("Cell voltage V"); "Phase A" is not a current.
function acceptsBareUnit(name: string, unitText: string, unit: UnitEntry): boolean {
  if (name.trim().length === 0) return false;
  const nameQuantity = readName(name).quantity;
  if (nameQuantity === unit[0]) return true;
  return normaliseUnitKey(unitText).length >= 2 && nameQuantity === null;
}

/**
 * Column header → the quantity it names (current, voltage, HFR, time, temperature, power,
 * pressure) and its unit. Generous with spellings: brackets, parentheses or a slash around
 * the unit; ², ^2, 2, -2, ⁻², "per cm2"; Ω, Ohm, ohm; µ, μ, u; °C, degC, K.
 * When the name and the unit disagree ("Voltage (A)"), the unit wins: units are written
 * with more care than names.
 * Reference: unit symbols of the BIPM SI Brochure, 9th ed.; symbols U, E (voltage), I, j
 * (current, current density), R (resistance), T, t (temperature, time) of IUPAC's Green
 * Book (Quantities, Units and Symbols in Physical Chemistry, 3rd ed.).
 * Cost: O(length of header).
 * @example recogniseHeaderUnit('HFR (mOhm cm2)') // { quantity: 'hfr', unit: 'mohm*cm2', ... }
 */
export function recogniseHeaderUnit(header: string): HeaderUnitMatch {
  const split = splitHeader(String(header));
  const nameReading = readName(split.name);
  // "Voltage (iR-free)": the correction may sit where a unit would
  const wholeReading = split.unit === null && split.unitText !== null ? readName(String(header)) : nameReading;
  const unitQuantity = split.unit === null ? null : split.unit[0];
  const quantity = unitQuantity ?? (wholeReading.irFree ? wholeReading.quantity : nameReading.quantity);
  const base: HeaderUnitBase = { name: split.name, unitText: split.unitText, irFree: nameReading.irFree || wholeReading.irFree };
  if (quantity === null) return { ...base, quantity: null, unit: null };
  let unit: string | null = split.unit !== null && unitQuantity === quantity ? split.unit[1] : null;
  if (quantity === 'time' && unit === null) unit = nameReading.impliedTimeUnit;
  // The object literal is assembled per quantity so the union stays sound for callers.
  switch (quantity) {
    case 'current':
      return { ...base, quantity, unit: unit as CurrentUnit | null };
    case 'voltage':
      return { ...base, quantity, unit: unit as VoltageUnit | null };
    case 'hfr':
      return { ...base, quantity, unit: unit as HfrUnit | null };
    case 'time':
      return { ...base, quantity, unit: unit as TimeUnit | null };
    case 'temperature':
      return { ...base, quantity, unit: unit as TemperatureUnit | null };
    case 'power':
      return { ...base, quantity, unit: unit as PowerUnit | null };
    case 'pressure':
      return { ...base, quantity, unit: unit as PressureUnit | null };
  }
}
