import { describe, it, expect } from 'vitest';
import { circuitImpedance, fitCircuit, SpectrumFitError, CIRCUIT_PARAMETERS } from '../../../shared/impedance';
import type { CircuitParameters } from '../../../shared/impedance';
import { mulberry32, normalGenerator } from '../../../shared/stats/random';
import * as Scipy from './scipy-fixture';

const FREQUENCIES = Array.from({ length: 61 }, (_, k) => 1e5 * Math.pow(10, -k / 10)); // 100 kHz → 0.1 Hz, 10 per decade
const ARC: CircuitParameters = { rOhm: 0.12, rCt: 0.25, cpeQ: 0.02, cpeN: 0.85 }; // invented HT-PEM electrode
const DIFF: CircuitParameters = { ...ARC, sigmaW: 0.03 };

function relative(actual: number, expected: number): number {
  return Math.abs(actual - expected) / Math.abs(expected);
}

/** Spectrum from the analytic circuit with seeded Gaussian noise of `fraction`·|Z| on each part. */
function noisy(kind: 'charge-transfer' | 'charge-transfer-diffusion', params: CircuitParameters, fraction: number, seed: number) {
  const z = circuitImpedance(kind, params, FREQUENCIES);
  const gauss = normalGenerator(mulberry32(seed));
  const zReal = new Float64Array(FREQUENCIES.length);
  const zImag = new Float64Array(FREQUENCIES.length);
  for (let k = 0; k < FREQUENCIES.length; k++) {
    const modulus = Math.hypot(z.real[k], z.imag[k]);
    zReal[k] = z.real[k] + fraction * modulus * gauss();
    zImag[k] = z.imag[k] + fraction * modulus * gauss();
  }
  return { frequencyHz: FREQUENCIES, zReal, zImag };
}

describe('fitCircuit on noise-free synthetic spectra', () => {
  for (const [kind, truth] of [
    ['charge-transfer', ARC],
    ['charge-transfer-diffusion', DIFF],
  ] as const) {
    it(`recovers every parameter of ${kind} to 1e-6 from its own starting guess`, () => {
      const fit = fitCircuit(noisy(kind, truth, 0, 1), { circuit: kind });
      for (const key of CIRCUIT_PARAMETERS[kind]) expect(relative(fit.parameters[key] as number, truth[key] as number)).toBeLessThan(1e-6); // generator input
      expect(fit.converged).toBe(true);
      expect(fit.rmsRelativePercent).toBeLessThan(1e-6);
    });
  }
});

describe('fitCircuit against scipy.optimize.least_squares (tests/reference/impedance_fit.py)', () => {
  it('matches scipy on the noisy arc: parameters, standard errors and χ²', () => {
    const fit = fitCircuit({ frequencyHz: Scipy.FREQUENCY_HZ, zReal: Scipy.ARC_Z_REAL, zImag: Scipy.ARC_Z_IMAG });
    fit.table.forEach((row, j) => {
      expect(relative(row.value, Scipy.ARC_SCIPY_PARAMS[j])).toBeLessThan(1e-7); // scipy fit (finite-difference Jacobian)
      expect(relative(row.standardError!, Scipy.ARC_SCIPY_SE[j])).toBeLessThan(1e-5); // scipy: sqrt(diag(inv(JᵀJ)·χ²/dof))
    });
    expect(relative(fit.chiSquare, Scipy.ARC_SCIPY_CHI2)).toBeLessThan(1e-9);
    expect(fit.degreesOfFreedom).toBe(Scipy.ARC_DOF);
  });

  it('matches scipy on the noisy arc with diffusion', () => {
    const fit = fitCircuit({ frequencyHz: Scipy.FREQUENCY_HZ, zReal: Scipy.DIFF_Z_REAL, zImag: Scipy.DIFF_Z_IMAG }, { circuit: 'charge-transfer-diffusion' });
    fit.table.forEach((row, j) => {
      expect(relative(row.value, Scipy.DIFF_SCIPY_PARAMS[j])).toBeLessThan(1e-7); // scipy fit
      expect(relative(row.standardError!, Scipy.DIFF_SCIPY_SE[j])).toBeLessThan(1e-5); // scipy standard errors
    });
    expect(relative(fit.chiSquare, Scipy.DIFF_SCIPY_CHI2)).toBeLessThan(1e-9);
  });

  it('holds the true parameters inside its 95 % intervals on that spectrum', () => {
    const fit = fitCircuit({ frequencyHz: Scipy.FREQUENCY_HZ, zReal: Scipy.ARC_Z_REAL, zImag: Scipy.ARC_Z_IMAG });
    fit.table.forEach((row, j) => {
      expect(row.low!).toBeLessThanOrEqual(Scipy.ARC_TRUE[j]); // generator input (numpy)
      expect(row.high!).toBeGreaterThanOrEqual(Scipy.ARC_TRUE[j]);
    });
  });
});

describe('fitCircuit on noisy spectra from the project generator', () => {
  it('holds the true parameters inside the reported interval (seed 7, 0.5 % noise)', () => {
    const fit = fitCircuit(noisy('charge-transfer', ARC, 0.005, 7));
    for (const row of fit.table) {
      expect(row.low!).toBeLessThanOrEqual(ARC[row.key] as number); // generator input
      expect(row.high!).toBeGreaterThanOrEqual(ARC[row.key] as number);
    }
    expect(fit.rmsRelativePercent).toBeGreaterThan(0.3); // the noise added: 0.5 % per part
    expect(fit.rmsRelativePercent).toBeLessThan(0.7);
  });

  it('95 % intervals cover the truth in ≥ 90 % of 200 seeded spectra (each parameter)', () => {
    // Monte Carlo with the project's seeded generator: nominal 95 %; 90 % leaves room for 200-run scatter (SD ≈ 1.5 %)
    const runs = 200;
    const covered: Record<string, number> = { rOhm: 0, rCt: 0, cpeQ: 0, cpeN: 0 };
    for (let seed = 1; seed <= runs; seed++) {
      const fit = fitCircuit(noisy('charge-transfer', ARC, 0.005, 1000 + seed));
      for (const row of fit.table) if (row.low! <= (ARC[row.key] as number) && (ARC[row.key] as number) <= row.high!) covered[row.key]++;
    }
    // measured when written: rOhm 190, rCt 195, cpeQ 195, cpeN 192 of 200 (95–97.5 %)
    for (const key of Object.keys(covered)) expect(covered[key] / runs, `${key} covered ${covered[key]} of ${runs}`).toBeGreaterThanOrEqual(0.9);
  });
});

describe('fitCircuit data handling', () => {
  it('leaves out inductive high-frequency points and says so', () => {
    const spectrum = noisy('charge-transfer', ARC, 0, 1);
    const zImag = Float64Array.from(spectrum.zImag, (value, k) => value + 2 * Math.PI * FREQUENCIES[k] * 1e-7); // lead inductance
    const fit = fitCircuit({ ...spectrum, zImag });
    expect(fit.pointsLeftOut).toBeGreaterThan(0);
    expect(fit.notes[0]).toMatch(/with Z″ > 0 \(lead inductance\) left out/);
    expect(relative(fit.parameters.rCt, ARC.rCt)).toBeLessThan(0.02); // the inductance still bends the first capacitive points
  });

  it('fits only inside a chosen frequency range', () => {
    const fit = fitCircuit(noisy('charge-transfer', ARC, 0, 1), { frequencyRangeHz: [1, 1e4] });
    expect(fit.pointsUsed).toBe(41); // 10 per decade over 4 decades, both ends included
    expect(fit.frequencyRangeHz[0]).toBeCloseTo(1, 9);
    expect(relative(fit.parameters.rCt, ARC.rCt)).toBeLessThan(1e-6);
  });

  it('refuses too short a spectrum with a data error, and malformed options with a plain one', () => {
    const short = { frequencyHz: [1000, 100], zReal: [0.13, 0.2], zImag: [-0.02, -0.1] };
    expect(() => fitCircuit(short)).toThrow(SpectrumFitError);
    expect(() => fitCircuit(noisy('charge-transfer', ARC, 0, 1), { weighting: 'square' as never })).toThrow(/weighting/);
    expect(() => fitCircuit({ frequencyHz: [1, -2, 3], zReal: [1, 1, 1], zImag: [-1, -1, -1] })).toThrow(/point 1: frequency/);
  });
});
