// The common textbook semi-empirical polarization model, a seeded generator of synthetic
// curves for tests and the demo data, and a writer of those curves as lab-like text files.
import type { CurveData } from './types';
import { fromCurrentDensity } from '../units/current-density';
import { fromOhmCm2 } from '../units/area-specific-resistance';
import { mulberry32 } from '../stats/random';

/** Gas constant, J/(mol·K) — CODATA 2018 (exact since the 2019 SI redefinition). */
export const GAS_CONSTANT = 8.314462618;
/** Faraday constant, C/mol — CODATA 2018 (exact since the 2019 SI redefinition). */
export const FARADAY_CONSTANT = 96485.33212;

/** Parameters of V(j) = E0 − b·log10(j/j0) − R·j − c·ln(1 − j/jL). */
export interface SemiEmpiricalParams {
  /** E0, V: the voltage the model starts from at j → 0 */
  e0: number;
  /** b, V/decade: Tafel slope of the activation loss */
  tafelSlope: number;
  /** j0, A/cm²: apparent exchange current density */
  exchangeCurrentDensity: number;
  /** R, Ω·cm²: area-specific ohmic resistance */
  resistance: number;
  /** c, V: mass-transport coefficient */
  massTransportCoefficient: number;
  /** jL, A/cm²: limiting current density */
  limitingCurrentDensity: number;
}

/**
 * Theoretical Tafel slope b = ln(10)·R·T/(αn·F), in V/decade.
 * Reference: Butler–Volmer equation in its high-overpotential (Tafel) limit, e.g. Bard &
 * Faulkner, Electrochemical Methods, 2nd ed., eq. 3.4.13; R and F from CODATA 2018.
 * Cost: O(1).
 * @throws RangeError when temperature or αn is not a positive finite number.
 * @example tafelSlopeTheory(433.15, 1) // 0.08595… V/dec (160 °C)
 */
export function tafelSlopeTheory(temperatureK: number, alphaN: number): number {
  if (!(Number.isFinite(temperatureK) && temperatureK > 0)) throw new RangeError(`tafelSlopeTheory: temperatureK must be positive, got ${temperatureK}`);
  if (!(Number.isFinite(alphaN) && alphaN > 0)) throw new RangeError(`tafelSlopeTheory: alphaN must be positive, got ${alphaN}`);
  return (Math.LN10 * GAS_CONSTANT * temperatureK) / (alphaN * FARADAY_CONSTANT);
}

function checkParams(params: SemiEmpiricalParams): void {
  const entries: [keyof SemiEmpiricalParams, number][] = [
    ['e0', params.e0],
    ['tafelSlope', params.tafelSlope],
    ['exchangeCurrentDensity', params.exchangeCurrentDensity],
    ['resistance', params.resistance],
    ['massTransportCoefficient', params.massTransportCoefficient],
    ['limitingCurrentDensity', params.limitingCurrentDensity],
  ];
  for (const [name, value] of entries) {
    if (!Number.isFinite(value)) throw new RangeError(`semiEmpiricalVoltage: ${name} must be a finite number, got ${value}`);
  }
  if (params.exchangeCurrentDensity <= 0) throw new RangeError('semiEmpiricalVoltage: exchangeCurrentDensity must be > 0');
  if (params.limitingCurrentDensity <= 0) throw new RangeError('semiEmpiricalVoltage: limitingCurrentDensity must be > 0');
  if (params.tafelSlope < 0 || params.resistance < 0 || params.massTransportCoefficient < 0) {
    throw new RangeError('semiEmpiricalVoltage: tafelSlope, resistance and massTransportCoefficient must be ≥ 0');
  }
}

/**
 * Cell voltage of the common textbook semi-empirical form (activation + ohmic + mass transport):
 *   V(j) = E0 − b·log10(j/j0) − R·j − c·ln(1 − j/jL).
 * The Tafel term holds for j ≫ j0 only; for j ≤ j0 it is taken as 0, so V(0) = E0.
 * Reference: the common textbook semi-empirical form of fuel-cell polarization curves
 * (fuel-cell textbooks' "putting it all together" chapters).
 * Cost: O(1).
 * @throws RangeError for malformed parameters, or j outside [0, jL).
 * @example semiEmpiricalVoltage({ e0: 1.0, tafelSlope: 0.09, exchangeCurrentDensity: 1e-4, resistance: 0.2, massTransportCoefficient: 0.05, limitingCurrentDensity: 1.5 }, 0.2)
 */
export function semiEmpiricalVoltage(params: SemiEmpiricalParams, currentDensity: number): number {
  checkParams(params);
  if (!(currentDensity >= 0 && currentDensity < params.limitingCurrentDensity)) {
    throw new RangeError(`semiEmpiricalVoltage: j must be in [0, ${params.limitingCurrentDensity}) A/cm², got ${currentDensity}`);
  }
  const activation = currentDensity > params.exchangeCurrentDensity ? params.tafelSlope * Math.log10(currentDensity / params.exchangeCurrentDensity) : 0;
  const ohmic = params.resistance * currentDensity;
  const massTransport = -params.massTransportCoefficient * Math.log(1 - currentDensity / params.limitingCurrentDensity);
  return params.e0 - activation - ohmic - massTransport;
}

/** Seeded uniform numbers in [0, 1): the one mulberry32 (shared/stats/random), re-exported here for curve callers. */
export { mulberry32 };

function gaussian(random: () => number): number {
  // Box–Muller; 1 − u keeps the logarithm away from 0
  const u = 1 - random();
  const w = random();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * w);
}

export interface GenerateCurveOptions {
  /** step current densities, A/cm², in sweep order (ascending for an up sweep) */
  jPoints: readonly number[];
  /** readings per step; default 1 */
  readingsPerStep?: number;
  /** SD of Gaussian voltage noise per reading, V; default 0 */
  noiseV?: number;
  /** PRNG seed; default 1 */
  seed?: number;
  /** 'up' or 'up-down' (the top step is held once, then the steps again in reverse); default 'up' */
  sweeps?: 'up' | 'up-down';
  /** HFR reported for every reading, Ω·cm²; default the model's R; null = no HFR column */
  hfr?: number | null;
  /** voltage added to every reading of the down sweep, V (hysteresis); default 0 */
  downSweepOffsetV?: number;
}

/**
 * Synthetic polarization curve from the semi-empirical model: each step of `jPoints`
 * repeated `readingsPerStep` times, Gaussian voltage noise from a seeded PRNG, optional
 * down sweep with a voltage offset (hysteresis), HFR column.
 * Reference: semiEmpiricalVoltage. Cost: O(steps × readings).
 * @throws RangeError for malformed parameters or options.
 * @example generatePolarizationCurve(params, { jPoints: [0, 0.1, 0.2], sweeps: 'up-down' }).j.length // 5
 */
export function generatePolarizationCurve(params: SemiEmpiricalParams, options: GenerateCurveOptions): CurveData {
  checkParams(params);
  const readingsPerStep = options.readingsPerStep ?? 1;
  const noiseV = options.noiseV ?? 0;
  const sweepMode = options.sweeps ?? 'up';
  const hfrValue = options.hfr === undefined ? params.resistance : options.hfr;
  const downOffset = options.downSweepOffsetV ?? 0;
  if (!Array.isArray(options.jPoints) || options.jPoints.length === 0) throw new RangeError('generatePolarizationCurve: jPoints must be a non-empty array');
  if (!(Number.isInteger(readingsPerStep) && readingsPerStep >= 1)) throw new RangeError(`generatePolarizationCurve: readingsPerStep must be a positive integer, got ${readingsPerStep}`);
  if (!(noiseV >= 0)) throw new RangeError(`generatePolarizationCurve: noiseV must be ≥ 0, got ${noiseV}`);
  if (sweepMode !== 'up' && sweepMode !== 'up-down') throw new RangeError(`generatePolarizationCurve: sweeps must be 'up' or 'up-down', got ${String(sweepMode)}`);
  if (hfrValue !== null && !(hfrValue >= 0)) throw new RangeError(`generatePolarizationCurve: hfr must be ≥ 0 or null, got ${hfrValue}`);

  const plan: { j: number; down: boolean }[] = options.jPoints.map((j) => ({ j, down: false }));
  if (sweepMode === 'up-down') {
    for (let index = options.jPoints.length - 2; index >= 0; index--) plan.push({ j: options.jPoints[index], down: true });
  }
  const random = mulberry32(options.seed ?? 1);
  const total = plan.length * readingsPerStep;
  const j = new Float64Array(total);
  const v = new Float64Array(total);
  const hfr = hfrValue === null ? undefined : new Float64Array(total);
  let row = 0;
  for (const step of plan) {
    const clean = semiEmpiricalVoltage(params, step.j) + (step.down ? downOffset : 0);
    for (let reading = 0; reading < readingsPerStep; reading++) {
      j[row] = step.j;
      v[row] = noiseV > 0 ? clean + noiseV * gaussian(random) : clean;
      if (hfr !== undefined && hfrValue !== null) hfr[row] = hfrValue;
      row++;
    }
  }
  const curve: CurveData = { kind: 'polarization', j, v };
  if (hfr !== undefined) curve.hfr = hfr;
  return curve;
}

/**
 * Text layouts of invented test stations, for fixtures and demo uploads (our own layouts,
 * each exercising one thing the parser must read).
 */
export type CurveCsvShape =
  /** comma, A/cm², V, Ω·cm² */
  | 'comma-plain'
  /** semicolon, decimal comma, A/cm², V, mΩ·cm²; area and temperature lines */
  | 'semicolon-decimal-comma'
  /** tab, a point counter, total current in mA, V, cell resistance in mΩ; no area in the file */
  | 'tab-total-current-mA'
  /** comment/metadata lines (area, temperature, gases, back pressure), mA/cm², V, mΩ·cm² */
  | 'metadata-header'
  /** fixed-width columns separated by spaces, A/cm², mV, Ω·cm² */
  | 'whitespace-mV'
  /** UTF-8 BOM and CRLF line ends, A/cm², V, Ω·cm² */
  | 'bom-crlf';

export interface WriteCurveCsvOptions {
  /** active area, cm²: written in the metadata shapes, and needed for total current */
  areaCm2?: number;
  temperatureC?: number;
  anodeGas?: string;
  cathodeGas?: string;
  backPressureKPa?: number;
  /** a free title line for the shapes that have metadata */
  title?: string;
}

function fixed(value: number, digits: number, decimalComma = false): string {
  const text = value.toFixed(digits);
  return decimalComma ? text.replace('.', ',') : text;
}

/**
 * CurveData → text in one of the CurveCsvShape layouts (j, V and, when present, HFR).
 * Cost: O(rows).
 * @throws RangeError when a shape needs the area and none is given, or the curve is malformed.
 * @example writeCurveCsv(curve, 'semicolon-decimal-comma', { areaCm2: 25 })
 */
export function writeCurveCsv(curve: CurveData, shape: CurveCsvShape, options: WriteCurveCsvOptions = {}): string {
  if (curve === null || typeof curve !== 'object' || curve.j.length !== curve.v.length) throw new RangeError('writeCurveCsv: curve must have j and v of equal length');
  const hfr = curve.hfr;
  const rows = curve.j.length;
  const area = options.areaCm2;
  const lines: string[] = [];
  const temperature = options.temperatureC ?? 160;
  switch (shape) {
    case 'comma-plain': {
      lines.push(hfr ? 'Current density (A/cm2),Voltage (V),HFR (Ohm cm2)' : 'Current density (A/cm2),Voltage (V)');
      for (let row = 0; row < rows; row++) {
        const cells = [fixed(curve.j[row], 4), fixed(curve.v[row], 4)];
        if (hfr) cells.push(fixed(hfr[row], 4));
        lines.push(cells.join(','));
      }
      return lines.join('\n') + '\n';
    }
    case 'semicolon-decimal-comma': {
      if (options.title) lines.push(options.title);
      if (area !== undefined) lines.push(`Area;${fixed(area, 1, true)};cm2`);
      lines.push(`Temperature;${fixed(temperature, 0)};°C`);
      lines.push('');
      lines.push(hfr ? 'j / A cm-2;U / V;R_HF / mOhm cm2' : 'j / A cm-2;U / V');
      for (let row = 0; row < rows; row++) {
        const cells = [fixed(curve.j[row], 4, true), fixed(curve.v[row], 4, true)];
        if (hfr) cells.push(fixed(hfr[row] * 1000, 1, true));
        lines.push(cells.join(';'));
      }
      return lines.join('\n') + '\n';
    }
    case 'tab-total-current-mA': {
      if (area === undefined) throw new RangeError('writeCurveCsv: the tab-total-current-mA shape needs areaCm2 to turn j into a total current');
      lines.push(hfr ? 'Point\tI [mA]\tE_cell [V]\tR_cell [mOhm]' : 'Point\tI [mA]\tE_cell [V]');
      for (let row = 0; row < rows; row++) {
        const cells = [String(row + 1), fixed(fromCurrentDensity(curve.j[row], 'mA', area), 1), fixed(curve.v[row], 4)];
        if (hfr) cells.push(fixed(fromOhmCm2(hfr[row], 'mohm', area), 3));
        lines.push(cells.join('\t'));
      }
      return lines.join('\n') + '\n';
    }
    case 'metadata-header': {
      lines.push(`# ${options.title ?? 'Polarization curve'}`);
      if (area !== undefined) lines.push(`Active area: ${area} cm2`);
      lines.push(`# Cell temperature = ${temperature} °C`);
      lines.push(`Anode: ${options.anodeGas ?? 'H2'}`);
      lines.push(`Cathode gas; ${options.cathodeGas ?? 'air'}`);
      lines.push(`Back pressure ${options.backPressureKPa ?? 101} kPa`);
      lines.push(hfr ? 'Current density (mA/cm²),Cell voltage (V),HFR (mΩ·cm²)' : 'Current density (mA/cm²),Cell voltage (V)');
      for (let row = 0; row < rows; row++) {
        const cells = [fixed(curve.j[row] * 1000, 2), fixed(curve.v[row], 4)];
        if (hfr) cells.push(fixed(hfr[row] * 1000, 1));
        lines.push(cells.join(','));
      }
      return lines.join('\n') + '\n';
    }
    case 'whitespace-mV': {
      const pad = (text: string): string => text.padStart(14);
      lines.push(hfr ? `${pad('j[A/cm2]')}${pad('U[mV]')}${pad('HFR[Ohm*cm2]')}` : `${pad('j[A/cm2]')}${pad('U[mV]')}`);
      for (let row = 0; row < rows; row++) {
        let text = `${pad(fixed(curve.j[row], 4))}${pad(fixed(curve.v[row] * 1000, 1))}`;
        if (hfr) text += pad(fixed(hfr[row], 4));
        lines.push(text);
      }
      return lines.join('\n') + '\n';
    }
    case 'bom-crlf': {
      lines.push(hfr ? 'Current density [A/cm2],Voltage [V],HFR [Ohm cm2]' : 'Current density [A/cm2],Voltage [V]');
      for (let row = 0; row < rows; row++) {
        const cells = [fixed(curve.j[row], 4), fixed(curve.v[row], 4)];
        if (hfr) cells.push(fixed(hfr[row], 4));
        lines.push(cells.join(','));
      }
      return '\uFEFF' + lines.join('\r\n') + '\r\n';
    }
    default:
      throw new RangeError(`writeCurveCsv: unknown shape ${String(shape)}`);
  }
}
