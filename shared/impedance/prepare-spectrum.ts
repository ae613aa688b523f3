// Checks an impedance spectrum and orders it from high to low frequency, the order every
// impedance analysis here walks it in.
import type { ImpedanceSpectrum } from './types';

/** A checked spectrum, sorted by falling frequency, as plain arrays. */
export interface SortedSpectrum {
  frequencyHz: number[];
  zReal: number[];
  zImag: number[];
}

/**
 * Validates a spectrum and sorts it by falling frequency (stable for repeated frequencies).
 * Cost: O(n log n).
 * @throws RangeError when the arrays are missing or differ in length, hold fewer than `minimum`
 *   points, a frequency is not a positive finite number, or an impedance value is not finite.
 * @example sortSpectrum({ frequencyHz: [1, 10], zReal: [0.3, 0.2], zImag: [-0.05, -0.02] }, 'x').frequencyHz // [10, 1]
 */
export function sortSpectrum(spectrum: ImpedanceSpectrum, caller: string, minimum = 1): SortedSpectrum {
  if (spectrum === null || typeof spectrum !== 'object' || !spectrum.frequencyHz || !spectrum.zReal || !spectrum.zImag) {
    throw new RangeError(`${caller}: the spectrum needs frequencyHz, zReal and zImag`);
  }
  const n = spectrum.frequencyHz.length;
  if (spectrum.zReal.length !== n || spectrum.zImag.length !== n) {
    throw new RangeError(`${caller}: frequencyHz has ${n} points but zReal has ${spectrum.zReal.length} and zImag ${spectrum.zImag.length}`);
  }
  if (n < minimum) throw new RangeError(`${caller}: at least ${minimum} points are needed, got ${n}`);
  const order: number[] = [];
  for (let i = 0; i < n; i++) {
    const f = spectrum.frequencyHz[i];
    if (!(Number.isFinite(f) && f > 0)) throw new RangeError(`${caller}: point ${i}: frequency must be a positive number of Hz, got ${f}`);
    if (!Number.isFinite(spectrum.zReal[i]) || !Number.isFinite(spectrum.zImag[i])) {
      throw new RangeError(`${caller}: point ${i} (${f} Hz): Z′ and Z″ must be finite numbers, got ${spectrum.zReal[i]} and ${spectrum.zImag[i]}`);
    }
    order.push(i);
  }
  order.sort((a, b) => spectrum.frequencyHz[b] - spectrum.frequencyHz[a] || a - b);
  return {
    frequencyHz: order.map((i) => spectrum.frequencyHz[i]),
    zReal: order.map((i) => spectrum.zReal[i]),
    zImag: order.map((i) => spectrum.zImag[i]),
  };
}
