// The curve metrics of product.md with their fixed internal units and the direction that counts
// as better, for every place that lets a person chart, fit or optimise a metric.
export interface CurveMetricInfo {
  label: string;
  /** internal unit (product.md: units fixed) */
  unit: string;
  goal: 'maximize' | 'minimize';
}

export const CURVE_METRIC_INFO: Readonly<Record<string, CurveMetricInfo>> = {
  vAtRef: { label: 'V at j_ref', unit: 'V', goal: 'maximize' },
  vAtRefIrFree: { label: 'iR-free V at j_ref', unit: 'V', goal: 'maximize' },
  jAtRef: { label: 'j at V_ref', unit: 'A/cm²', goal: 'maximize' },
  jAtRefIrFree: { label: 'iR-free j at V_ref', unit: 'A/cm²', goal: 'maximize' },
  massActivity: { label: 'Mass activity', unit: 'A/g', goal: 'maximize' },
  peakPower: { label: 'Peak power', unit: 'W/cm²', goal: 'maximize' },
  ocv: { label: 'OCV', unit: 'V', goal: 'maximize' },
  tafelSlope: { label: 'Tafel slope', unit: 'mV/dec', goal: 'minimize' },
  hfr: { label: 'HFR', unit: 'Ω·cm²', goal: 'minimize' },
  degradationRate: { label: 'Degradation rate', unit: 'µV/h', goal: 'minimize' },
  breakInHours: { label: 'Break-in', unit: 'h', goal: 'minimize' },
  onsetHours: { label: 'Hours to failure onset', unit: 'h', goal: 'maximize' },
  holdDecay: { label: 'Hold decay', unit: 'mV/h', goal: 'minimize' },
  holdLoss: { label: 'Hold loss', unit: 'mV', goal: 'minimize' },
  rct: { label: 'Charge-transfer resistance R_ct', unit: 'Ω·cm²', goal: 'minimize' },
  cpeQ: { label: 'CPE coefficient Q', unit: 'F·s^(n−1)·cm⁻²', goal: 'maximize' },
  cpeN: { label: 'CPE exponent n', unit: '', goal: 'maximize' },
  sigmaW: { label: 'Warburg coefficient σ_W', unit: 'Ω·cm²·s^(−1/2)', goal: 'minimize' },
};
