// HFR of an impedance spectrum: where it meets the real axis at the high-frequency end.
import { sortSpectrum } from './prepare-spectrum';
import type { ImpedanceSpectrum } from './types';

export interface HighFrequencyIntercept {
  /** Ω·cm², or null when the spectrum does not cross the real axis at its high-frequency end */
  hfr: number | null;
  /** 'crossing': interpolated between the two points either side of Z″ = 0; 'measured-zero': a point with Z″ = 0 */
  method: 'crossing' | 'measured-zero' | null;
  /** frequency of the crossing, Hz (log-interpolated) */
  frequencyHz: number | null;
  note: string;
}

/**
 * High-frequency real-axis intercept of a spectrum.
 * Method: walking from the highest frequency down, the first place where Z″ goes from inductive
 * (> 0, lead inductance) to capacitive (< 0) — or a point with Z″ = 0 exactly — is the intercept;
 * Z′ there is interpolated linearly in Z″ between the two bracketing points, the frequency in
 * log f. A spectrum that starts capacitive never meets the axis at its high end: null, and the
 * caller falls back on the fitted series resistance (impedanceMetrics does).
 * Reference: Orazem & Tribollet, "Electrochemical Impedance Spectroscopy" (Wiley): the
 * high-frequency limit of Z is the ohmic resistance; reading it where the spectrum crosses the real
 * axis is common practice in the trade.
 * Cost: O(n log n) (sorting by frequency).
 * @throws RangeError when the spectrum is malformed (as sortSpectrum) or has fewer than 2 points.
 * @example highFrequencyIntercept({ frequencyHz: [1e5, 5e4, 2e4], zReal: [0.119, 0.121, 0.125], zImag: [0.002, -0.002, -0.006] }).hfr // 0.12
 */
export function highFrequencyIntercept(spectrum: ImpedanceSpectrum): HighFrequencyIntercept {
  const sorted = sortSpectrum(spectrum, 'highFrequencyIntercept', 2);
  const { frequencyHz: f, zReal: re, zImag: im } = sorted;
  for (let i = 0; i < f.length; i++) {
    if (im[i] === 0) {
      return { hfr: re[i], method: 'measured-zero', frequencyHz: f[i], note: `HFR: Z′ at ${formatHz(f[i])}, where Z″ = 0` };
    }
    if (im[i] < 0) {
      if (i === 0) {
        return {
          hfr: null,
          method: null,
          frequencyHz: null,
          note: `the spectrum does not cross the real axis at its high-frequency end (Z″ < 0 already at ${formatHz(f[0])})`,
        };
      }
      // im[i − 1] > 0 > im[i]: the crossing
      const fraction = im[i - 1] / (im[i - 1] - im[i]);
      const hfr = re[i - 1] + fraction * (re[i] - re[i - 1]);
      const frequency = Math.exp(Math.log(f[i - 1]) + fraction * (Math.log(f[i]) - Math.log(f[i - 1])));
      return { hfr, method: 'crossing', frequencyHz: frequency, note: `HFR: real-axis crossing interpolated between ${formatHz(f[i - 1])} and ${formatHz(f[i])}` };
    }
  }
  return { hfr: null, method: null, frequencyHz: null, note: 'Z″ > 0 at every point: no capacitive arc, no intercept' };
}

function formatHz(value: number): string {
  if (value >= 1000) return `${Number((value / 1000).toPrecision(3))} kHz`;
  if (value >= 1) return `${Number(value.toPrecision(3))} Hz`;
  return `${Number((value * 1000).toPrecision(3))} mHz`;
}
