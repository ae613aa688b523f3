// Coded units for designed experiments: a continuous factor's low..high range maps to −1..+1.
// Fitting in coded units keeps the model matrix well conditioned and makes coefficients
// comparable across factors with different units (°C, mg/cm², wt %).

function checkRange(fn: string, low: number, high: number): void {
  if (!Number.isFinite(low) || !Number.isFinite(high)) {
    throw new RangeError(`${fn}: low and high must be finite numbers (got low = ${low}, high = ${high})`);
  }
  if (!(low < high)) {
    throw new RangeError(`${fn}: low must be below high (got low = ${low}, high = ${high})`);
  }
}

/**
 * Coded value of a factor setting: (value − centre) / half-range, centre = (low + high)/2,
 * half-range = (high − low)/2, so low → −1, centre → 0, high → +1.
 * Reference: Montgomery, Design and Analysis of Experiments, ch. 6 (coded variables).
 * Cost: O(1).
 * @throws RangeError when low ≥ high, or any argument is not finite.
 * @example toCoded(170, 160, 180) // 0.5
 */
export function toCoded(value: number, low: number, high: number): number {
  checkRange('toCoded', low, high);
  if (!Number.isFinite(value)) throw new RangeError(`toCoded: value must be a finite number (got ${value})`);
  const centre = (low + high) / 2;
  const halfRange = (high - low) / 2;
  return (value - centre) / halfRange;
}

/**
 * Actual value of a coded setting: centre + coded × half-range (the inverse of toCoded).
 * Reference: Montgomery, Design and Analysis of Experiments, ch. 6 (coded variables).
 * Cost: O(1).
 * @throws RangeError when low ≥ high, or any argument is not finite.
 * @example fromCoded(0.5, 160, 180) // 175
 */
export function fromCoded(coded: number, low: number, high: number): number {
  checkRange('fromCoded', low, high);
  if (!Number.isFinite(coded)) throw new RangeError(`fromCoded: coded value must be a finite number (got ${coded})`);
  const centre = (low + high) / 2;
  const halfRange = (high - low) / 2;
  return centre + coded * halfRange;
}
