// Whatever the input, the import chain either returns or throws CurveFileError — never another
// error type, never a hang. Property tests with fast-check (numRuns kept modest for speed).
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import {
  sniffBytes,
  decodeText,
  createDelimitedParser,
  parseDelimitedText,
  detectMapping,
  applyMapping,
  polarizationMetrics,
  CurveFileError,
  generatePolarizationCurve,
} from '../../../shared/curves/index';
import type { CurveData, ReferencePoint } from '../../../shared/curves/index';
import { FIXTURE_MODEL } from '../../fixtures/curves/model-parameters';

const REF: ReferencePoint = { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'catalyst' };

// Runs the whole chain; returns 'ok' or the CurveFileError code; rethrows anything else.
function runChain(text: string, areaCm2?: number): string {
  try {
    const table = parseDelimitedText(text);
    const detection = detectMapping(table);
    if (detection.mapping === null) return 'no-mapping';
    const curve = applyMapping(table, detection.mapping, { kind: detection.kind, areaCm2 });
    if (detection.kind === 'polarization') {
      try {
        polarizationMetrics(curve, REF, { loadingMgCm2: 1 });
      } catch (error) {
        // A file with only an iR-free voltage leaves the measured voltage NaN where the HFR is
        // missing (all NaN without HFR), by design; metrics that do not read vIrFree refuse such
        // a curve with a RangeError (the route answers 422).
        const someNaN = curve.vIrFree !== undefined && curve.v.some((value) => value !== value);
        if (!(someNaN && error instanceof RangeError)) throw error;
        return 'irfree-only';
      }
    }
    return 'ok';
  } catch (error) {
    if (error instanceof CurveFileError) return error.code;
    throw error;
  }
}

const HEADER_WORDS = ['Current density (A/cm2)', 'j (mA/cm²)', 'I [A]', 'U (V)', 'U_cell / mV', 'HFR (mOhm cm2)', 'R_HF [mΩ]', 'Time (h)', 'Timestamp', 'T_cell (°C)', 'Step', 'E_iR-free', 'x'];
const cell = fc.oneof(
  fc.double({ min: -5, max: 5, noNaN: true }).map((value) => value.toFixed(4)),
  fc.integer({ min: -2000, max: 3000 }).map(String),
  fc.double({ min: 0, max: 2, noNaN: true }).map((value) => value.toFixed(3).replace('.', ',')),
  fc.constantFrom('', ' ', 'NaN', 'abc', '"0.5"', '2024-05-01 10:00:00', '1:30:00', '0x1f', '-', '1e3', '#'),
  fc.string({ maxLength: 6 }),
);
const csvLike = fc
  .record({
    delimiter: fc.constantFrom(',', ';', '\t', ' ', '   ', '|'),
    lineEnd: fc.constantFrom('\n', '\r\n', '\r'),
    bom: fc.boolean(),
    metadata: fc.array(fc.constantFrom('Active area: 25 cm2', '# Cell temperature = 180 °C', 'Anode: H2', 'Area,abc', 'Back pressure 1 bar', ''), { maxLength: 3 }),
    header: fc.option(fc.array(fc.oneof(fc.constantFrom(...HEADER_WORDS), fc.string({ maxLength: 8 })), { minLength: 1, maxLength: 5 }), { nil: undefined }),
    rows: fc.array(fc.array(cell, { minLength: 0, maxLength: 5 }), { maxLength: 12 }),
  })
  .map(({ delimiter, lineEnd, bom, metadata, header, rows }) => {
    const lines = [...metadata, ...(header ? [header.join(delimiter)] : []), ...rows.map((row) => row.join(delimiter))];
    return (bom ? '\uFEFF' : '') + lines.join(lineEnd);
  });

// Well-formed tables (one header, rows of the header's width, plausible magnitudes, a wild
// cell now and then) so the property also reaches mapping, conversion and metrics.
const plausible = fc.oneof(
  { weight: 6, arbitrary: fc.double({ min: 0, max: 1.2, noNaN: true }).map((value) => value.toFixed(4)) },
  { weight: 2, arbitrary: fc.integer({ min: 0, max: 1500 }).map(String) },
  { weight: 1, arbitrary: cell },
);
const tableLike = fc
  .record({
    delimiter: fc.constantFrom(',', ';', '\t', '  '),
    header: fc.shuffledSubarray(HEADER_WORDS, { minLength: 2, maxLength: 5 }),
    rowCount: fc.integer({ min: 1, max: 15 }),
    seedCells: fc.array(plausible, { minLength: 75, maxLength: 75 }),
  })
  .map(({ delimiter, header, rowCount, seedCells }) => {
    const lines = [header.join(delimiter)];
    for (let row = 0; row < rowCount; row++) {
      const cells: string[] = [];
      for (let column = 0; column < header.length; column++) cells.push(seedCells[(row * header.length + column) % seedCells.length]);
      lines.push(cells.join(delimiter));
    }
    return lines.join('\n');
  });

describe('import chain properties', () => {
  it('well-formed tables reach the end of the chain in a fair share of cases', () => {
    let reachedEnd = 0;
    fc.assert(
      fc.property(tableLike, fc.option(fc.constantFrom(25), { nil: undefined }), (text, area) => {
        if (runChain(text, area) === 'ok') reachedEnd++;
      }),
      { numRuns: 200 },
    );
    expect(reachedEnd).toBeGreaterThan(10); // guard that the generator is not all errors
  });
  it('arbitrary bytes: sniff + decode + parse + detect + apply + metrics return or throw CurveFileError', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 300 }), (bytes) => {
        expect(['xlsx', 'xls', 'text', 'binary', 'empty']).toContain(sniffBytes(bytes));
        const text = decodeText(bytes);
        expect(typeof text).toBe('string');
        runChain(text);
      }),
      { numRuns: 200 },
    );
  });
  it('arbitrary printable text: the same', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 300 }), (text) => {
        runChain(text);
        runChain(text, 25);
      }),
      { numRuns: 200 },
    );
  });
  it('CSV-like grids with random delimiters, empties, words and numbers: the same', () => {
    fc.assert(
      fc.property(csvLike, fc.option(fc.constantFrom(25, 0.5), { nil: undefined }), (text, area) => {
        runChain(text, area);
      }),
      { numRuns: 200 },
    );
  });
  it('chunk boundaries never change the result', () => {
    fc.assert(
      fc.property(csvLike, fc.array(fc.integer({ min: 1, max: 40 }), { minLength: 1, maxLength: 20 }), (text, sizes) => {
        const outcome = (parse: () => unknown): string => {
          try {
            return JSON.stringify(parse(), (_key, value) => (ArrayBuffer.isView(value) ? Array.from(value as Float64Array) : value));
          } catch (error) {
            if (error instanceof CurveFileError) return `${error.code}:${error.message}`;
            throw error;
          }
        };
        const whole = outcome(() => parseDelimitedText(text));
        const chunked = outcome(() => {
          const parser = createDelimitedParser();
          let offset = 0;
          let turn = 0;
          while (offset < text.length) {
            const size = sizes[turn++ % sizes.length];
            parser.push(text.slice(offset, offset + size));
            offset += size;
          }
          return parser.finish();
        });
        expect(chunked).toBe(whole);
      }),
      { numRuns: 200 },
    );
  });
});

// Row order: a steady-state curve's metrics must not depend on the order of its rows; a forward +
// backward file keeps both sweeps. Curves from the semi-empirical model (FIXTURE_MODEL).
const ORDER_J = [0, 0.005, 0.01, 0.02, 0.03, 0.05, 0.1, 0.15, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1.0];
const ORDER_KEYS = ['vAtRef', 'vAtRefIrFree', 'jAtRef', 'jAtRefIrFree', 'massActivity', 'peakPower', 'ocv', 'tafelSlope', 'hfr'] as const;

function permuted(curve: CurveData, order: readonly number[]): CurveData {
  const pick = (values: Float64Array): Float64Array => Float64Array.from(order, (index) => values[index]);
  return { kind: curve.kind, j: pick(curve.j), v: pick(curve.v), ...(curve.hfr ? { hfr: pick(curve.hfr) } : {}) };
}

function expectSameMetrics(a: ReturnType<typeof polarizationMetrics>, b: ReturnType<typeof polarizationMetrics>): void {
  for (const key of ORDER_KEYS) {
    const [x, y] = [a.metrics[key], b.metrics[key]];
    if (x === null || y === null) expect(y).toBe(x);
    else expect(Math.abs(x - y)).toBeLessThanOrEqual(1e-9 * Math.max(Math.abs(x), Math.abs(y))); // 1e-9 relative
  }
}

describe('row order of steady-state curves', () => {
  const ref: ReferencePoint = { ...REF, refVoltage: 0.8 };
  it('any permutation of the rows of a single-sweep file gives the same metrics (1e-9 relative)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 1_000_000 }),
        fc.constantFrom(1, 3, 5),
        fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: ORDER_J.length * 5, maxLength: ORDER_J.length * 5 }),
        (seed, readingsPerStep, keys) => {
          const curve = generatePolarizationCurve(FIXTURE_MODEL, { jPoints: ORDER_J, readingsPerStep, noiseV: 0.002, seed });
          const order = Array.from({ length: curve.j.length }, (_, index) => index).sort((a, b) => keys[a] - keys[b] || a - b);
          expectSameMetrics(polarizationMetrics(curve, ref, { loadingMgCm2: 1 }), polarizationMetrics(permuted(curve, order), ref, { loadingMgCm2: 1 }));
        },
      ),
      { numRuns: 100 },
    );
  });
  it('a randomised order of whole steps (dwells kept together) gives the same metrics', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1_000_000 }), fc.shuffledSubarray(ORDER_J.map((_, index) => index), { minLength: ORDER_J.length, maxLength: ORDER_J.length }), (seed, stepOrder) => {
        const readingsPerStep = 8; // long enough for the dwell-transient test to run on each dwell
        const curve = generatePolarizationCurve(FIXTURE_MODEL, { jPoints: ORDER_J, readingsPerStep, noiseV: 0.0005, seed });
        const order = stepOrder.flatMap((step) => Array.from({ length: readingsPerStep }, (_, k) => step * readingsPerStep + k));
        expectSameMetrics(polarizationMetrics(curve, ref, { loadingMgCm2: 1 }), polarizationMetrics(permuted(curve, order), ref, { loadingMgCm2: 1 }));
      }),
      { numRuns: 100 },
    );
  });
  it('step orders that once read as sweeps give the sorted curve: a short run one way, jumps over set points', () => {
    // found by the property above (fast-check counterexamples, seed 1): a run of 3–4 steps one way
    // inside a shuffled order was taken for an up sweep, the rest for down sweeps; the curve was then
    // interpolated across jumps of many set points (V at j_ref off by 15–65 mV)
    const orders = [
      [9, 12, 13, 14, 8, 5, 16, 15, 11, 0, 10, 4, 3, 2, 1, 7, 6],
      [11, 1, 5, 16, 12, 9, 8, 7, 6, 4, 0, 2, 3, 15, 10, 13, 14],
    ];
    const readingsPerStep = 8;
    const curve = generatePolarizationCurve(FIXTURE_MODEL, { jPoints: ORDER_J, readingsPerStep, noiseV: 0.0005, seed: 1 });
    const sorted = polarizationMetrics(curve, ref, { loadingMgCm2: 1 });
    for (const stepOrder of orders) {
      const order = stepOrder.flatMap((step) => Array.from({ length: readingsPerStep }, (_, k) => step * readingsPerStep + k));
      const shuffled = polarizationMetrics(permuted(curve, order), ref, { loadingMgCm2: 1 });
      expectSameMetrics(sorted, shuffled);
      expect(shuffled.summary.sweepsAveraged).toBe(false);
      expect(shuffled.summary.leftOutDwells ?? 0).toBe(0);
    }
  });
  it('a forward + backward file keeps both sweeps and the hysteresis', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1_000_000 }), fc.double({ min: 0.003, max: 0.02, noNaN: true }), (seed, offset) => {
        const curve = generatePolarizationCurve(FIXTURE_MODEL, { jPoints: ORDER_J, readingsPerStep: 3, noiseV: 0.0005, seed, sweeps: 'up-down', downSweepOffsetV: offset });
        const result = polarizationMetrics(curve, ref, { loadingMgCm2: 1 });
        expect(result.summary.sweeps).toBe(2);
        expect(result.summary.sweepDirections).toBe('up,down');
        expect(result.summary.sweepsAveraged).toBe(true);
        expect(result.summary.hysteresisHigherSweep).toBe('down');
        // generator offset; 2 mV ≈ 5 σ of the difference of two 3-reading means at 0.5 mV noise (σ ≈ 0.41 mV)
        expect(Math.abs((result.summary.hysteresisMv as number) - offset * 1000)).toBeLessThan(2);
      }),
      { numRuns: 100 },
    );
  });
});
