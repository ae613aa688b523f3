// Bode representation of a spectrum: modulus and phase against frequency.
import { sortSpectrum } from './prepare-spectrum';
import type { ImpedanceSpectrum } from './types';

export interface BodePoints {
  /** falling frequency, Hz */
  frequencyHz: Float64Array;
  /** |Z|, Ω·cm² */
  modulus: Float64Array;
  /** phase angle of Z, degrees, in (−180, 180]; negative on a capacitive arc (plot −phase upwards) */
  phaseDeg: Float64Array;
}

/**
 * Bode points of a spectrum.
 * Definition: |Z| = √(Z′² + Z″²); φ = atan2(Z″, Z′) in degrees (−90° for a pure capacitor, 0° for a
 * resistor, +90° for an inductor).
 * Reference: Orazem & Tribollet, "Electrochemical Impedance Spectroscopy" (Wiley), on Bode plots;
 * Bard & Faulkner, "Electrochemical Methods", 2nd ed., ch. 10.
 * Cost: O(n log n) (sorting by frequency).
 * @throws RangeError when the spectrum is malformed (as sortSpectrum).
 * @example bode({ frequencyHz: [1], zReal: [1], zImag: [-1] }).phaseDeg[0] // −45
 */
export function bode(spectrum: ImpedanceSpectrum): BodePoints {
  const sorted = sortSpectrum(spectrum, 'bode', 1);
  const n = sorted.frequencyHz.length;
  const modulus = new Float64Array(n);
  const phaseDeg = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    modulus[i] = Math.hypot(sorted.zReal[i], sorted.zImag[i]);
    phaseDeg[i] = (Math.atan2(sorted.zImag[i], sorted.zReal[i]) * 180) / Math.PI;
  }
  return { frequencyHz: Float64Array.from(sorted.frequencyHz), modulus, phaseDeg };
}
