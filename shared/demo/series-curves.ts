// Invented temperature and pressure series of polarization curves for the demo and the tests:
// curves of the semi-empirical model whose current at a chosen iR-free voltage follows a stated
// apparent activation energy (temperature series) or a stated reaction order (pressure series).
import { GAS_CONSTANT, generatePolarizationCurve, tafelSlopeTheory } from '../curves/semi-empirical';
import type { SemiEmpiricalParams } from '../curves/semi-empirical';
import type { CurveData } from '../curves/types';
import { ZERO_CELSIUS_K } from '../units/temperature';

/** One invented series member. */
export interface DemoSeriesMember {
  /** cell temperature, °C */
  temperatureC: number;
  /** back-pressure, kPa absolute */
  backPressureKPa: number;
  /** the model parameters this member's curve was drawn from */
  params: SemiEmpiricalParams;
  curve: CurveData;
  /** the current density the model gives at the series iR-free voltage, A/cm² (exact, before noise) */
  expectedCurrentDensity: number;
}

export interface DemoSeriesCommon {
  /** model parameters shared by every member; the Tafel slope and j0 are set per member. Default: an invented HT-PEM cell */
  base?: Partial<Omit<SemiEmpiricalParams, 'tafelSlope' | 'exchangeCurrentDensity'>>;
  /** iR-free voltage at which the current follows the stated law, V; default 0.85 */
  voltageIrFree?: number;
  /** current density at that voltage at the reference conditions, A/cm²; default 0.01 */
  referenceCurrentDensity?: number;
  /** αn of the Tafel slope b = ln10·R·T/(αn·F); default 1 */
  alphaN?: number;
  /** step current densities, A/cm² (ascending, with 0 for the open-circuit step); default 19 steps 0–1 A/cm² */
  jPoints?: readonly number[];
  /** readings per step; default 3 */
  readingsPerStep?: number;
  /** Gaussian voltage noise per reading, V; default 0.001 */
  noiseV?: number;
  /** seed of the first member; member k uses seed + k. Default 1 */
  seed?: number;
}

export interface DemoTemperatureSeriesOptions extends DemoSeriesCommon {
  /** apparent activation energy at the series voltage, kJ/mol; default 60 */
  activationEnergyKJmol?: number;
  /** default [160, 180, 200] °C */
  temperaturesC?: readonly number[];
  /** temperature at which referenceCurrentDensity holds, °C; default 180 */
  referenceTemperatureC?: number;
  /** back-pressure of every member, kPa absolute; default 101.325 */
  backPressureKPa?: number;
}

export interface DemoPressureSeriesOptions extends DemoSeriesCommon {
  /** apparent reaction order in the back-pressure; default 0.5 */
  order?: number;
  /** default [101.325, 150, 200, 250] kPa absolute */
  pressuresKPa?: readonly number[];
  /** pressure at which referenceCurrentDensity holds, kPa absolute; default 101.325 */
  referencePressureKPa?: number;
  /** cell temperature of every member, °C; default 180 */
  temperatureC?: number;
}

const DEFAULT_BASE = { e0: 1.0, resistance: 0.12, massTransportCoefficient: 0.05, limitingCurrentDensity: 1.6 };
const DEFAULT_J_POINTS = [0, 0.002, 0.004, 0.007, 0.01, 0.015, 0.02, 0.03, 0.05, 0.075, 0.1, 0.15, 0.2, 0.3, 0.4, 0.5, 0.6, 0.8, 1.0];

function positive(name: string, value: number): void {
  if (!(Number.isFinite(value) && value > 0)) throw new RangeError(`${name} must be a positive finite number, got ${value}`);
}

/**
 * The exchange current density that puts the model's iR-free voltage (V + j·R) at `voltage` when
 * j = `target`: solving E0 − b·log10(j/j0) − c·ln(1 − j/jL) = V for j0.
 */
function exchangeCurrentFor(base: Omit<SemiEmpiricalParams, 'tafelSlope' | 'exchangeCurrentDensity'>, tafelSlope: number, voltage: number, target: number): number {
  const massTransport = -base.massTransportCoefficient * Math.log(1 - target / base.limitingCurrentDensity);
  return Math.pow(10, Math.log10(target) - (base.e0 - voltage - massTransport) / tafelSlope);
}

function member(common: DemoSeriesCommon, temperatureC: number, backPressureKPa: number, target: number, index: number): DemoSeriesMember {
  const base = { ...DEFAULT_BASE, ...(common.base ?? {}) };
  const voltage = common.voltageIrFree ?? 0.85;
  if (!(voltage > 0 && voltage < base.e0)) throw new RangeError(`demo series: voltageIrFree must lie between 0 and E0 = ${base.e0} V, got ${voltage}`);
  if (!(target < base.limitingCurrentDensity)) throw new RangeError(`demo series: the current at ${voltage} V (${target} A/cm²) must stay below the limiting current ${base.limitingCurrentDensity} A/cm²`);
  const tafelSlope = tafelSlopeTheory(temperatureC + ZERO_CELSIUS_K, common.alphaN ?? 1);
  const params: SemiEmpiricalParams = { ...base, tafelSlope, exchangeCurrentDensity: exchangeCurrentFor(base, tafelSlope, voltage, target) };
  const curve = generatePolarizationCurve(params, {
    jPoints: common.jPoints ?? DEFAULT_J_POINTS,
    readingsPerStep: common.readingsPerStep ?? 3,
    noiseV: common.noiseV ?? 0.001,
    seed: (common.seed ?? 1) + index,
  });
  return { temperatureC, backPressureKPa, params, curve, expectedCurrentDensity: target };
}

/**
 * An invented temperature series: one polarization curve per temperature whose current density
 * at the series iR-free voltage is j(T) = j_ref·exp(−Eₐ/R·(1/T − 1/T_ref)), so an Arrhenius fit
 * of those currents returns Eₐ. The Tafel slope follows the temperature (b = ln10·R·T/(αn·F)) and
 * j0 is solved per member to put the curve through that point; E0, R, c and jL are shared.
 * Reference: the semi-empirical model (shared/curves/semi-empirical); the Arrhenius law as in
 * Bard & Faulkner, "Electrochemical Methods", 2nd ed., ch. 3. Invented data, for the demo and tests.
 * Cost: O(members × steps × readings).
 * @throws RangeError for a non-finite Eₐ, an empty or non-finite
 *   temperature list, or parameters that put the series voltage outside the model's range.
 * @example demoTemperatureSeries({ activationEnergyKJmol: 60 }).map((m) => m.temperatureC) // [160, 180, 200]
 */
export function demoTemperatureSeries(options: DemoTemperatureSeriesOptions = {}): DemoSeriesMember[] {
  const ea = options.activationEnergyKJmol ?? 60;
  if (!Number.isFinite(ea)) throw new RangeError(`demoTemperatureSeries: activationEnergyKJmol must be a finite number, got ${ea}`);
  const temperatures = options.temperaturesC ?? [160, 180, 200];
  if (!Array.isArray(temperatures) || temperatures.length === 0) throw new RangeError('demoTemperatureSeries: temperaturesC must be a non-empty array');
  for (const value of temperatures) if (!(Number.isFinite(value) && value > -ZERO_CELSIUS_K)) throw new RangeError(`demoTemperatureSeries: temperature ${value} °C is not a temperature`);
  const referenceC = options.referenceTemperatureC ?? 180;
  const jRef = options.referenceCurrentDensity ?? 0.01;
  positive('demoTemperatureSeries: referenceCurrentDensity', jRef);
  const pressure = options.backPressureKPa ?? 101.325;
  positive('demoTemperatureSeries: backPressureKPa', pressure);
  const tRef = referenceC + ZERO_CELSIUS_K;
  return temperatures.map((temperatureC, index) => {
    const target = jRef * Math.exp(((-ea * 1000) / GAS_CONSTANT) * (1 / (temperatureC + ZERO_CELSIUS_K) - 1 / tRef));
    return member(options, temperatureC, pressure, target, index);
  });
}

/**
 * An invented pressure series: one polarization curve per back-pressure whose current density at
 * the series iR-free voltage is j(p) = j_ref·(p/p_ref)ᵐ, so a log–log fit returns the order m.
 * Temperature (hence the Tafel slope) is the same for all; j0 is solved per member.
 * Reference: the semi-empirical model (shared/curves/semi-empirical); the power-law dependence on
 * reactant pressure as in Bard & Faulkner, "Electrochemical Methods", 2nd ed., ch. 3. Invented data.
 * Cost: O(members × steps × readings).
 * @throws RangeError for a non-finite order, an empty or non-positive pressure list, or parameters
 *   that put the series voltage outside the model's range.
 * @example demoPressureSeries({ order: 0.5 }).length // 4
 */
export function demoPressureSeries(options: DemoPressureSeriesOptions = {}): DemoSeriesMember[] {
  const order = options.order ?? 0.5;
  if (!Number.isFinite(order)) throw new RangeError(`demoPressureSeries: order must be a finite number, got ${order}`);
  const pressures = options.pressuresKPa ?? [101.325, 150, 200, 250];
  if (!Array.isArray(pressures) || pressures.length === 0) throw new RangeError('demoPressureSeries: pressuresKPa must be a non-empty array');
  for (const value of pressures) positive('demoPressureSeries: pressure', value);
  const pRef = options.referencePressureKPa ?? 101.325;
  positive('demoPressureSeries: referencePressureKPa', pRef);
  const jRef = options.referenceCurrentDensity ?? 0.01;
  positive('demoPressureSeries: referenceCurrentDensity', jRef);
  const temperatureC = options.temperatureC ?? 180;
  return pressures.map((pressure, index) => member(options, temperatureC, pressure, jRef * Math.pow(pressure / pRef, order), index));
}
