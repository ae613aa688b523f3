import { describe, expect, it } from 'vitest';
import { roundSignificant, roundSignificantText, SETTING_DIGITS, TEXT_DIGITS } from '../../../shared/units/significant';

describe('the one rounding rule (significant digits)', () => {
  it('keeps six significant digits for stored settings and four for text (derived by hand)', () => {
    expect(SETTING_DIGITS).toBe(6);
    expect(TEXT_DIGITS).toBe(4);
    expect(roundSignificant(0.123456789)).toBe(0.123457);
    expect(roundSignificant(354.99999999999994)).toBe(355);
    expect(roundSignificant(0.000123456789)).toBe(0.000123457);
    expect(roundSignificantText(1234.5678)).toBe('1235');
    expect(roundSignificantText(0.1 + 0.2)).toBe('0.3');
  });

  it('leaves zero and non-finite values alone and refuses a digit count outside 1–21', () => {
    expect(roundSignificant(0)).toBe(0);
    expect(roundSignificant(Number.NaN)).toBeNaN();
    expect(roundSignificant(Number.POSITIVE_INFINITY)).toBe(Number.POSITIVE_INFINITY);
    expect(() => roundSignificant(1, 0)).toThrow('roundSignificant: digits must be an integer from 1 to 21');
  });
});
