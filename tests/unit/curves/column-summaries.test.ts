// The parser's column summaries (extremes worked out piece by piece while rows come in) equal a
// scan of the finished columns, whatever the pieces; detection and the unit checks give the same
// answers with them as without (they only spare the passes).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createDelimitedParser, detectMapping, applyMapping } from '../../../shared/curves';
import type { ParsedTable } from '../../../shared/curves';

/** The definition: one scan of the column, blank cells (NaN) passed over, the largest |value|. */
function scan(values: Float64Array) {
  let min = Infinity, max = -Infinity, maxAbs = 0, maxAbsRow = -1, finite = 0;
  values.forEach((value) => {
    if (Number.isNaN(value)) return;
    finite++;
    min = Math.min(min, value);
    max = Math.max(max, value);
    maxAbs = Math.max(maxAbs, Math.abs(value));
  });
  return { min, max, maxAbs, finite };
}

// invented log rows: time, current (sometimes blank), voltage (sometimes negative, ties at the largest magnitude)
const row = fc.tuple(fc.integer({ min: 0, max: 9 }), fc.integer({ min: -300, max: 300 }), fc.boolean());
const logText = (rows: [number, number, boolean][]) =>
  'Time (h),Current density (A/cm2),Voltage (V)\n' + rows.map(([t, v, blank], i) => `${(i * 0.01 + t * 1e-4).toFixed(4)},${blank ? '' : '0.2'},${(v / 1000).toFixed(3)}`).join('\n') + '\n';

function parseInPieces(text: string, cuts: number[]): ParsedTable {
  const parser = createDelimitedParser({ maxRows: 100_000 });
  const bytes = new TextEncoder().encode(text);
  const decoder = new TextDecoder();
  let at = 0;
  for (const cut of [...cuts.map((c) => Math.floor(c * bytes.length)).sort((a, b) => a - b), bytes.length]) {
    if (cut > at) parser.pushBytes(bytes.subarray(at, cut), (b) => decoder.decode(b, { stream: true }));
    at = Math.max(at, cut);
  }
  parser.push(decoder.decode());
  return parser.finish();
}

describe('column summaries', () => {
  it('equal one scan of the finished columns, whatever the pieces', () => {
    fc.assert(fc.property(fc.array(row, { minLength: 1, maxLength: 400 }), fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { maxLength: 6 }), (rows, cuts) => {
      const table = parseInPieces(logText(rows), cuts);
      table.columns.forEach((column, index) => {
        expect(table.columnSummaries![index]).toEqual(column ? scan(column) : null);
      });
    }), { numRuns: 200, seed: 31 });
  });

  it('leave detection and mapping as they are without them, and are dropped once a mapping converts the columns', () => {
    const rows: [number, number, boolean][] = Array.from({ length: 300 }, (_, i) => [i % 10, 600 - i, false]);
    const text = logText(rows);
    const withSummaries = parseInPieces(text, [0.3, 0.6]);
    const without = parseInPieces(text, []);
    delete without.columnSummaries;
    const a = detectMapping(withSummaries, 'durability', { areaCm2: 25 });
    expect(a).toEqual(detectMapping(without, 'durability', { areaCm2: 25 }));
    const curve = applyMapping(withSummaries, a.mapping!, { kind: 'durability', areaCm2: 25, reuseColumns: true });
    expect(withSummaries.columnSummaries).toBeUndefined();
    expect(curve.v[0]).toBeCloseTo(0.6, 12); // 600 mV written as 0.600 V in the invented log
  });

  it('leave every mapped value as the full conversion gives it, refusals included (−0, blanks and values out of range among them)', () => {
    // invented rows: time, current (A/cm², sometimes −0 or beyond a cell), voltage (V, sometimes beyond 2 V), temperature (°C, sometimes −0 or blank)
    const cell = fc.tuple(
      fc.oneof({ weight: 30, arbitrary: fc.integer({ min: 1, max: 900 }).map((k) => (k / 1000).toFixed(3)) }, fc.constant('-0'), fc.constant('7.5')),
      fc.oneof({ weight: 30, arbitrary: fc.integer({ min: 300, max: 1000 }).map((k) => (k / 1000).toFixed(3)) }, fc.constant('2.5')),
      fc.oneof({ weight: 30, arbitrary: fc.integer({ min: 1500, max: 1700 }).map((k) => (k / 10).toFixed(1)) }, fc.constant('-0.0'), fc.constant('')),
    );
    const outcome = (table: ParsedTable) => {
      try {
        const curve = applyMapping(table, { time: { column: 0, unit: 'h' }, current: { column: 1, unit: 'A/cm2' }, voltage: { column: 2, unit: 'V' }, temperature: { column: 3, unit: 'C' } }, { kind: 'durability', reuseColumns: true });
        return [curve.j, curve.v, curve.temperatureC!].map((column) => Array.from(column, (x) => (Object.is(x, -0) ? '-0' : x)));
      } catch (error) {
        return (error as Error).message;
      }
    };
    fc.assert(fc.property(fc.array(cell, { minLength: 25, maxLength: 200 }), (rows) => {
      const text = 'Time (h),Current density (A/cm2),Voltage (V),Temperature (C)\n' + rows.map(([j, v, temp], i) => `${(i / 60).toFixed(4)},${j},${v},${temp}`).join('\n') + '\n';
      const without = parseInPieces(text, []);
      delete without.columnSummaries;
      expect(outcome(parseInPieces(text, [0.5]))).toEqual(outcome(without));
    }), { numRuns: 150, seed: 32 });
  });
});
