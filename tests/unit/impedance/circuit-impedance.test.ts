import { describe, it, expect } from 'vitest';
import { circuitImpedance, circuitDerivatives, CIRCUIT_PARAMETERS } from '../../../shared/impedance';
import type { CircuitParameters } from '../../../shared/impedance';

const R_OHM = 0.12; // Ω·cm², invented
const R_CT = 0.25; // Ω·cm², invented
const C = 0.015; // F/cm², invented

const logFrequencies = (from: number, to: number, count: number) => Array.from({ length: count }, (_, k) => from * Math.pow(to / from, k / (count - 1)));

describe('circuitImpedance: series R with R ∥ C (CPE with n = 1)', () => {
  const params: CircuitParameters = { rOhm: R_OHM, rCt: R_CT, cpeQ: C, cpeN: 1 };
  const frequencies = logFrequencies(1e5, 1e-2, 71);
  const z = circuitImpedance('charge-transfer', params, frequencies);

  it('lies on a semicircle of diameter R_ct centred at R_Ω + R_ct/2, to 1e-9', () => {
    // textbook: Bard & Faulkner ch. 10 and Orazem & Tribollet (the R–(R∥C) Nyquist semicircle)
    for (let k = 0; k < frequencies.length; k++) {
      const radius = Math.hypot(z.real[k] - (R_OHM + R_CT / 2), z.imag[k]);
      expect(Math.abs(radius - R_CT / 2)).toBeLessThan(1e-9);
      expect(z.imag[k]).toBeLessThan(0); // capacitive: Z″ < 0
    }
  });

  it('has its apex at ω = 1/(R_ct·C): Z′ = R_Ω + R_ct/2, Z″ = −R_ct/2, to 1e-9', () => {
    const apexHz = 1 / (2 * Math.PI * R_CT * C); // textbook: ω_max = 1/(R_ct·C_dl)
    const apex = circuitImpedance('charge-transfer', params, [apexHz, apexHz * 1.01, apexHz / 1.01]);
    expect(Math.abs(apex.real[0] - (R_OHM + R_CT / 2))).toBeLessThan(1e-9);
    expect(Math.abs(apex.imag[0] + R_CT / 2)).toBeLessThan(1e-9);
    expect(-apex.imag[1]).toBeLessThan(-apex.imag[0]); // the maximum of −Z″
    expect(-apex.imag[2]).toBeLessThan(-apex.imag[0]);
  });

  it('tends to R_Ω at high and R_Ω + R_ct at low frequency', () => {
    const ends = circuitImpedance('charge-transfer', params, [1e9, 1e-7]);
    expect(ends.real[0]).toBeCloseTo(R_OHM, 9); // textbook limits of R + R∥C
    expect(ends.real[1]).toBeCloseTo(R_OHM + R_CT, 9);
  });
});

describe('circuitImpedance: R ∥ CPE', () => {
  it('has its apex at ω = (R_ct·Q)^(−1/n) with Z″ = −(R_ct/2)·tan(nπ/4)', () => {
    // hand-worked: at R·Q·ωⁿ = 1, Z_arc = R/(1 + e^{jnπ/2}) = R/2 − j(R/2)·tan(nπ/4)
    const n = 0.8;
    const q = 0.02;
    const apexHz = Math.pow(R_CT * q, -1 / n) / (2 * Math.PI);
    const z = circuitImpedance('charge-transfer', { rOhm: R_OHM, rCt: R_CT, cpeQ: q, cpeN: n }, [apexHz]);
    expect(Math.abs(z.real[0] - (R_OHM + R_CT / 2))).toBeLessThan(1e-12);
    expect(Math.abs(z.imag[0] + (R_CT / 2) * Math.tan((n * Math.PI) / 4))).toBeLessThan(1e-12);
  });
});

describe('circuitImpedance: with a Warburg element (Randles circuit)', () => {
  it('approaches the textbook low-frequency limit Z′ = R_Ω + R_ct + σω^(−1/2), −Z″ = σω^(−1/2) + 2σ²C', () => {
    // Bard & Faulkner, ch. 10: low-frequency limit of the Randles circuit; the terms left out shrink like √ω
    const sigma = 0.05;
    const params: CircuitParameters = { rOhm: R_OHM, rCt: R_CT, cpeQ: C, cpeN: 1, sigmaW: sigma };
    const omega = 1e-6;
    const z = circuitImpedance('charge-transfer-diffusion', params, [omega / (2 * Math.PI)]);
    const real = R_OHM + R_CT + sigma / Math.sqrt(omega);
    const imag = -(sigma / Math.sqrt(omega) + 2 * sigma * sigma * C);
    expect(Math.abs(z.real[0] - real) / real).toBeLessThan(1e-5);
    expect(Math.abs(z.imag[0] - imag) / Math.abs(imag)).toBeLessThan(1e-5);
  });

  it('reduces to the plain arc when σ_W = 0', () => {
    const f = logFrequencies(1e4, 0.1, 11);
    const plain = circuitImpedance('charge-transfer', { rOhm: R_OHM, rCt: R_CT, cpeQ: 0.02, cpeN: 0.9 }, f);
    const zeroW = circuitImpedance('charge-transfer-diffusion', { rOhm: R_OHM, rCt: R_CT, cpeQ: 0.02, cpeN: 0.9, sigmaW: 0 }, f);
    for (let k = 0; k < f.length; k++) {
      expect(zeroW.real[k]).toBeCloseTo(plain.real[k], 14);
      expect(zeroW.imag[k]).toBeCloseTo(plain.imag[k], 14);
    }
  });
});

describe('circuitDerivatives', () => {
  it('agree with central finite differences', () => {
    const f = logFrequencies(1e5, 0.05, 25);
    const params: CircuitParameters = { rOhm: 0.11, rCt: 0.3, cpeQ: 0.018, cpeN: 0.83, sigmaW: 0.04 };
    for (const kind of ['charge-transfer', 'charge-transfer-diffusion'] as const) {
      const analytic = circuitDerivatives(kind, params, f);
      CIRCUIT_PARAMETERS[kind].forEach((key, j) => {
        const h = 1e-6 * Math.abs(params[key] as number);
        const up = circuitImpedance(kind, { ...params, [key]: (params[key] as number) + h }, f);
        const down = circuitImpedance(kind, { ...params, [key]: (params[key] as number) - h }, f);
        for (let k = 0; k < f.length; k++) {
          const numericRe = (up.real[k] - down.real[k]) / (2 * h);
          const numericIm = (up.imag[k] - down.imag[k]) / (2 * h);
          // round-off of the difference quotient is ~1e-16·|Z|/h: judge against that floor too
          const scale = Math.max(Math.abs(numericRe), Math.abs(numericIm), (1e-4 * Math.hypot(up.real[k], up.imag[k])) / Math.abs(params[key] as number));
          expect(Math.abs(analytic.dReal[k][j] - numericRe) / scale).toBeLessThan(1e-6);
          expect(Math.abs(analytic.dImag[k][j] - numericIm) / scale).toBeLessThan(1e-6);
        }
      });
    }
  });
});

describe('circuitImpedance input checks', () => {
  const good: CircuitParameters = { rOhm: 0.1, rCt: 0.2, cpeQ: 0.01, cpeN: 0.9 };
  it('refuses bad parameters and frequencies', () => {
    expect(() => circuitImpedance('charge-transfer', { ...good, cpeN: 1.2 }, [1])).toThrow(/cpeN/);
    expect(() => circuitImpedance('charge-transfer', { ...good, rCt: 0 }, [1])).toThrow(/rCt/);
    expect(() => circuitImpedance('charge-transfer', good, [0])).toThrow(/frequency 0/);
    expect(() => circuitImpedance('charge-transfer-diffusion', good, [1])).toThrow(/sigmaW/);
    expect(() => circuitImpedance('three-arcs' as never, good, [1])).toThrow(/unknown circuit/);
  });
});
