// Shapes of an impedance spectrum and of its analysis. Units inside: Hz, Ω·cm² (area-specific).

/**
 * An impedance spectrum in internal units: frequency in Hz, and the real and imaginary parts of
 * the impedance in Ω·cm² with the physics sign convention Z = Z′ + j·Z″, so Z″ < 0 on a capacitive
 * arc (plots show −Z″ upwards). Arrays have equal length; any frequency order.
 */
export interface ImpedanceSpectrum {
  frequencyHz: ArrayLike<number>;
  zReal: ArrayLike<number>;
  zImag: ArrayLike<number>;
}

/** The equivalent circuits Cellwright fits, named by what they describe. */
export type CircuitKind =
  /** R_Ω in series with (R_ct ∥ CPE): ohmic resistance and one charge-transfer arc */
  | 'charge-transfer'
  /** R_Ω in series with (CPE ∥ (R_ct + W)): the same arc with semi-infinite diffusion (Warburg) in the faradaic branch */
  | 'charge-transfer-diffusion';

/** Parameters of a circuit. Units for Z in Ω·cm². */
export interface CircuitParameters {
  /** R_Ω, Ω·cm²: series (ohmic) resistance */
  rOhm: number;
  /** R_ct, Ω·cm²: charge-transfer resistance */
  rCt: number;
  /** Q, F·s^(n−1)·cm⁻²: constant-phase element coefficient; Z_CPE = 1/(Q·(jω)ⁿ) */
  cpeQ: number;
  /** n, dimensionless, 0 < n ≤ 1 (1 = ideal capacitor) */
  cpeN: number;
  /** σ_W, Ω·cm²·s^(−1/2): Warburg coefficient, Z_W = σ_W·(1 − j)/√ω (charge-transfer-diffusion only) */
  sigmaW?: number;
}

export type CircuitParameterKey = keyof CircuitParameters;
