// The one rounding rule for numbers people type, store and read: round to significant digits
// (not decimals), so 0.000123456 and 123456 keep the same relative precision.
//   - SETTING_DIGITS (6): a recipe setting or a hand-typed quantity as stored on a build and as
//     the proposal and plan forms send it, so what a person is shown is what is kept.
//   - TEXT_DIGITS (4): a number inside a sentence (notes, reasons, change lists of computed values).
// Metrics are not rounded when stored; the client shows them with each metric's own decimals
// (the metric catalogue's `digits`).

export const SETTING_DIGITS = 6;
export const TEXT_DIGITS = 4;

/**
 * value rounded to `digits` significant digits, as a number without float noise.
 * Definition: Number(value.toPrecision(digits)) (round half away from zero on the decimal digits
 * JavaScript prints; ECMA-262 Number.prototype.toPrecision). Non-finite values come back unchanged.
 * Cost: O(1).
 * @throws RangeError when digits is not an integer from 1 to 21.
 * @example roundSignificant(0.123456789) // 0.123457
 */
export function roundSignificant(value: number, digits = SETTING_DIGITS): number {
  if (!Number.isInteger(digits) || digits < 1 || digits > 21) throw new RangeError(`roundSignificant: digits must be an integer from 1 to 21, got ${digits}`);
  if (!Number.isFinite(value) || value === 0) return value;
  return Number(value.toPrecision(digits));
}

/** roundSignificant as text: roundSignificantText(1234.5678, 4) // "1235" */
export function roundSignificantText(value: number, digits = TEXT_DIGITS): string {
  return String(roundSignificant(value, digits));
}
