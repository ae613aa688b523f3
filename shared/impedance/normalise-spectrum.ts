// A spectrum as a file gives it (any sign convention, Ω or Ω·cm², any order) → the internal
// spectrum: Z″ = Im Z, Ω·cm², sorted from high to low frequency.
import { hfrFactor } from '../units/area-specific-resistance';
import type { HfrUnit } from '../curves/types';
import { detectSignConvention } from './sign-convention';
import type { SignConvention } from './sign-convention';
import { sortSpectrum } from './prepare-spectrum';
import type { ImpedanceSpectrum } from './types';

export interface RawSpectrum {
  frequencyHz: ArrayLike<number>;
  zReal: ArrayLike<number>;
  /** the file's imaginary column, in whichever sign it uses */
  imaginaryColumn: ArrayLike<number>;
}

export interface NormaliseOptions {
  /** the column's sign when known; default 'auto' (detected) */
  convention?: 'imaginary' | 'negated' | 'auto';
  /** unit of the impedance columns: Ω·cm² or mΩ·cm² (area-specific), or Ω / mΩ (needs the area); default 'ohm*cm2' */
  unit?: HfrUnit;
  /** active area, cm², for a total impedance */
  areaCm2?: number | null;
}

export interface NormalisedSpectrum {
  spectrum: { frequencyHz: Float64Array; zReal: Float64Array; zImag: Float64Array };
  convention: 'imaginary' | 'negated';
  /** the detection, when the convention was not given */
  detection: SignConvention | null;
  /** factor applied to turn the file's unit into Ω·cm² */
  areaFactor: number;
  notes: string[];
}

/**
 * Normalises a spectrum read from a file.
 * Definition: Z″ = column (convention 'imaginary') or −column ('negated'; detected by
 * detectSignConvention when not given); both parts × the area factor of the unit (Ω·cm² ×1,
 * mΩ·cm² ×10⁻³, Ω × A, mΩ × 10⁻³·A — an impedance scales like a resistance, hfrFactor); then sorted
 * by falling frequency.
 * Reference: area-specific impedance as for the HFR (R·A); sign convention as detectSignConvention.
 * Cost: O(n log n).
 * @throws RangeError when the arrays are malformed or of different lengths, a value is not finite,
 *   a frequency is not positive, the unit needs an area that is missing, or the convention is unknown.
 * @example normaliseSpectrum({ frequencyHz: [1e4, 10, 1], zReal: [4.8, 12, 14], imaginaryColumn: [0.1, 3, 1] }, { unit: 'mohm', areaCm2: 25 }).spectrum.zImag[1] // −0.075
 */
export function normaliseSpectrum(raw: RawSpectrum, options: NormaliseOptions = {}): NormalisedSpectrum {
  if (raw === null || typeof raw !== 'object') throw new RangeError('normaliseSpectrum: the spectrum must be an object');
  const sorted = sortSpectrum({ frequencyHz: raw.frequencyHz, zReal: raw.zReal, zImag: raw.imaginaryColumn }, 'normaliseSpectrum', 1);
  const requested = options.convention ?? 'auto';
  if (requested !== 'auto' && requested !== 'imaginary' && requested !== 'negated') {
    throw new RangeError(`normaliseSpectrum: convention must be 'imaginary', 'negated' or 'auto', got ${String(requested)}`);
  }
  const factor = hfrFactor(options.unit ?? 'ohm*cm2', options.areaCm2);
  const detection = requested === 'auto' ? detectSignConvention(sorted.zImag) : null;
  const convention = detection ? detection.convention : (requested as 'imaginary' | 'negated');
  const sign = convention === 'negated' ? -1 : 1;
  const n = sorted.frequencyHz.length;
  const spectrum = { frequencyHz: Float64Array.from(sorted.frequencyHz), zReal: new Float64Array(n), zImag: new Float64Array(n) };
  for (let i = 0; i < n; i++) {
    spectrum.zReal[i] = sorted.zReal[i] * factor;
    spectrum.zImag[i] = sign * sorted.zImag[i] * factor;
  }
  const notes: string[] = [];
  if (detection) notes.push(detection.note);
  else notes.push(`imaginary column taken as ${convention === 'imaginary' ? 'Z″' : '−Z″ (sign turned)'}, as stated`);
  if (factor !== 1) notes.push(`impedance × ${Number(factor.toPrecision(6))} to Ω·cm²`);
  return { spectrum, convention, detection, areaFactor: factor, notes };
}

export type { ImpedanceSpectrum };
