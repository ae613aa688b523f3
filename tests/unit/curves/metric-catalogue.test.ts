// Walks the metric catalogue: every metric is in the OpenAPI document, in the client's format
// table and in the metrics computation's output for each kind it is computed on; the others are
// declared and marked as not computed yet, and the computation does not return them.
import { describe, expect, it } from 'vitest';
import { CURVE_METRICS, CURVE_METRIC_KEYS, computedMetricsOfKind, curveResponses, findResponse, metricsOfKind, referenceConditions, type MetricCurveKind } from '../../../shared/curves/metric-catalogue';
import { generatePolarizationCurve } from '../../../shared/curves';
import { generateSyntheticLog } from '../../../shared/durability';
import { demoAcceleratedTest, demoImpedanceSpectrum } from '../../../shared/demo';
import { openApiDocument } from '../../../server/openapi';
import { computeMetrics } from '../../../server/curves/service';
import { METRICS, formatMetric } from '../../../src/lib/format';
import { FIXTURE_MODEL, FIXTURE_HFR_OHM_CM2 } from '../../fixtures/curves/model-parameters';
import type { CurveData } from '../../../shared/curves/types';

const REF = { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: false, loadingBasis: 'catalyst' as const };
const BUILD = { loadingMgCm2: 1.0, metalLoadingMgCm2: 0.4, testConditions: null } as unknown as Parameters<typeof computeMetrics>[2];
// An invented 300 h log (10-min steps) of 8 µV/h after a 40 h break-in, 1 mV noise.
const LOG = { hours: 300, stepMinutes: 10, v0: 0.6, breakInHours: 40, breakInDropMv: 15, rateUvPerH: 8, noiseMv: 1, currentDensity: 0.2, seed: 7 };

/** A curve of each stored kind from the models the fixtures use. */
function curveOf(kind: MetricCurveKind): CurveData | null {
  if (kind === 'polarization') return generatePolarizationCurve(FIXTURE_MODEL, { jPoints: [0, 0.005, 0.01, 0.02, 0.05, 0.1, 0.2, 0.4, 0.6, 0.8, 1.0], hfr: FIXTURE_HFR_OHM_CM2 });
  // the demo's accelerated test: break-in, a steady rate and an onset of rapid failure at 1,100 h
  if (kind === 'durability') return demoAcceleratedTest();
  if (kind === 'hold') return { ...generateSyntheticLog(LOG), kind: 'hold' };
  const { spectrum } = demoImpedanceSpectrum(FIXTURE_MODEL as never, { seed: 3 });
  return { kind: 'impedance', j: new Float64Array(0), v: new Float64Array(0), ...spectrum } as unknown as CurveData;
}

const doc = openApiDocument() as { components: { schemas: Record<string, { enum?: string[]; properties?: Record<string, { description?: string }> }> }; paths: Record<string, Record<string, { parameters?: { name: string; description?: string; schema?: { description?: string } }[] }>> };

describe('metric catalogue', () => {
  it('declares every metric of the API metrics object with its fixed unit (units fixed by the API)', () => {
    const units = Object.fromEntries(CURVE_METRIC_KEYS.map((k) => [k, CURVE_METRICS[k].unit]));
    expect(units).toMatchObject({ vAtRef: 'V', vAtRefIrFree: 'V', jAtRef: 'A/cm²', jAtRefIrFree: 'A/cm²', massActivity: 'A/g', peakPower: 'W/cm²', ocv: 'V', tafelSlope: 'mV/dec', hfr: 'Ω·cm²', degradationRate: 'µV/h', breakInHours: 'h', onsetHours: 'h', holdDecay: 'mV/h', holdLoss: 'mV', rct: 'Ω·cm²', cpeQ: 'F·s^(n−1)·cm⁻²', cpeN: '' });
  });

  for (const key of CURVE_METRIC_KEYS) {
    const entry = CURVE_METRICS[key];
    describe(key, () => {
      it('is in the OpenAPI document (metric key enum and metrics object, with its unit)', () => {
        expect(doc.components.schemas.CurveMetricKey!.enum).toContain(key);
        const property = doc.components.schemas.CurveMetrics!.properties![key];
        expect(property?.description).toContain(entry.label);
        if (entry.unit) expect(property?.description).toContain(entry.unit);
      });

      it('is in the client format table with its display unit', () => {
        expect(METRICS[key]).toMatchObject({ key, label: entry.label, unit: entry.displayUnit, scale: entry.scale, digits: entry.digits, higherIsBetter: entry.goal === 'maximize' });
        expect(formatMetric(key, 1)).not.toMatch(/undefined|NaN/);
      });

      it('is computed on the kinds it claims, and only declared on the others', () => {
        expect((entry.computedOn as readonly string[]).every((kind) => (entry.kinds as readonly string[]).includes(kind))).toBe(true);
        for (const kind of entry.kinds) {
          const curve = curveOf(kind);
          if (!curve) {
            expect(entry.computedOn, `${key} on ${kind}: no stored curve kind, so it cannot be computed yet`).not.toContain(kind);
            continue;
          }
          const result = computeMetrics(curve, REF, BUILD);
          const metrics = result.metrics as Record<string, number | null | undefined>;
          if ((entry.computedOn as readonly string[]).includes(kind)) {
            expect(metrics[key], `${key} on a ${kind} curve`).toEqual(expect.any(Number));
          } else {
            expect(metrics[key] ?? null, `${key} on ${kind} is returned now: add '${kind}' to its computedOn`).toBeNull();
          }
        }
      });
    });
  }

  it('the computation returns no metric the catalogue does not know', () => {
    for (const kind of ['polarization', 'durability', 'hold', 'impedance'] as const) {
      const keys = Object.keys(computeMetrics(curveOf(kind)!, REF, BUILD).metrics);
      expect(keys.filter((k) => !(k in CURVE_METRICS)), kind).toEqual([]);
    }
  });

  it('orders a kind’s metrics as the catalogue does', () => {
    expect(metricsOfKind('polarization')).toEqual(['vAtRef', 'vAtRefIrFree', 'jAtRef', 'jAtRefIrFree', 'massActivity', 'peakPower', 'ocv', 'tafelSlope', 'hfr']);
    expect(computedMetricsOfKind('hold')).toEqual(['degradationRate', 'holdDecay', 'holdLoss']);
    expect(metricsOfKind('impedance')).toEqual(['hfr', 'rct', 'cpeQ', 'cpeN', 'sigmaW']);
  });

  it('names the curve-metric responses in the gains query parameter of the OpenAPI document', () => {
    const gains = Object.entries(doc.paths).find(([p]) => p.endsWith('/gains'))![1].get!;
    const response = gains.parameters!.find((p) => p.name === 'response')!;
    const text = response.description ?? response.schema?.description ?? '';
    for (const r of curveResponses()) expect(text).toContain(r.key);
  });

  it('looks a response up once: curve metric first, else a hand-entered one, else nothing', () => {
    const defs = [{ key: 'thicknessUm', label: 'Electrode thickness', unit: 'µm', goal: 'target' as const, target: 120 }];
    expect(findResponse('vAtRef', defs)).toEqual({ key: 'vAtRef', label: 'V at j_ref', unit: 'V', goal: 'maximize', target: null, source: 'curve' });
    expect(findResponse('thicknessUm', defs)).toEqual({ key: 'thicknessUm', label: 'Electrode thickness', unit: 'µm', goal: 'target', target: 120, source: 'hand-entered' });
    expect(findResponse('holdDecay', defs)?.source).toBe('curve');
    expect(findResponse('sigmaW', defs)).toBeNull(); // computed only on request (a fit with diffusion): not offered as a response
    expect(findResponse('nope', defs)).toBeNull();
  });

  it('states the reference point each metric is read at (derived by hand from the metric definitions)', () => {
    const settings = { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'metal' as const };
    const fixed = (value: number, digits: number) => value.toFixed(digits);
    expect(referenceConditions('vAtRef', settings, fixed)).toEqual(['at j_ref = 0.20 A/cm²']);
    expect(referenceConditions('vAtRefIrFree', settings, fixed)).toEqual(['at j_ref = 0.20 A/cm², iR-free']);
    expect(referenceConditions('jAtRef', settings, fixed)).toEqual(['at V_ref = 0.60 V']); // measured voltage, whatever the setting
    expect(referenceConditions('massActivity', settings, fixed)).toEqual(['at V_ref = 0.60 V, iR-free', 'per g of metal']);
    expect(referenceConditions('massActivity', { ...settings, irFree: false, loadingBasis: 'catalyst' }, fixed)).toEqual(['at V_ref = 0.60 V', 'per g of catalyst']);
    expect(referenceConditions('hfr', settings, fixed)).toEqual([]);
    expect(referenceConditions('thicknessUm', settings, fixed)).toEqual([]);
  });
});
