// A series from its curves: the current of every member at one iR-free voltage, then the
// Arrhenius line (temperature) or the log–log slope (pressure, concentration).
import { activationEnergy } from './activation-energy';
import { reactionOrder } from './reaction-order';
import { currentAtIrFreeVoltage } from './current-at-voltage';
import type { CurrentAtVoltage, CurvePoints } from './current-at-voltage';
import type { SeriesResult } from './types';

export interface SeriesMember {
  buildId: number;
  /** the series variable: cell temperature in °C (arrhenius), or pressure / concentration (order) */
  value: number;
  /** the member's polarization curve (curve of record) */
  curve: CurvePoints;
  /** the build's H₂ crossover current density, A/cm² */
  h2CrossoverAcm2?: number;
  /** the build's limiting current density, A/cm², when known (enables the kinetic current) */
  limitingCurrentDensity?: number;
}

export interface SeriesRequest {
  kind: 'arrhenius' | 'order';
  /** iR-free voltage at which every member's current is read, V */
  voltage: number;
  members: readonly SeriesMember[];
  /** order only: what was varied and its unit */
  variable?: 'pressure' | 'concentration';
  unit?: string;
  confidence?: number;
}

export interface SeriesAnalysis {
  /** null when fewer than two members (or two distinct values) gave a current */
  result: SeriesResult | null;
  /** every member's reading, used or not */
  readings: { buildId: number; value: number; reading: CurrentAtVoltage }[];
  /** members left out and why */
  leftOut: { buildId: number; reason: string }[];
  /** the current the fit used for every member */
  basis: 'iR-free' | 'kinetic' | null;
  /** why there is no result, or caveats on the whole series */
  notes: string[];
}

/**
 * Runs a series end to end. Each member's current at the iR-free voltage is read by
 * currentAtIrFreeVoltage; members whose curve does not reach the voltage are left out and named.
 * The kinetic current is used only when every remaining member has one (mixing kinetic and
 * iR-free currents would bias the slope); otherwise the iR-free current of all members is used and
 * a note says so. The currents then go to activationEnergy or reactionOrder.
 * Reference: as currentAtIrFreeVoltage, activationEnergy and reactionOrder.
 * Cost: O(Σ nᵢ log nᵢ) over the members' readings.
 * @throws RangeError when the request is malformed (kind, voltage, members), or a member's curve
 *   is malformed (as currentAtIrFreeVoltage).
 * @example analyseSeries({ kind: 'arrhenius', voltage: 0.85, members }).result?.estimate // kJ/mol
 */
export function analyseSeries(request: SeriesRequest): SeriesAnalysis {
  if (request === null || typeof request !== 'object') throw new RangeError('analyseSeries: request must be an object');
  if (request.kind !== 'arrhenius' && request.kind !== 'order') throw new RangeError(`analyseSeries: kind must be 'arrhenius' or 'order', got ${String(request.kind)}`);
  if (!Array.isArray(request.members) || request.members.length === 0) throw new RangeError('analyseSeries: members must be a non-empty array');
  const readings: SeriesAnalysis['readings'] = [];
  const leftOut: SeriesAnalysis['leftOut'] = [];
  request.members.forEach((member, index) => {
    if (member === null || typeof member !== 'object' || !Number.isFinite(member.value)) {
      throw new RangeError(`analyseSeries: member ${index} must have a numeric value of the series variable`);
    }
    const reading = currentAtIrFreeVoltage(member.curve, request.voltage, {
      h2CrossoverAcm2: member.h2CrossoverAcm2,
      limitingCurrentDensity: member.limitingCurrentDensity,
    });
    readings.push({ buildId: member.buildId, value: member.value, reading });
    if (reading.currentDensity === null) leftOut.push({ buildId: member.buildId, reason: `no current at ${request.voltage} V iR-free: ${reading.note ?? 'not reached'}` });
  });
  const usable = readings.filter((entry) => entry.reading.currentDensity !== null && (entry.reading.irFreeCurrentDensity as number) > 0);
  const notes: string[] = [];
  const allKinetic = usable.length > 0 && usable.every((entry) => entry.reading.basis === 'kinetic');
  if (!allKinetic && usable.some((entry) => entry.reading.basis === 'kinetic')) notes.push('not every member has a kinetic current: the iR-free current is used for all');
  const basis: SeriesAnalysis['basis'] = usable.length === 0 ? null : allKinetic ? 'kinetic' : 'iR-free';
  const currentOf = (entry: (typeof usable)[number]): number => (allKinetic ? (entry.reading.currentDensity as number) : (entry.reading.irFreeCurrentDensity as number));
  const currentLabel = `${allKinetic ? 'kinetic j' : 'j'} at ${request.voltage} V iR-free`;
  if (usable.length < 2 || new Set(usable.map((entry) => entry.value)).size < 2) {
    notes.push(`only ${usable.length} member${usable.length === 1 ? '' : 's'} with a current at ${request.voltage} V iR-free${usable.length >= 2 ? ', all at one value of the series variable' : ''}: at least two values are needed`);
    return { result: null, readings, leftOut, basis, notes };
  }
  const result =
    request.kind === 'arrhenius'
      ? activationEnergy(
          usable.map((entry) => ({ buildId: entry.buildId, temperatureC: entry.value, currentDensity: currentOf(entry) })),
          { confidence: request.confidence, currentLabel },
        )
      : reactionOrder(
          usable.map((entry) => ({ buildId: entry.buildId, value: entry.value, currentDensity: currentOf(entry) })),
          { confidence: request.confidence, currentLabel, variable: request.variable, unit: request.unit },
        );
  return { result, readings, leftOut, basis, notes };
}
