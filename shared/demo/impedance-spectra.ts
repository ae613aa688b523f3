// Invented impedance spectra for the demo and the tests, consistent with a build's polarization
// model: the series resistance is the model's ohmic resistance (so the spectrum's HFR matches the
// curve's HFR column) and the charge-transfer resistance is the Tafel slope's at the DC current.
import { circuitImpedance } from '../impedance/circuit-impedance';
import type { CircuitParameters } from '../impedance/types';
import type { SemiEmpiricalParams } from '../curves/semi-empirical';
import { mulberry32, normalGenerator } from '../stats/random';

export interface DemoImpedanceOptions {
  /** DC current density the spectrum is taken at, A/cm²; default 0.2 */
  dcCurrentDensity?: number;
  /** CPE coefficient, F·s^(n−1)·cm⁻²; default 0.02 */
  cpeQ?: number;
  /** CPE exponent; default 0.85 */
  cpeN?: number;
  /** Warburg coefficient, Ω·cm²·s^(−1/2); default 0 (no diffusion branch) */
  sigmaW?: number;
  /** lead inductance × area, H·cm² (adds jωL); default 1.25e-7 (5 nH on 25 cm²) */
  leadInductanceHcm2?: number;
  /** highest and lowest frequency, Hz; default 100 kHz and 0.1 Hz */
  fromHz?: number;
  toHz?: number;
  /** default 10 */
  pointsPerDecade?: number;
  /** Gaussian noise on each part as a fraction of |Z|; default 0.005 */
  noiseFraction?: number;
  /** PRNG seed; default 1 */
  seed?: number;
}

export interface DemoImpedanceSpectrum {
  /** falling frequency; Z in Ω·cm², Z″ = Im Z */
  spectrum: { frequencyHz: Float64Array; zReal: Float64Array; zImag: Float64Array };
  /** the circuit the spectrum was drawn from (before inductance and noise) */
  parameters: CircuitParameters;
  circuit: 'charge-transfer' | 'charge-transfer-diffusion';
  leadInductanceHcm2: number;
  dcCurrentDensity: number;
}

/**
 * An invented impedance spectrum for a build whose polarization curve follows `params`.
 * Definition: R_Ω = params.resistance (the curve's HFR); R_ct = b/(ln10·j_dc), the slope of the
 * Tafel term at the DC current; Z = jωL + R_Ω + (R_ct ∥ CPE) (or the diffusion circuit when σ_W > 0),
 * at log-spaced frequencies from fromHz down to toHz; each part gets Gaussian noise of
 * noiseFraction·|Z| from the seeded generator.
 * Reference: circuitImpedance; R_ct as the local slope dη/dj = b/(ln10·j) of the Tafel line
 * (Bard & Faulkner, "Electrochemical Methods", 2nd ed., ch. 3). Invented data, for the demo and tests.
 * Cost: O(points).
 * @throws RangeError for malformed model parameters or options (non-positive current above the
 *   limiting current, frequencies, point density, negative noise or inductance).
 * @example demoImpedanceSpectrum(params, { seed: 3 }).parameters.rOhm === params.resistance // true
 */
export function demoImpedanceSpectrum(params: SemiEmpiricalParams, options: DemoImpedanceOptions = {}): DemoImpedanceSpectrum {
  if (params === null || typeof params !== 'object') throw new RangeError('demoImpedanceSpectrum: params must be semi-empirical model parameters');
  if (!(Number.isFinite(params.resistance) && params.resistance >= 0)) throw new RangeError(`demoImpedanceSpectrum: params.resistance must be ≥ 0, got ${params.resistance}`);
  if (!(Number.isFinite(params.tafelSlope) && params.tafelSlope > 0)) throw new RangeError(`demoImpedanceSpectrum: params.tafelSlope must be > 0, got ${params.tafelSlope}`);
  const j = options.dcCurrentDensity ?? 0.2;
  if (!(Number.isFinite(j) && j > 0 && j < params.limitingCurrentDensity)) throw new RangeError(`demoImpedanceSpectrum: dcCurrentDensity must lie in (0, ${params.limitingCurrentDensity}) A/cm², got ${j}`);
  const fromHz = options.fromHz ?? 1e5;
  const toHz = options.toHz ?? 0.1;
  if (!(toHz > 0 && fromHz > toHz)) throw new RangeError(`demoImpedanceSpectrum: need fromHz > toHz > 0, got ${fromHz} and ${toHz}`);
  const perDecade = options.pointsPerDecade ?? 10;
  if (!(Number.isInteger(perDecade) && perDecade >= 1 && perDecade <= 100)) throw new RangeError(`demoImpedanceSpectrum: pointsPerDecade must be an integer 1–100, got ${perDecade}`);
  const noise = options.noiseFraction ?? 0.005;
  if (!(noise >= 0)) throw new RangeError(`demoImpedanceSpectrum: noiseFraction must be ≥ 0, got ${noise}`);
  const inductance = options.leadInductanceHcm2 ?? 1.25e-7;
  if (!(inductance >= 0)) throw new RangeError(`demoImpedanceSpectrum: leadInductanceHcm2 must be ≥ 0, got ${inductance}`);
  const sigmaW = options.sigmaW ?? 0;
  const circuit = sigmaW > 0 ? 'charge-transfer-diffusion' : 'charge-transfer';
  const parameters: CircuitParameters = {
    rOhm: params.resistance,
    rCt: params.tafelSlope / (Math.LN10 * j),
    cpeQ: options.cpeQ ?? 0.02,
    cpeN: options.cpeN ?? 0.85,
  };
  if (circuit === 'charge-transfer-diffusion') parameters.sigmaW = sigmaW;
  const decades = Math.log10(fromHz / toHz);
  const count = Math.round(decades * perDecade) + 1;
  const frequencyHz = new Float64Array(count);
  for (let k = 0; k < count; k++) frequencyHz[k] = fromHz * Math.pow(10, (-decades * k) / (count - 1));
  const clean = circuitImpedance(circuit, parameters, frequencyHz);
  const gauss = normalGenerator(mulberry32(options.seed ?? 1));
  const zReal = new Float64Array(count);
  const zImag = new Float64Array(count);
  for (let k = 0; k < count; k++) {
    const re = clean.real[k];
    const im = clean.imag[k] + 2 * Math.PI * frequencyHz[k] * inductance;
    const modulus = Math.hypot(re, im);
    zReal[k] = re + noise * modulus * gauss();
    zImag[k] = im + noise * modulus * gauss();
  }
  return { spectrum: { frequencyHz, zReal, zImag }, parameters, circuit, leadInductanceHcm2: inductance, dcCurrentDensity: j };
}
