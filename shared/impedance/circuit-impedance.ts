// Analytic impedance of the fitted equivalent circuits, and its derivatives with respect to each
// parameter (for the least-squares fit and its standard errors).
import type { CircuitKind, CircuitParameterKey, CircuitParameters } from './types';

/** Parameter order of each circuit (the order of the fit's vectors). */
export const CIRCUIT_PARAMETERS: Record<CircuitKind, readonly CircuitParameterKey[]> = {
  'charge-transfer': ['rOhm', 'rCt', 'cpeQ', 'cpeN'],
  'charge-transfer-diffusion': ['rOhm', 'rCt', 'cpeQ', 'cpeN', 'sigmaW'],
};

export interface ComplexArrays {
  real: Float64Array;
  imag: Float64Array;
}

function checkCircuit(kind: CircuitKind, params: CircuitParameters, caller: string): void {
  if (!(kind in CIRCUIT_PARAMETERS)) throw new RangeError(`${caller}: unknown circuit ${String(kind)}; use 'charge-transfer' or 'charge-transfer-diffusion'`);
  if (params === null || typeof params !== 'object') throw new RangeError(`${caller}: parameters must be an object`);
  for (const key of CIRCUIT_PARAMETERS[kind]) {
    const value = params[key];
    if (typeof value !== 'number' || !Number.isFinite(value)) throw new RangeError(`${caller}: ${key} must be a finite number, got ${String(value)}`);
  }
  if (params.rOhm < 0) throw new RangeError(`${caller}: rOhm must be ≥ 0 Ω·cm², got ${params.rOhm}`);
  if (!(params.rCt > 0)) throw new RangeError(`${caller}: rCt must be > 0 Ω·cm², got ${params.rCt}`);
  if (!(params.cpeQ > 0)) throw new RangeError(`${caller}: cpeQ must be > 0, got ${params.cpeQ}`);
  if (!(params.cpeN > 0 && params.cpeN <= 1)) throw new RangeError(`${caller}: cpeN must be in (0, 1], got ${params.cpeN}`);
  if (kind === 'charge-transfer-diffusion' && !((params.sigmaW as number) >= 0)) throw new RangeError(`${caller}: sigmaW must be ≥ 0, got ${params.sigmaW}`);
}

function checkFrequencies(frequencyHz: ArrayLike<number>, caller: string): void {
  if (frequencyHz === null || typeof frequencyHz !== 'object' || typeof frequencyHz.length !== 'number') throw new RangeError(`${caller}: frequencyHz must be an array`);
  for (let i = 0; i < frequencyHz.length; i++) {
    if (!(Number.isFinite(frequencyHz[i]) && frequencyHz[i] > 0)) throw new RangeError(`${caller}: frequency ${i} must be a positive number of Hz, got ${frequencyHz[i]}`);
  }
}

/**
 * Impedance of one point and its parameter derivatives, in the circuit's parameter order.
 * Z = R_Ω + 1/D with D = Q·(jω)ⁿ + 1/Z_F, Z_F = R_ct (+ σ(1 − j)/√ω); dZ/dp = −(dD/dp)/D².
 */
function evaluate(kind: CircuitKind, p: CircuitParameters, omega: number, wantDerivatives: boolean): { re: number; im: number; dRe: number[]; dIm: number[] } {
  const withDiffusion = kind === 'charge-transfer-diffusion';
  // (jω)ⁿ = ωⁿ·(cos nπ/2 + j sin nπ/2)
  const wn = Math.pow(omega, p.cpeN);
  const cosN = Math.cos((p.cpeN * Math.PI) / 2);
  const sinN = Math.sin((p.cpeN * Math.PI) / 2);
  const yqRe = p.cpeQ * wn * cosN;
  const yqIm = p.cpeQ * wn * sinN;
  // faradaic branch Z_F and 1/Z_F
  const sigma = withDiffusion ? (p.sigmaW as number) : 0;
  const rootOmega = Math.sqrt(omega);
  const zfRe = p.rCt + sigma / rootOmega;
  const zfIm = -sigma / rootOmega;
  const zfMod2 = zfRe * zfRe + zfIm * zfIm;
  const yfRe = zfRe / zfMod2;
  const yfIm = -zfIm / zfMod2;
  const dRe = yqRe + yfRe;
  const dIm = yqIm + yfIm;
  const dMod2 = dRe * dRe + dIm * dIm;
  const re = p.rOhm + dRe / dMod2;
  const im = -dIm / dMod2;
  if (!wantDerivatives) return { re, im, dRe: [], dIm: [] };

  // −1/D² and −1/Z_F²
  const invD2Re = (dRe * dRe - dIm * dIm) / (dMod2 * dMod2);
  const invD2Im = (-2 * dRe * dIm) / (dMod2 * dMod2);
  const invF2Re = (zfRe * zfRe - zfIm * zfIm) / (zfMod2 * zfMod2);
  const invF2Im = (-2 * zfRe * zfIm) / (zfMod2 * zfMod2);
  const chain = (aRe: number, aIm: number): [number, number] => [-(aRe * invD2Re - aIm * invD2Im), -(aRe * invD2Im + aIm * invD2Re)];
  const outRe: number[] = [1];
  const outIm: number[] = [0];
  // dD/dR_ct = −1/Z_F²
  let [r, i] = chain(-invF2Re, -invF2Im);
  outRe.push(r);
  outIm.push(i);
  // dD/dQ = ωⁿ·e^{jnπ/2}
  [r, i] = chain(wn * cosN, wn * sinN);
  outRe.push(r);
  outIm.push(i);
  // dD/dn = Y_Q·(ln ω + jπ/2)
  const logOmega = Math.log(omega);
  [r, i] = chain(yqRe * logOmega - (yqIm * Math.PI) / 2, yqIm * logOmega + (yqRe * Math.PI) / 2);
  outRe.push(r);
  outIm.push(i);
  if (withDiffusion) {
    // dD/dσ = −(1/Z_F²)·(1 − j)/√ω
    const aRe = -(invF2Re * 1 - invF2Im * -1) / rootOmega;
    const aIm = -(invF2Re * -1 + invF2Im * 1) / rootOmega;
    [r, i] = chain(aRe, aIm);
    outRe.push(r);
    outIm.push(i);
  }
  return { re, im, dRe: outRe, dIm: outIm };
}

/**
 * Analytic impedance of an equivalent circuit at the given frequencies.
 * Definition: ω = 2πf; Z_CPE = 1/(Q·(jω)ⁿ); 'charge-transfer': Z = R_Ω + 1/(1/R_ct + Q·(jω)ⁿ);
 * 'charge-transfer-diffusion': Z = R_Ω + 1/(Q·(jω)ⁿ + 1/(R_ct + σ_W·(1 − j)/√ω)) (the Randles
 * circuit with a CPE in place of the double-layer capacitor). With n = 1 the CPE is a capacitor
 * C = Q and the arc a semicircle of diameter R_ct centred at R_Ω + R_ct/2, apex at ω = 1/(R_ct·C).
 * Reference: Orazem & Tribollet, "Electrochemical Impedance Spectroscopy", (Wiley), the chapters
 * on equivalent circuits and the constant-phase element; Bard & Faulkner, "Electrochemical Methods",
 * 2nd ed., ch. 10 (the Randles circuit).
 * Cost: O(n) for n frequencies.
 * @throws RangeError for an unknown circuit, a parameter missing, not finite or out of range
 *   (rOhm ≥ 0, rCt > 0, cpeQ > 0, 0 < cpeN ≤ 1, sigmaW ≥ 0), or a frequency that is not positive.
 * @example circuitImpedance('charge-transfer', { rOhm: 0.1, rCt: 0.2, cpeQ: 0.01, cpeN: 1 }, [1 / (2 * Math.PI * 0.2 * 0.01)]).imag[0] // −0.1 (the apex)
 */
export function circuitImpedance(kind: CircuitKind, params: CircuitParameters, frequencyHz: ArrayLike<number>): ComplexArrays {
  checkCircuit(kind, params, 'circuitImpedance');
  checkFrequencies(frequencyHz, 'circuitImpedance');
  const real = new Float64Array(frequencyHz.length);
  const imag = new Float64Array(frequencyHz.length);
  for (let k = 0; k < frequencyHz.length; k++) {
    const point = evaluate(kind, params, 2 * Math.PI * frequencyHz[k], false);
    real[k] = point.re;
    imag[k] = point.im;
  }
  return { real, imag };
}

/**
 * The impedance and its derivatives with respect to each parameter (circuit order, see
 * CIRCUIT_PARAMETERS), point by point: dReal[k][p] = ∂Z′(f_k)/∂p, dImag[k][p] = ∂Z″(f_k)/∂p.
 * Definition: the chain rule on Z = R_Ω + 1/D (dZ/dp = −(∂D/∂p)/D²), with ∂(Q(jω)ⁿ)/∂n =
 * Q(jω)ⁿ·(ln ω + jπ/2). Checked against central finite differences in the tests.
 * Reference: as circuitImpedance. Cost: O(n·p).
 * @throws RangeError as circuitImpedance.
 * @example circuitDerivatives('charge-transfer', params, [10]).dReal[0][0] // 1 (∂Z′/∂R_Ω)
 */
export function circuitDerivatives(kind: CircuitKind, params: CircuitParameters, frequencyHz: ArrayLike<number>): ComplexArrays & { dReal: number[][]; dImag: number[][] } {
  checkCircuit(kind, params, 'circuitDerivatives');
  checkFrequencies(frequencyHz, 'circuitDerivatives');
  const real = new Float64Array(frequencyHz.length);
  const imag = new Float64Array(frequencyHz.length);
  const dReal: number[][] = [];
  const dImag: number[][] = [];
  for (let k = 0; k < frequencyHz.length; k++) {
    const point = evaluate(kind, params, 2 * Math.PI * frequencyHz[k], true);
    real[k] = point.re;
    imag[k] = point.im;
    dReal.push(point.dRe);
    dImag.push(point.dIm);
  }
  return { real, imag, dReal, dImag };
}
