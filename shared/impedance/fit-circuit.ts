// Equivalent-circuit fit of an impedance spectrum by complex nonlinear least squares: parameters,
// their standard errors and intervals from the Jacobian, and the residual.
import { tQuantile } from '../stats/distributions';
import { CIRCUIT_PARAMETERS, circuitDerivatives, circuitImpedance } from './circuit-impedance';
import { leastSquares } from './levenberg-marquardt';
import { sortSpectrum } from './prepare-spectrum';
import type { CircuitKind, CircuitParameterKey, CircuitParameters, ImpedanceSpectrum } from './types';

export interface CircuitFitOptions {
  /** default 'charge-transfer' (R_Ω + R_ct ∥ CPE) */
  circuit?: CircuitKind;
  /**
   * 'modulus' (default): each residual divided by |Z| of the data point (errors proportional to |Z|,
   * the usual behaviour of impedance analysers); 'unit': plain residuals in Ω·cm²
   */
  weighting?: 'modulus' | 'unit';
  /** leave out high-frequency points with Z″ > 0 (lead inductance, not in the circuit); default true */
  dropInductive?: boolean;
  /** fit only points within [low, high] Hz (ends included); default all */
  frequencyRangeHz?: readonly [number, number];
  /** starting values; default estimated from the spectrum (intercept, arc width and apex) */
  initial?: Partial<CircuitParameters>;
  /** confidence level of the parameter intervals; default 0.95 */
  confidence?: number;
}

export interface FittedParameter {
  key: CircuitParameterKey;
  label: string;
  unit: string;
  value: number;
  /** standard error from the Jacobian, or null when the fit is degenerate */
  standardError: number | null;
  low: number | null;
  high: number | null;
  /** the value ended on its bound (0 < n ≤ 1, resistances ≥ 0); its error is not meaningful */
  atBound: boolean;
}

export interface CircuitFit {
  circuit: CircuitKind;
  parameters: CircuitParameters;
  /** in the circuit's order, with errors and intervals */
  table: FittedParameter[];
  /** weighted sum of squared residuals (real and imaginary parts) */
  chiSquare: number;
  /** 2·points − parameters */
  degreesOfFreedom: number;
  /** residual standard deviation: sqrt(χ² / dof); with modulus weighting, a fraction of |Z| */
  residualSD: number;
  /** root-mean-square residual relative to |Z| over all points and both parts, % */
  rmsRelativePercent: number;
  weighting: 'modulus' | 'unit';
  confidence: number;
  tCritical: number;
  /** points fitted, and left out (inductive or outside the frequency range) */
  pointsUsed: number;
  pointsLeftOut: number;
  frequencyRangeHz: [number, number];
  /** per fitted point (falling frequency): the model and the data minus the model, Ω·cm² */
  points: { frequencyHz: number; zReal: number; zImag: number; modelReal: number; modelImag: number }[];
  converged: boolean;
  iterations: number;
  stopReason: string;
  method: string;
  notes: string[];
}

const LABELS: Record<CircuitParameterKey, { label: string; unit: string }> = {
  rOhm: { label: 'ohmic resistance R_Ω', unit: 'Ω·cm²' },
  rCt: { label: 'charge-transfer resistance R_ct', unit: 'Ω·cm²' },
  cpeQ: { label: 'CPE coefficient Q', unit: 'F·s^(n−1)·cm⁻²' },
  cpeN: { label: 'CPE exponent n', unit: '' },
  sigmaW: { label: 'Warburg coefficient σ_W', unit: 'Ω·cm²·s^(−1/2)' },
};

const MIN_POSITIVE = 1e-12;

/** The spectrum cannot be fitted (too few points left, no usable start): a fact about the data, not a programming error. */
export class SpectrumFitError extends RangeError {
  constructor(message: string) {
    super(message);
    this.name = 'SpectrumFitError';
  }
}

function starting(kind: CircuitKind, f: number[], re: number[], im: number[], given: Partial<CircuitParameters>, n0: number): CircuitParameters {
  // high-frequency end: the smallest real part near the top of the spectrum
  const rOhm = given.rOhm ?? Math.max(0, Math.min(...re.slice(0, Math.max(1, Math.ceil(re.length / 10)))));
  let apex = 0;
  for (let i = 1; i < im.length; i++) if (-im[i] > -im[apex]) apex = i;
  const arcHeight = Math.max(-im[apex], MIN_POSITIVE);
  const lowEnd = re[re.length - 1] - rOhm;
  let rCt: number;
  if (given.rCt !== undefined) rCt = given.rCt;
  else if (kind === 'charge-transfer') rCt = Math.max(lowEnd, 2 * arcHeight, MIN_POSITIVE);
  else rCt = Math.max(Math.min(lowEnd, 2.5 * arcHeight), MIN_POSITIVE);
  const cpeN = given.cpeN ?? n0;
  const omegaApex = 2 * Math.PI * f[apex];
  // apex of R ∥ CPE at ω = (R·Q)^(−1/n)
  const cpeQ = given.cpeQ ?? 1 / (rCt * Math.pow(omegaApex, cpeN));
  const result: CircuitParameters = { rOhm, rCt, cpeQ, cpeN };
  if (kind === 'charge-transfer-diffusion') {
    const omegaLow = 2 * Math.PI * f[f.length - 1];
    result.sigmaW = given.sigmaW ?? Math.max((re[re.length - 1] - rOhm - rCt) * Math.sqrt(omegaLow), arcHeight * 1e-3);
  }
  return result;
}

/**
 * Fits R_Ω + (R_ct ∥ CPE), optionally with a Warburg element in the faradaic branch, to a spectrum.
 * Method: complex nonlinear least squares — the real and imaginary residuals of every point are
 * stacked into one vector (each divided by |Z| of the data point under modulus weighting) and
 * minimised by a bounded Levenberg–Marquardt (leastSquares) with the analytic Jacobian
 * (circuitDerivatives); started from the spectrum's intercept, arc width and apex frequency with
 * n = 0.95, 0.85 and 0.7, keeping the best. Standard errors: sqrt of the diagonal of s²·(JᵀJ)⁻¹,
 * s² = χ²/(2N − p); intervals value ± t·SE with Student's t on 2N − p degrees of freedom. They
 * assume independent errors of the weighted size; a parameter on its bound has no meaningful error.
 * High-frequency points with Z″ > 0 (lead inductance) are left out by default.
 * Reference: Orazem & Tribollet, "Electrochemical Impedance Spectroscopy" (Wiley), the chapters on regression
 * (complex nonlinear regression, weighting, confidence intervals from the Jacobian); Macdonald &
 * Garber (1977), J. Electrochem. Soc. 124, 1022 (complex least squares for immittance data).
 * Checked against scipy.optimize.least_squares (tests/reference/impedance_fit.py).
 * Cost: O(starts · iterations · N · p²) for N points and p parameters; a few ms for 60 points.
 * @throws RangeError when the spectrum or an option is malformed; SpectrumFitError (a RangeError)
 *   when too few points remain after leaving out inductive and out-of-range points (2N ≤ p), or no
 *   starting point gives finite residuals.
 * @example fitCircuit(spectrum).parameters.rCt // Ω·cm²
 */
export function fitCircuit(spectrum: ImpedanceSpectrum, options: CircuitFitOptions = {}): CircuitFit {
  const kind = options.circuit ?? 'charge-transfer';
  if (!(kind in CIRCUIT_PARAMETERS)) throw new RangeError(`fitCircuit: unknown circuit ${String(kind)}; use 'charge-transfer' or 'charge-transfer-diffusion'`);
  const weighting = options.weighting ?? 'modulus';
  if (weighting !== 'modulus' && weighting !== 'unit') throw new RangeError(`fitCircuit: weighting must be 'modulus' or 'unit', got ${String(weighting)}`);
  const confidence = options.confidence ?? 0.95;
  if (!(confidence > 0 && confidence < 1)) throw new RangeError(`fitCircuit: confidence must be in (0, 1), got ${confidence}`);
  const range = options.frequencyRangeHz;
  if (range !== undefined && !(Array.isArray(range) && range.length === 2 && range[0] > 0 && range[1] > range[0])) {
    throw new RangeError('fitCircuit: frequencyRangeHz must be [low, high] with 0 < low < high');
  }
  const keys = CIRCUIT_PARAMETERS[kind];
  const sorted = sortSpectrum(spectrum, 'fitCircuit', 1);
  const dropInductive = options.dropInductive ?? true;

  // points to fit: inside the range; inductive points only at the high-frequency end
  let firstCapacitive = 0;
  if (dropInductive) while (firstCapacitive < sorted.zImag.length && sorted.zImag[firstCapacitive] > 0) firstCapacitive++;
  const f: number[] = [];
  const re: number[] = [];
  const im: number[] = [];
  let inductiveLeftOut = 0;
  let outsideRange = 0;
  for (let i = 0; i < sorted.frequencyHz.length; i++) {
    if (i < firstCapacitive) {
      inductiveLeftOut++;
      continue;
    }
    // ends inclusive, with a relative slack for frequencies written with round-off (1e4 vs 10000.000000000002)
    if (range !== undefined && (sorted.frequencyHz[i] < range[0] * (1 - 1e-9) || sorted.frequencyHz[i] > range[1] * (1 + 1e-9))) {
      outsideRange++;
      continue;
    }
    f.push(sorted.frequencyHz[i]);
    re.push(sorted.zReal[i]);
    im.push(sorted.zImag[i]);
  }
  const p = keys.length;
  if (2 * f.length <= p) {
    throw new SpectrumFitError(`fitCircuit: ${f.length} points left to fit (after ${inductiveLeftOut} inductive and ${outsideRange} out-of-range points were left out); the ${kind} circuit needs at least ${Math.floor(p / 2) + 1}`);
  }
  const weights = f.map((_, i) => (weighting === 'modulus' ? 1 / Math.max(Math.hypot(re[i], im[i]), 1e-300) : 1));
  const toParams = (vector: readonly number[]): CircuitParameters => {
    const params = {} as CircuitParameters;
    keys.forEach((key, j) => {
      params[key] = vector[j];
    });
    return params;
  };
  const residuals = (vector: readonly number[]): Float64Array => {
    const model = circuitImpedance(kind, toParams(vector), f);
    const out = new Float64Array(2 * f.length);
    for (let i = 0; i < f.length; i++) {
      out[2 * i] = (model.real[i] - re[i]) * weights[i];
      out[2 * i + 1] = (model.imag[i] - im[i]) * weights[i];
    }
    return out;
  };
  const jacobian = (vector: readonly number[]): number[][] => {
    const d = circuitDerivatives(kind, toParams(vector), f);
    const rows: number[][] = [];
    for (let i = 0; i < f.length; i++) {
      rows.push(d.dReal[i].map((value) => value * weights[i]));
      rows.push(d.dImag[i].map((value) => value * weights[i]));
    }
    return rows;
  };
  const lower = keys.map((key) => (key === 'rOhm' || key === 'sigmaW' ? 0 : key === 'cpeN' ? 0.01 : MIN_POSITIVE));
  const upper = keys.map((key) => (key === 'cpeN' ? 1 : Infinity));

  const given = options.initial ?? {};
  const starts = given.cpeN !== undefined ? [given.cpeN] : [0.95, 0.85, 0.7];
  let best: ReturnType<typeof leastSquares> | null = null;
  for (const n0 of starts) {
    const initial = starting(kind, f, re, im, given, n0);
    const vector = keys.map((key) => initial[key] as number);
    let attempt: ReturnType<typeof leastSquares>;
    try {
      attempt = leastSquares({ initial: vector, residuals, jacobian, lower, upper });
    } catch {
      continue;
    }
    if (best === null || attempt.sumOfSquares < best.sumOfSquares) best = attempt;
  }
  if (best === null) throw new SpectrumFitError('fitCircuit: no starting point gave finite residuals; give starting values in options.initial');

  const dof = 2 * f.length - p;
  const chiSquare = best.sumOfSquares;
  const variance = chiSquare / dof;
  const tCritical = tQuantile((1 + confidence) / 2, dof);
  const params = toParams(best.parameters);
  const table: FittedParameter[] = keys.map((key, j) => {
    const onBound = best.atBound.includes(j);
    const se = best.inverseNormal !== null && !onBound ? Math.sqrt(variance * best.inverseNormal[j][j]) : null;
    const value = best.parameters[j];
    return {
      key,
      label: LABELS[key].label,
      unit: LABELS[key].unit,
      value,
      standardError: se,
      low: se === null ? null : value - tCritical * se,
      high: se === null ? null : value + tCritical * se,
      atBound: onBound,
    };
  });
  const model = circuitImpedance(kind, params, f);
  let relativeSquares = 0;
  for (let i = 0; i < f.length; i++) {
    const modulus = Math.hypot(re[i], im[i]) || 1;
    relativeSquares += ((model.real[i] - re[i]) / modulus) ** 2 + ((model.imag[i] - im[i]) / modulus) ** 2;
  }
  const notes: string[] = [];
  if (inductiveLeftOut > 0) notes.push(`${inductiveLeftOut} high-frequency point${inductiveLeftOut === 1 ? '' : 's'} with Z″ > 0 (lead inductance) left out`);
  if (outsideRange > 0) notes.push(`${outsideRange} point${outsideRange === 1 ? '' : 's'} outside the chosen frequency range left out`);
  for (const row of table) {
    if (row.atBound) notes.push(`${row.label} ended on its bound (${row.value}); its error is not given`);
    else if (row.standardError !== null && row.standardError > Math.abs(row.value)) notes.push(`${row.label} is poorly determined: its standard error exceeds its value`);
  }
  if (best.inverseNormal === null) notes.push('the fit is degenerate (parameters not separable from these data): no standard errors');
  if (!best.converged) notes.push(`the fit stopped before converging (${best.stopReason})`);
  const circuitText =
    kind === 'charge-transfer' ? 'R_Ω + (R_ct ∥ CPE)' : 'R_Ω + (CPE ∥ (R_ct + W)), W = σ_W(1 − j)/√ω';
  return {
    circuit: kind,
    parameters: params,
    table,
    chiSquare,
    degreesOfFreedom: dof,
    residualSD: Math.sqrt(variance),
    rmsRelativePercent: 100 * Math.sqrt(relativeSquares / (2 * f.length)),
    weighting,
    confidence,
    tCritical,
    pointsUsed: f.length,
    pointsLeftOut: inductiveLeftOut + outsideRange,
    frequencyRangeHz: [f[f.length - 1], f[0]],
    points: f.map((frequency, i) => ({ frequencyHz: frequency, zReal: re[i], zImag: im[i], modelReal: model.real[i], modelImag: model.imag[i] })),
    converged: best.converged,
    iterations: best.iterations,
    stopReason: best.stopReason,
    method:
      `${circuitText} fitted by complex nonlinear least squares (Levenberg–Marquardt, analytic Jacobian) to ${f.length} points, ` +
      `${weighting === 'modulus' ? 'residuals weighted by 1/|Z|' : 'unweighted residuals'}; standard errors from the Jacobian, ` +
      `${Number((confidence * 100).toPrecision(4))} % intervals with Student's t on ${dof} degrees of freedom`,
    notes,
  };
}
