// Which columns of a parsed table hold an impedance spectrum: frequency, the real and imaginary
// parts (or the modulus and phase when that is all a file gives), and their units.
import type { HfrUnit, ImpedanceMapping, ParsedTable } from '../curves/types';

export interface ImpedanceColumnDetection {
  /** null when no frequency column with impedance columns was found */
  mapping: ImpedanceMapping | null;
  /** one sentence per decision, for the upload's notes */
  reasons: string[];
}

const FREQUENCY = /^(freq(uency)?|f)\b|frequenz|fr[eé]quence/i;
const MAGNITUDE = /\|\s*z\s*\||\bmod(ulus)?\s*\(?z\)?|\bzmod\b|\bmag(nitude)?\b|\babs\s*\(?z\)?/i;
const PHASE = /phase|\bphi\b|\bθ|\btheta\b|∠/i;
// the imaginary part: Z'' (any quote marks), Zimag, Im(Z), Z_im, X (reactance); a leading minus means −Z″
const IMAGINARY = /(z\s*(''|"|″|’’|′′|_?im(ag(inary)?)?\b)|\bim\s*\(?\s*z\s*\)?|\bimag(inary)?\b|\breactance\b)/i;
const REAL = /(z\s*('|′|’|_?re(al)?\b)|\bre\s*\(?\s*z\s*\)?|\breal\b)/i;

/** The unit written in a header's parentheses, brackets or after a slash, as text. */
function unitText(header: string): string {
  const bracket = /[([]([^)\]]*)[)\]]\s*$/.exec(header);
  if (bracket) return bracket[1]!.trim();
  const slash = /\/\s*([^/]+)$/.exec(header);
  return slash ? slash[1]!.trim() : '';
}

/** Frequency unit of a header; Hz when none is written. */
function frequencyUnit(header: string): 'Hz' | 'kHz' | 'MHz' | 'rad/s' {
  const unit = unitText(header).toLowerCase().replace(/\s/g, '');
  if (unit === 'khz') return 'kHz';
  if (unit === 'mhz' && /MHz/.test(header)) return 'MHz';
  if (unit === 'rad/s' || /rad\s*\/?\s*s|\bomega\b|ω/i.test(header)) return 'rad/s';
  return 'Hz';
}

/** Impedance unit of a header (Ω, mΩ, Ω·cm², mΩ·cm²), or null when none is written. */
export function impedanceUnit(header: string): HfrUnit | null {
  const unit = unitText(header).toLowerCase().replace(/\s|·|\*|\.|-/g, '').replace(/ω|Ω/gi, 'ohm').replace(/ohms/, 'ohm');
  if (!unit) return null;
  const milli = /^(m|milli)ohm/.test(unit);
  const areal = /cm(2|²|\^2)/.test(unit);
  if (!/ohm/.test(unit)) return null;
  if (milli) return areal ? 'mohm*cm2' : 'mohm';
  return areal ? 'ohm*cm2' : 'ohm';
}

/**
 * Finds the columns of an impedance spectrum by their headers.
 * Method: frequency from a header starting "freq"/"f" (unit Hz, kHz, MHz or rad/s written in the
 * header; Hz when none); the real part from Z′ / Zreal / Re(Z); the imaginary part from Z″ /
 * Zimag / Im(Z), marked `negatedHeader` when the header starts with a minus (−Z″, the usual plot
 * axis); when there is no real/imaginary pair, the modulus |Z| and the phase (degrees, or radians
 * when written). Impedance units from the header; a column without one is read as Ω (total) and
 * said so. Only numeric columns are considered.
 * Reference: none needed (header bookkeeping).
 * Cost: O(columns).
 * @example detectImpedanceColumns(table).mapping?.zImag?.negatedHeader // true for "-Z'' (Ohm)"
 */
export function detectImpedanceColumns(table: ParsedTable): ImpedanceColumnDetection {
  const reasons: string[] = [];
  const numeric = table.header.map((header, index) => ({ header: header.trim(), index })).filter((c) => table.columns[c.index] != null);
  const quoted = (index: number) => `"${table.header[index]}"`;
  const frequency = numeric.find((c) => FREQUENCY.test(c.header));
  if (!frequency) return { mapping: null, reasons: ['no frequency column'] };
  const rest = numeric.filter((c) => c.index !== frequency.index);
  const imaginary = rest.find((c) => IMAGINARY.test(c.header) && !MAGNITUDE.test(c.header));
  const real = rest.find((c) => c !== imaginary && REAL.test(c.header) && !IMAGINARY.test(c.header) && !MAGNITUDE.test(c.header));
  const fUnit = frequencyUnit(frequency.header);
  const mapping: ImpedanceMapping = { frequency: { column: frequency.index, unit: fUnit } };
  reasons.push(`${quoted(frequency.index)} read as frequency in ${fUnit}`);
  const unitOf = (index: number, word: string) => {
    const unit = impedanceUnit(table.header[index]!);
    if (unit) return unit;
    reasons.push(`${quoted(index)} states no unit: ${word} read as Ω (total, divided by the area)`);
    return 'ohm' as const;
  };
  if (real && imaginary) {
    mapping.zReal = { column: real.index, unit: unitOf(real.index, 'impedance') };
    const negatedHeader = /^\s*[-−–]/.test(imaginary.header);
    mapping.zImag = { column: imaginary.index, unit: impedanceUnit(imaginary.header) ?? mapping.zReal.unit, ...(negatedHeader && { negatedHeader }) };
    reasons.push(`${quoted(real.index)} read as Z′ and ${quoted(imaginary.index)} as ${negatedHeader ? '−Z″ (headed with a minus)' : 'Z″'}`);
    return { mapping, reasons };
  }
  const magnitude = rest.find((c) => MAGNITUDE.test(c.header));
  const phase = rest.find((c) => PHASE.test(c.header));
  if (magnitude && phase) {
    mapping.magnitude = { column: magnitude.index, unit: unitOf(magnitude.index, 'modulus') };
    const radians = /rad/i.test(unitText(phase.header));
    mapping.phase = { column: phase.index, unit: radians ? 'rad' : 'deg' };
    reasons.push(`no Z′/Z″ columns: Z′ and Z″ computed from the modulus ${quoted(magnitude.index)} and the phase ${quoted(phase.index)} (${radians ? 'radians' : 'degrees'})`);
    return { mapping, reasons };
  }
  return { mapping: null, reasons: [...reasons, 'a frequency column but no Z′ and Z″ (or |Z| and phase) columns'] };
}

/** True when the table's headers look like an impedance spectrum (frequency plus impedance columns). */
export function looksLikeImpedance(table: ParsedTable): boolean {
  return detectImpedanceColumns(table).mapping !== null;
}
