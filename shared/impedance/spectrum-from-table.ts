// A parsed table and its impedance columns → the internal spectrum (Hz, Ω·cm², Z″ = Im Z, falling
// frequency), with notes on every conversion made.
import { CurveFileError } from '../curves/types';
import type { ImpedanceMapping, ParsedTable } from '../curves/types';
import { normaliseSpectrum } from './normalise-spectrum';

export interface SpectrumFromTable {
  frequencyHz: Float64Array;
  zReal: Float64Array;
  zImag: Float64Array;
  /** factor applied to turn the file's impedance into Ω·cm² */
  areaFactor: number;
  /** sign convention of the file's imaginary column */
  convention: 'imaginary' | 'negated';
  notes: string[];
}

const FREQUENCY_FACTOR = { Hz: 1, kHz: 1e3, MHz: 1e6, 'rad/s': 1 / (2 * Math.PI) } as const;

/** Fewest readings a spectrum must have to be stored (a fit needs more; see fitCircuit). */
export const MIN_SPECTRUM_POINTS = 3;

/**
 * Reads the spectrum from the mapped columns.
 * Definition: f in Hz (kHz ×10³, MHz ×10⁶, rad/s ÷ 2π); Z′, Z″ as written, or from the modulus and
 * phase as Z′ = |Z|·cos φ, Z″ = |Z|·sin φ; rows with a missing cell or a non-positive frequency are
 * left out and counted; then normaliseSpectrum (sign detected from the values, area factor).
 * Reference: Z = |Z|·e^{jφ} (Orazem & Tribollet, "Electrochemical Impedance Spectroscopy", 2nd
 * ed., ch. 1).
 * Cost: O(n log n).
 * @throws CurveFileError ('too-few-points', 'needs-area', 'bad-impedance') naming the line or
 *   column when too few usable rows remain, a total impedance has no area, or the columns are not
 *   a spectrum.
 * @example spectrumFromTable(table, mapping, 25).zReal[0] // Ω·cm²
 */
export function spectrumFromTable(table: ParsedTable, mapping: ImpedanceMapping, areaCm2: number | null): SpectrumFromTable {
  const column = (index: number) => {
    const values = table.columns[index];
    if (!values) throw new CurveFileError('text-column', `column "${table.header[index] ?? index + 1}" holds text, not numbers`, { column: table.header[index] ?? index });
    return values;
  };
  const f = column(mapping.frequency.column);
  const polar = !(mapping.zReal && mapping.zImag);
  if (polar && !(mapping.magnitude && mapping.phase)) throw new CurveFileError('bad-impedance', 'an impedance spectrum needs Z′ and Z″ columns, or |Z| and phase columns');
  const a = column(polar ? mapping.magnitude!.column : mapping.zReal!.column);
  const b = column(polar ? mapping.phase!.column : mapping.zImag!.column);
  const unit = polar ? mapping.magnitude!.unit : mapping.zReal!.unit;
  if ((unit === 'ohm' || unit === 'mohm') && !(areaCm2 != null && areaCm2 > 0)) {
    throw new CurveFileError('needs-area', `the impedance is in ${unit === 'ohm' ? 'Ω' : 'mΩ'} (total) and no active area is known to turn it into Ω·cm²; give the area with the upload or on the build`, { column: table.header[polar ? mapping.magnitude!.column : mapping.zReal!.column] });
  }
  const fScale = FREQUENCY_FACTOR[mapping.frequency.unit];
  const phaseScale = mapping.phase?.unit === 'rad' ? 1 : Math.PI / 180;
  const freq: number[] = [];
  const re: number[] = [];
  const im: number[] = [];
  let leftOut = 0;
  let firstLeftOut: number | null = null;
  for (let i = 0; i < f.length; i++) {
    const fi = f[i]! * fScale;
    if (!(Number.isFinite(fi) && fi > 0 && Number.isFinite(a[i]!) && Number.isFinite(b[i]!))) {
      leftOut++;
      firstLeftOut ??= table.dataLines[i] ?? null;
      continue;
    }
    freq.push(fi);
    if (polar) {
      re.push(a[i]! * Math.cos(b[i]! * phaseScale));
      im.push(a[i]! * Math.sin(b[i]! * phaseScale));
    } else {
      re.push(a[i]!);
      im.push(b[i]!);
    }
  }
  if (freq.length < MIN_SPECTRUM_POINTS) {
    throw new CurveFileError('too-few-points', `only ${freq.length} usable reading${freq.length === 1 ? '' : 's'} (frequency above 0 Hz with both impedance values); a spectrum needs at least ${MIN_SPECTRUM_POINTS}`, { line: table.dataLines[0], column: table.header[mapping.frequency.column] });
  }
  let normalised;
  try {
    normalised = normaliseSpectrum({ frequencyHz: freq, zReal: re, imaginaryColumn: im }, { unit, areaCm2 });
  } catch (error) {
    if (error instanceof RangeError) throw new CurveFileError('bad-impedance', error.message.replace(/^\w+: /, ''), { column: table.header[mapping.frequency.column] });
    throw error;
  }
  const notes: string[] = [];
  if (mapping.frequency.unit !== 'Hz') notes.push(`frequency converted from ${mapping.frequency.unit} to Hz`);
  if (polar) notes.push(`Z′ and Z″ computed from |Z| and the phase (${mapping.phase!.unit === 'rad' ? 'radians' : 'degrees'})`);
  if (mapping.zImag?.negatedHeader) notes.push('the imaginary column is headed −Z″');
  notes.push(...normalised.notes);
  if (unit === 'ohm' || unit === 'mohm') notes.push(`area-normalised with the active area ${areaCm2} cm²`);
  if (leftOut > 0) notes.push(`${leftOut} row${leftOut === 1 ? '' : 's'} without a positive frequency or an impedance value left out (first on line ${firstLeftOut})`);
  return { ...normalised.spectrum, areaFactor: normalised.areaFactor, convention: normalised.convention, notes };
}
