// Turns a point in actual units (°C, wt %, level names) into the coded form the model uses.
import { fromCoded, toCoded } from '../coding';
import { DoeInputError } from './errors';
import type { ResolvedFactor } from './types';

/**
 * Encodes a point given in actual units: continuous factors → (x − centre)/half-range,
 * categorical factors → their level text. The result is aligned with the factor list.
 * Reference: coded variables, Montgomery, Design and Analysis of Experiments, ch. 6.
 * Cost: O(k).
 * @throws DoeInputError ('invalid-point') for a missing factor, a non-finite number or an unknown level.
 * @example encodePoint('predict', factors, { temp: 170, gdl: 'cloth' }) // [0, 'cloth']
 */
export function encodePoint(fn: string, factors: ResolvedFactor[], point: Record<string, number | string>): (number | string)[] {
  if (!point || typeof point !== 'object') {
    throw new DoeInputError('invalid-point', `${fn}: point must be an object of factor values (point)`);
  }
  const encoded: (number | string)[] = new Array(factors.length);
  for (let i = 0; i < factors.length; i++) {
    const factor = factors[i];
    const value = point[factor.key];
    if (value === undefined || value === null) {
      throw new DoeInputError('invalid-point', `${fn}: missing value for factor "${factor.key}" (point)`);
    }
    if (factor.kind === 'continuous') {
      if (typeof value !== 'number' || !Number.isFinite(value)) {
        throw new DoeInputError('invalid-point', `${fn}: factor "${factor.key}" must be a finite number (point, got ${JSON.stringify(value)})`);
      }
      encoded[i] = toCoded(value, factor.low as number, factor.high as number);
    } else {
      const level = String(value);
      if (!(factor.levels as string[]).includes(level)) {
        throw new DoeInputError('invalid-point', `${fn}: "${level}" is not a level of factor "${factor.key}" (point)`);
      }
      encoded[i] = level;
    }
  }
  return encoded;
}

/** Actual value of a coded continuous setting for a resolved factor. */
export function decodeValue(factor: ResolvedFactor, coded: number): number {
  return fromCoded(coded, factor.low as number, factor.high as number);
}
