// The build page's CSV downloads: points exactly as stored, metrics with unit, method and note.
import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { curveMetricsCsv, curvePointsCsv } from '@/features/curves/components/curve-csv';
import type { CurveSummary } from '@shared/api-types';

const parse = (text: string) => Papa.parse<string[]>(text.trim(), { header: false }).data;

describe('points CSV', () => {
  it('writes every stored point unrounded, with the columns the curve has and units in the header', () => {
    const rows = parse(curvePointsCsv({ j: [0, 0.1, 0.2], v: [0.98, 0.6874512345678901, 0.62], hfr: [0.12, 0.121, NaN], vIrFree: null, tHours: null, temperatureC: null, downsampled: false, total: 3 }));
    expect(rows[0]).toEqual(['current density (A/cm²)', 'cell voltage (V)', 'HFR (Ω·cm²)']);
    // the value exactly as a Float64 prints: no rounding on the way out
    expect(rows[2]).toEqual(['0.1', '0.6874512345678901', '0.121']);
    expect(rows[3]).toEqual(['0.2', '0.62', '']);
    expect(rows).toHaveLength(4);
  });

  it('leaves out the blank j and V of an impedance spectrum', () => {
    const rows = parse(curvePointsCsv({ j: [NaN, NaN], v: [NaN, NaN], frequencyHz: [1000, 1], zReal: [0.1, 0.3], zImag: [-0.01, -0.05], downsampled: false, total: 2 }));
    expect(rows[0]).toEqual(['frequency (Hz)', 'Z′ (Ω·cm²)', 'Z″ (Ω·cm²)']);
    expect(rows[2]).toEqual(['1', '0.3', '-0.05']);
  });
});

describe('metrics CSV', () => {
  it('names each metric with its unit, method, inputs and note, and the reference point', () => {
    const curve = {
      id: 7, buildId: 1, fileId: 3, kind: 'polarization', label: 'C-010_polarization.csv', mapping: null, conditions: null, pointCount: 30,
      metrics: { vAtRef: 0.604, jAtRef: null, massActivity: 111.09, hfr: 0.126, peakPower: null, tafelSlope: null, ocv: null, vAtRefIrFree: null, jAtRefIrFree: null },
      metricNotes: { jAtRef: 'not reached: V_ref 0.6 V lies above the curve' },
      method: { vAtRef: { method: 'linear interpolation between the steps either side of j_ref', inputs: { jRef: 0.2, low: 0.15, high: 0.3 } } },
      summary: {}, metricsVersion: 1, options: null, createdAt: '2026-12-03T00:00:00Z', isRecord: true,
    } as unknown as CurveSummary;
    const rows = parse(curveMetricsCsv(curve, { code: 'C-010' }, { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'catalyst' } as never));
    expect(rows[0]).toEqual(['build', 'curve', 'metric', 'value', 'unit', 'method', 'inputs', 'note', 'reference point']);
    const byMetric = Object.fromEntries(rows.slice(1).map((r) => [r[2], r]));
    expect(byMetric['V at j_ref']).toEqual(['C-010', 'C-010_polarization.csv', 'V at j_ref', '0.604', 'V', 'linear interpolation between the steps either side of j_ref', 'jRef=0.2; low=0.15; high=0.3', '', 'j_ref 0.2 A/cm², V_ref 0.6 V, iR-free, catalyst basis']);
    expect(byMetric['Mass activity']![3]).toBe('111.09');
    expect(byMetric['Mass activity']![4]).toBe('A/g');
    // a missing metric is listed with why, not left out
    expect(byMetric['j at V_ref']!.slice(3, 8)).toEqual(['', 'A/cm²', '', '', 'not reached: V_ref 0.6 V lies above the curve']);
    expect(byMetric['Peak power']).toBeUndefined();
  });
});
