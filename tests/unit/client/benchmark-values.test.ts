// Values as differences from the benchmark, the benchmark's trace on a plot, and the title block
// an exported waterfall carries: worked by hand from the inputs written here.
import { describe, expect, it } from 'vitest';
import { benchmarkForPlot } from '@/features/benchmarks/components/benchmark-parts';
import { differenceFromBenchmark, formatDifference, formatMetricDifference } from '@/lib/benchmark-difference';
import { waterfallExportLayout, waterfallLegendText } from '@/features/gains/components/waterfall-export';
import { mergeLayout } from '@/components/plot/export';
import type { BenchmarkView } from '@/features/benchmarks/api/benchmarks';

const bench: BenchmarkView = {
  projectId: 1, kind: 'build', label: 'C-001', buildId: 11, buildCode: 'C-001', referenceCurveId: null, curveId: 21, source: null, sourceDate: '2026-08-20',
  conditions: {}, note: '', setBy: 'PI', setAt: '2026-12-03T00:00:00.000Z', values: { vAtRef: 0.527, massActivity: 23.72, hfr: null },
  points: { j: [0, 0.1, 0.2], v: [0.98, 0.6, 0.527], vIrFree: null, hfr: null },
};

describe('differences from the benchmark', () => {
  it('is the value less the benchmark’s, in the metric’s display unit with its sign', () => {
    // derived by hand: 0.604 V − 0.527 V = +77 mV; 0.500 V − 0.527 V = −27 mV
    expect(differenceFromBenchmark(bench, 'vAtRef', 0.604)).toBeCloseTo(0.077, 12);
    expect(formatMetricDifference('vAtRef', differenceFromBenchmark(bench, 'vAtRef', 0.604))).toBe('+77 mV');
    expect(formatMetricDifference('vAtRef', differenceFromBenchmark(bench, 'vAtRef', 0.5))).toBe('−27 mV');
    // a difference that rounds to nothing is written ±0
    expect(formatMetricDifference('vAtRef', differenceFromBenchmark(bench, 'vAtRef', 0.5272))).toBe('±0 mV');
    expect(formatDifference({ unit: 'A/g', scale: 1, digits: 2 }, differenceFromBenchmark(bench, 'massActivity', 111.09))).toBe('+87.37 A/g');
  });

  it('is not a number where either value is missing', () => {
    expect(differenceFromBenchmark(bench, 'hfr', 0.12)).toBeNull();
    expect(differenceFromBenchmark(bench, 'peakPower', 0.3)).toBeNull();
    expect(differenceFromBenchmark(null, 'vAtRef', 0.6)).toBeNull();
    expect(formatMetricDifference('vAtRef', null)).toBe('—');
  });
});

describe('the benchmark on a plot', () => {
  it('is drawn, unless the plot already draws the benchmark build’s curve', () => {
    expect(benchmarkForPlot(bench, { curveIds: [5, 6] })?.name).toBe('Benchmark: C-001');
    expect(benchmarkForPlot(bench, { curveIds: [21] })).toBeNull();
    // the benchmark build's other curve shown: its curve of record is still drawn beside it
    expect(benchmarkForPlot(bench, { buildIds: [11], curveIds: [22] })).not.toBeNull();
    expect(benchmarkForPlot({ ...bench, points: null })).toBeNull();
  });
});

describe('the exported waterfall', () => {
  const info = { project: 'PGM-free cathode', label: 'V at j_ref', unit: 'mV', from: 'C-001', to: 'C-018', conditions: 'at j_ref = 0.20 A/cm² · 160–200 °C · H2/air · 95 % intervals', date: '2026-12-03', confidencePercent: 95, targets: [{ label: 'Stack-ready voltage (≥ 650 mV)' }], benchmark: 'C-001' };

  it('names the project, the response with its unit, the reference point, the date, the legend and the target', () => {
    const { layout, extraHeight } = waterfallExportLayout(info);
    const text = String((layout.title as { text: string }).text).replace(/<[^>]+>/g, ' ');
    for (const words of ['PGM-free cathode', 'V at j_ref (mV) from C-001 to C-018', 'j_ref = 0.20 A/cm²', 'exported 2026-12-03', 'hatched bar = loss', 'whiskers = 95 % interval', 'Stack-ready voltage (≥ 650 mV)', 'benchmark C-001']) {
      expect(text.replace(/\s+/g, ' ')).toContain(words);
    }
    expect(extraHeight).toBeGreaterThan(0);
    expect((layout.margin as { t: number }).t).toBeGreaterThan(60);
  });

  it('says no target when there is none', () => {
    expect(waterfallLegendText({ ...info, targets: [], benchmark: null })).not.toMatch(/target|benchmark/);
  });

  it('is drawn over the chart’s own layout: annotations added, margins merged', () => {
    const merged = mergeLayout({ margin: { l: 16, r: 16, t: 40 }, annotations: [{ text: 'a' }], height: 470 }, { margin: { t: 120 }, annotations: [{ text: 'b' }] });
    expect(merged).toEqual({ margin: { l: 16, r: 16, t: 120 }, annotations: [{ text: 'a' }, { text: 'b' }], height: 470 });
  });
});
