// Checks the factor list and the observed runs before anything is computed, and fixes the
// coding range of every continuous factor (declared low/high, or the data range when absent).
import { DoeInputError } from './errors';
import type { Factor, Observation, ResolvedFactor } from './types';

/**
 * Where a run is, in words a person can find: "build C-017" when the run carries its build's
 * code, otherwise its place in the list ("row 3, build 14" for callers that only have ids).
 */
export function rowPlace(index: number, row: Observation | undefined): string {
  if (row && typeof row.label === 'string' && row.label !== '') return `build ${row.label}`;
  const build = row && row.buildId !== undefined ? `, build ${row.buildId}` : '';
  return `row ${index + 1}${build}`;
}

/**
 * Validates factors and resolves each continuous factor's coding range.
 * Definition: a continuous factor needs either both low < high, or neither (then the data
 * minimum and maximum are used); a categorical factor needs at least one unique level.
 * Reference: coded variables as in Montgomery, Design and Analysis of Experiments, ch. 6.
 * Cost: O(n·k) for n rows and k factors.
 * @throws DoeInputError ('invalid-factor') on duplicate keys, bad ranges or levels.
 * @example resolveFactors('fitSurface', [{ key: 'temp', kind: 'continuous', low: 160, high: 180 }], rows)
 */
export function resolveFactors(fn: string, factors: Factor[], rows: Observation[]): ResolvedFactor[] {
  if (!Array.isArray(factors) || factors.length === 0) {
    throw new DoeInputError('invalid-factor', `${fn}: at least one factor is needed (factors)`);
  }
  const seen = new Set<string>();
  const resolved: ResolvedFactor[] = [];
  for (let i = 0; i < factors.length; i++) {
    const factor = factors[i];
    const where = `factor ${i + 1}`;
    if (!factor || typeof factor.key !== 'string' || factor.key.trim() === '') {
      throw new DoeInputError('invalid-factor', `${fn}: factor key must be a non-empty string (${where})`);
    }
    if (/[*^\[\]]/.test(factor.key)) {
      throw new DoeInputError('invalid-factor', `${fn}: factor key may not contain *, ^, [ or ] (${where}, key "${factor.key}")`);
    }
    if (seen.has(factor.key)) {
      throw new DoeInputError('invalid-factor', `${fn}: duplicate factor key "${factor.key}" (${where})`);
    }
    seen.add(factor.key);
    const base = { key: factor.key, label: factor.label, unit: factor.unit };
    if (factor.kind === 'categorical') {
      const levels = factor.levels;
      if (!Array.isArray(levels) || levels.length === 0) {
        throw new DoeInputError('invalid-factor', `${fn}: categorical factor needs at least one level (factor "${factor.key}")`);
      }
      const levelSet = new Set<string>();
      for (const level of levels) {
        if (typeof level !== 'string' || level === '' || levelSet.has(level)) {
          throw new DoeInputError('invalid-factor', `${fn}: levels must be unique non-empty strings (factor "${factor.key}", level "${String(level)}")`);
        }
        levelSet.add(level);
      }
      const seenLevels = new Set<string>();
      for (const row of rows) {
        const value = row?.factors?.[factor.key];
        if (value !== undefined && value !== null && levelSet.has(String(value))) seenLevels.add(String(value));
      }
      resolved.push({ ...base, kind: 'categorical', levels: [...levels], levelsRun: levels.filter((level) => seenLevels.has(level)) });
      continue;
    }
    if (factor.kind !== 'continuous') {
      throw new DoeInputError('invalid-factor', `${fn}: kind must be "continuous" or "categorical" (factor "${factor.key}", got "${String(factor.kind)}")`);
    }
    let dataMin = Infinity;
    let dataMax = -Infinity;
    for (const row of rows) {
      const value = row?.factors?.[factor.key];
      if (typeof value === 'number' && Number.isFinite(value)) {
        if (value < dataMin) dataMin = value;
        if (value > dataMax) dataMax = value;
      }
    }
    const hasLow = factor.low !== undefined && factor.low !== null;
    const hasHigh = factor.high !== undefined && factor.high !== null;
    let low: number;
    let high: number;
    if (hasLow !== hasHigh) {
      throw new DoeInputError('invalid-factor', `${fn}: give both low and high, or neither (factor "${factor.key}")`);
    }
    if (hasLow) {
      low = factor.low as number;
      high = factor.high as number;
      if (!Number.isFinite(low) || !Number.isFinite(high) || !(low < high)) {
        throw new DoeInputError('invalid-factor', `${fn}: low must be a finite number below high (factor "${factor.key}", low = ${low}, high = ${high})`);
      }
    } else {
      if (!(dataMin < dataMax)) {
        throw new DoeInputError('invalid-factor', `${fn}: no low/high given and the data do not vary (factor "${factor.key}")`);
      }
      low = dataMin;
      high = dataMax;
    }
    const entry: ResolvedFactor = { ...base, kind: 'continuous', low, high };
    if (dataMin <= dataMax) {
      entry.dataMin = dataMin;
      entry.dataMax = dataMax;
    }
    resolved.push(entry);
  }
  return resolved;
}

/**
 * Checks every observed run: each factor present with a value of the right kind, y finite.
 * Categorical values given as numbers are accepted when their text matches a level.
 * Cost: O(n·k).
 * @throws DoeInputError ('invalid-row') naming the row (and build) and the factor.
 * @example checkRows('fitSurface', factors, rows)
 */
export function checkRows(fn: string, factors: ResolvedFactor[], rows: Observation[]): void {
  if (!Array.isArray(rows) || rows.length === 0) {
    throw new DoeInputError('invalid-row', `${fn}: no observed runs were given (rows)`);
  }
  for (let i = 0; i < rows.length; i++) {
    const row = rows[i];
    if (!row || typeof row !== 'object' || !row.factors || typeof row.factors !== 'object') {
      throw new DoeInputError('invalid-row', `${fn}: each row needs a factors object (${rowPlace(i, row)})`);
    }
    if (typeof row.y !== 'number' || !Number.isFinite(row.y)) {
      throw new DoeInputError('invalid-row', `${fn}: response value must be a finite number (${rowPlace(i, row)}, y = ${String(row.y)})`);
    }
    for (const factor of factors) {
      const value = row.factors[factor.key];
      if (value === undefined || value === null) {
        throw new DoeInputError('invalid-row', `${fn}: missing value for factor "${factor.key}" (${rowPlace(i, row)})`);
      }
      if (factor.kind === 'continuous') {
        if (typeof value !== 'number' || !Number.isFinite(value)) {
          throw new DoeInputError('invalid-row', `${fn}: factor "${factor.key}" must be a finite number (${rowPlace(i, row)}, got ${JSON.stringify(value)})`);
        }
      } else if (!(factor.levels as string[]).includes(String(value))) {
        throw new DoeInputError('invalid-row', `${fn}: "${String(value)}" is not a level of factor "${factor.key}" (${rowPlace(i, row)})`);
      }
    }
  }
}

/** Key of a run's factor settings, so replicates (same settings) fall in one group. Cost: O(k). */
export function settingsKey(factors: ResolvedFactor[], row: Observation): string {
  const parts: string[] = [];
  for (const factor of factors) {
    const value = row.factors[factor.key];
    parts.push(factor.kind === 'continuous' ? (value as number).toPrecision(12) : `"${String(value)}"`);
  }
  return parts.join('|');
}
