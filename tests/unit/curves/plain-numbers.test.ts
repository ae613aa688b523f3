// The numeric fast path must give exactly what Number() gives for every cell it accepts, and refuse
// (hand back to the general rules) every line it does not recognise.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createDelimitedParser, readPlainNumbers } from '../../../shared/curves/parse-delimited';

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

describe('pushBytes: the table read from bytes is the table read from text', () => {
  const tableOf = (text: string, pieces: number[], viaBytes: boolean) => {
    const parser = createDelimitedParser({ maxRows: 100_000, previewRows: 3, sizeHintBytes: viaBytes ? text.length : undefined });
    const bytes = new TextEncoder().encode(text);
    const decoder = new TextDecoder('utf-8');
    const decode = (part: Uint8Array) => decoder.decode(part, { stream: true });
    try {
      let at = 0;
      for (const size of [...pieces, bytes.length]) {
        const next = Math.min(bytes.length, at + size);
        if (viaBytes) parser.pushBytes(bytes.subarray(at, next), decode);
        else parser.push(decode(bytes.subarray(at, next)));
        at = next;
        if (at >= bytes.length) break;
      }
      parser.push(decoder.decode());
      const table = parser.finish();
      return { ...table, columns: table.columns.map((column) => (column ? Array.from(column) : null)), dataLines: Array.from(table.dataLines) };
    } catch (error) {
      return { error: String(error), line: (error as { line?: number }).line };
    }
  };

  // station-log lines: plain numbers, with now and then a line the general rules must read
  // (spaces, an empty or missing cell, a comment, a repeated header, a quoted cell, a unit), CR LF or LF
  const value = fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e6, max: 1e6 }).map((x) => x.toFixed(4));
  const odd = fc.constantFrom(' 1.5, 2, 3', '1.5,,3', '# pause', 't (h),j (A/cm2),V (V)', '"1.5",2,3', '', 'n/a,1,2', '1e3,2.5E-2,-0', '0.12345678901234567,1,2');
  const line = fc.oneof({ weight: 40, arbitrary: fc.tuple(value, value, value).map((cells) => cells.join(',')) }, { weight: 1, arbitrary: odd });
  it('for random logs cut into random pieces (property; checked against push of the decoded text)', () => {
    fc.assert(
      fc.property(fc.array(line, { minLength: 200, maxLength: 1000 }), fc.boolean(), fc.array(fc.integer({ min: 1, max: 9000 }), { maxLength: 40 }), (lines, crlf, pieces) => {
        const text = `t (h),j (A/cm2),V (V)\n${lines.join(crlf ? '\r\n' : '\n')}${crlf ? '\r\n' : '\n'}`;
        expect(tableOf(text, pieces, true)).toEqual(tableOf(text, pieces, false));
      }),
      { numRuns: 60 },
    );
  });

  it('a ragged row deep in the log is refused at the same line either way', () => {
    const rows = Array.from({ length: 600 }, (_, i) => `${i},0.2,0.6`);
    rows[450] = '1.5,2,3,4';
    const text = `t (h),j (A/cm2),V (V)\n${rows.join('\n')}\n`;
    const viaBytes = tableOf(text, [70_000], true);
    expect(viaBytes).toEqual(tableOf(text, [70_000], false));
    // derived by hand: the header is line 1, so rows[450] is line 452
    expect(viaBytes).toMatchObject({ line: 452 });
  });

  it('a file that ends without a line break, and one with a decimal comma, read the same', () => {
    const rows = Array.from({ length: 500 }, (_, i) => `${(i * 0.01).toFixed(2)};0,2;0,6${i % 10}`);
    for (const text of [`a;b;c\n${rows.join('\n')}`, `a,b,c\n${rows.map((r) => r.replace(/,/g, '.').replace(/;/g, ',')).join('\n')}`]) {
      expect(tableOf(text, [100, 5000, 7], true)).toEqual(tableOf(text, [100, 5000, 7], false));
    }
  });
});
