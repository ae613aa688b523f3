// The numeric fast path must give exactly what Number() gives for every cell it accepts, and refuse
// (hand back to the general rules) every line it does not recognise.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readPlainNumbers } from '../../../shared/curves/parse-delimited';

const read = (text: string, cells: number, delimiter = ',', mark = '.') => {
  const out = new Float64Array(cells);
  return readPlainNumbers(text, delimiter.charCodeAt(0), mark.charCodeAt(0), cells, out) ? Array.from(out) : null;
};

describe('readPlainNumbers', () => {
  it('reads plain cells exactly as Number() does (Clinger fast path, PLDI 1990; checked against Number)', () => {
    expect(read('12.5,0.2,0.6512', 3)).toEqual([12.5, 0.2, 0.6512]);
    expect(read('-1e-3,+2E2,.5,7.', 4)).toEqual([-0.001, 200, 0.5, 7]);
    expect(Object.is(read('-0', 1)![0], -0)).toBe(true);
    expect(read('0.1234567890123456789', 1)).toEqual([Number('0.1234567890123456789')]);
    expect(read('1,5;0,25', 2, ';', ',')).toEqual([1.5, 0.25]);
  });

  it('hands back what the general rules must read or refuse', () => {
    for (const line of ['1.5,', '1.5,,2', ' 1.5,2', '1.5,2 ', '"1.5",2', '1,000.5,2', 'n/a,2', '1.5,2,3', '1e,2', '1e99999,2', '-,2', '']) {
      expect(read(line, 2), line).toBeNull();
    }
    expect(read('1.000,5;2', 2, ';', ',')).toBeNull();
  });

  it('any double written by toString, toFixed or toExponential reads back as Number() of the text (property)', () => {
    const written = fc.tuple(fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e30, max: 1e30 }), fc.integer({ min: 0, max: 3 }), fc.integer({ min: 0, max: 12 }));
    fc.assert(fc.property(fc.array(written, { minLength: 1, maxLength: 6 }), (cells) => {
      const texts = cells.map(([value, style, digits]) => (style === 0 ? String(value) : style === 1 ? value.toFixed(digits) : style === 2 ? value.toExponential(digits) : value.toPrecision(digits + 1)));
      const got = read(texts.join(','), texts.length);
      if (got === null) return texts.some((text) => !/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d{1,4})?$/i.test(text));
      return got.every((value, index) => Object.is(value, Number(texts[index])));
    }), { numRuns: 3000 });
  });

  it('random digit strings read back as Number() (property)', () => {
    const cell = fc.tuple(fc.constantFrom('', '-', '+'), fc.stringMatching(/^\d{1,20}$/), fc.option(fc.stringMatching(/^\d{0,20}$/)), fc.option(fc.integer({ min: -330, max: 330 })))
      .map(([sign, whole, fraction, exponent]) => `${sign}${whole}${fraction === null ? '' : `.${fraction}`}${exponent === null ? '' : `e${exponent}`}`);
    fc.assert(fc.property(cell, (text) => {
      const got = read(text, 1);
      const expected = Number(text);
      if (!Number.isFinite(expected)) return got === null;
      return got !== null && Object.is(got[0], expected);
    }), { numRuns: 5000 });
  });
});
