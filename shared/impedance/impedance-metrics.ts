// The metrics of an impedance curve (hfr, rct, cpeQ, cpeN), each with how it was obtained.
import { fitCircuit, SpectrumFitError } from './fit-circuit';
import type { CircuitFit, CircuitFitOptions } from './fit-circuit';
import { highFrequencyIntercept } from './hfr-intercept';
import type { HighFrequencyIntercept } from './hfr-intercept';
import type { ImpedanceSpectrum } from './types';

export interface ImpedanceMetricValues {
  /** Ω·cm²: high-frequency real-axis intercept, or the fitted series resistance */
  hfr: number | null;
  /** Ω·cm²: charge-transfer resistance from the fit */
  rct: number | null;
  /** F·s^(n−1)·cm⁻² */
  cpeQ: number | null;
  /** dimensionless */
  cpeN: number | null;
}

export type ImpedanceMetricKey = keyof ImpedanceMetricValues;

export interface ImpedanceMetricsResult {
  metrics: ImpedanceMetricValues;
  /** reason per null metric, or a caveat */
  metricNotes: Partial<Record<ImpedanceMetricKey, string>>;
  method: Partial<Record<ImpedanceMetricKey, { method: string; inputs: Record<string, number | string | boolean | null> }>>;
  /** the equivalent-circuit fit (parameters, errors, residual, model points), or null when it could not be made */
  fit: CircuitFit | null;
  intercept: HighFrequencyIntercept;
  summary: Record<string, number | string | boolean | null>;
}

/**
 * Metrics of an impedance spectrum (Ω·cm², Z″ = Im Z; see normaliseSpectrum).
 * - hfr: the high-frequency real-axis intercept (highFrequencyIntercept) when the spectrum crosses
 *   the axis there; otherwise the fitted series resistance R_Ω; `method` says which.
 * - rct, cpeQ, cpeN: the fitted parameters of R_Ω + (R_ct ∥ CPE) (or with diffusion; fitCircuit),
 *   each with its standard error and interval in `method.inputs`.
 * A metric that cannot be computed is null with its reason in metricNotes.
 * Reference: as highFrequencyIntercept and fitCircuit.
 * Cost: as fitCircuit.
 * @throws RangeError when the spectrum is malformed (as sortSpectrum) or an option is malformed;
 *   a spectrum too short to fit gives null fit metrics with the reason, not an exception.
 * @example impedanceMetrics(spectrum).metrics.rct // Ω·cm²
 */
export function impedanceMetrics(spectrum: ImpedanceSpectrum, options: CircuitFitOptions = {}): ImpedanceMetricsResult {
  const intercept = highFrequencyIntercept(spectrum);
  let fit: CircuitFit | null = null;
  let fitError: string | null = null;
  try {
    fit = fitCircuit(spectrum, options);
  } catch (error) {
    // a spectrum that cannot be fitted is a note; malformed options are the caller's fault
    if (!(error instanceof SpectrumFitError)) throw error;
    fitError = error.message.replace(/^fitCircuit: /, '');
  }
  const metrics: ImpedanceMetricValues = { hfr: null, rct: null, cpeQ: null, cpeN: null };
  const metricNotes: ImpedanceMetricsResult['metricNotes'] = {};
  const method: ImpedanceMetricsResult['method'] = {};
  const row = (key: 'rOhm' | 'rCt' | 'cpeQ' | 'cpeN') => fit?.table.find((entry) => entry.key === key) ?? null;

  if (intercept.hfr !== null) {
    metrics.hfr = intercept.hfr;
    method.hfr = { method: `high-frequency real-axis intercept: ${intercept.method === 'crossing' ? 'Z′ interpolated linearly in Z″ where the spectrum crosses Z″ = 0' : 'Z′ of the point with Z″ = 0'}`, inputs: { crossingHz: intercept.frequencyHz } };
    metricNotes.hfr = intercept.note;
  } else if (fit !== null) {
    const series = row('rOhm');
    metrics.hfr = fit.parameters.rOhm;
    method.hfr = {
      method: `fitted series resistance R_Ω of ${fit.method}`,
      inputs: { standardError: series?.standardError ?? null, low: series?.low ?? null, high: series?.high ?? null },
    };
    metricNotes.hfr = `from the fitted series resistance: ${intercept.note}`;
  } else {
    metricNotes.hfr = `${intercept.note}; and no fit: ${fitError}`;
  }

  const fitted: [keyof ImpedanceMetricValues, 'rCt' | 'cpeQ' | 'cpeN'][] = [
    ['rct', 'rCt'],
    ['cpeQ', 'cpeQ'],
    ['cpeN', 'cpeN'],
  ];
  for (const [metric, key] of fitted) {
    if (fit === null) {
      metricNotes[metric] = `no equivalent-circuit fit: ${fitError}`;
      continue;
    }
    const entry = row(key);
    metrics[metric] = fit.parameters[key];
    method[metric] = {
      method: fit.method,
      inputs: { standardError: entry?.standardError ?? null, low: entry?.low ?? null, high: entry?.high ?? null, atBound: entry?.atBound ?? false, rmsRelativePercent: fit.rmsRelativePercent },
    };
    if (entry?.atBound) metricNotes[metric] = `ended on its bound (${entry.value}): no error given`;
    else if (entry && entry.standardError !== null && entry.standardError > Math.abs(entry.value)) metricNotes[metric] = 'poorly determined: its standard error exceeds its value';
  }
  const summary: ImpedanceMetricsResult['summary'] = {
    points: spectrum.frequencyHz.length,
    hfrSource: intercept.hfr !== null ? 'intercept' : fit !== null ? 'fitted series resistance' : null,
    interceptHfr: intercept.hfr,
    fittedROhm: fit?.parameters.rOhm ?? null,
    circuit: fit?.circuit ?? null,
    fitPoints: fit?.pointsUsed ?? null,
    fitPointsLeftOut: fit?.pointsLeftOut ?? null,
    rmsRelativePercent: fit?.rmsRelativePercent ?? null,
    converged: fit?.converged ?? null,
    sigmaW: fit?.parameters.sigmaW ?? null,
  };
  if (fit !== null && fit.notes.length > 0) summary.fitNotes = fit.notes.join('; ');
  return { metrics, metricNotes, method, fit, intercept, summary };
}
