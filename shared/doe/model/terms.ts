// Model terms and model-matrix columns for response surfaces: which products of factors are
// in the model, the hierarchy rule, and treatment (dummy) coding of categorical factors.
import { DoeInputError } from './errors';
import { termLabel } from './labels';
import type { Factor, ModelColumn, ModelSpec, ModelTerm, ResolvedFactor } from './types';

type AnyFactor = Factor | ResolvedFactor;

export interface ModelTerms {
  /** intercept first, then by degree: main effects, interactions, squares, higher terms */
  terms: ModelTerm[];
  columns: ModelColumn[];
  warnings: string[];
}

const MAX_POWER = 3;

/** Canonical name of a monomial: factors in list order, "a*b", "a^2", "a^2*b". */
export function termName(factors: AnyFactor[], powers: number[]): string {
  const parts: string[] = [];
  for (let i = 0; i < factors.length; i++) {
    if (powers[i] === 1) parts.push(factors[i].key);
    else if (powers[i] > 1) parts.push(`${factors[i].key}^${powers[i]}`);
  }
  return parts.length === 0 ? 'intercept' : parts.join('*');
}

/**
 * Reads one term string ("binder", "binder*temp", "binder^2", "binder*binder") into powers.
 * Cost: O(length of the text + k).
 * @throws DoeInputError ('invalid-model') for unknown factors, bad powers, squared categoricals.
 * @example parseTerm('binder*temp', factors) // [1, 1, 0] when factors are binder, temp, gdl
 */
export function parseTerm(text: string, factors: AnyFactor[]): number[] {
  if (typeof text !== 'string' || text.trim() === '') {
    throw new DoeInputError('invalid-model', `buildModelTerms: a term must be a non-empty string (term ${JSON.stringify(text)})`);
  }
  const powers = new Array<number>(factors.length).fill(0);
  const parts = text.split('*');
  for (const rawPart of parts) {
    const part = rawPart.trim();
    const match = /^(.+?)(?:\s*\^\s*(\d+))?$/.exec(part);
    if (!match || part === '') {
      throw new DoeInputError('invalid-model', `buildModelTerms: cannot read term "${text}" (part "${rawPart}")`);
    }
    const key = match[1].trim();
    const power = match[2] === undefined ? 1 : Number(match[2]);
    const index = factors.findIndex((factor) => factor.key === key);
    if (index < 0) {
      throw new DoeInputError('invalid-model', `buildModelTerms: unknown factor "${key}" (term "${text}")`);
    }
    if (!(power >= 1)) {
      throw new DoeInputError('invalid-model', `buildModelTerms: powers must be 1 or more (term "${text}")`);
    }
    powers[index] += power;
  }
  for (let i = 0; i < factors.length; i++) {
    if (factors[i].kind === 'categorical' && powers[i] > 1) {
      throw new DoeInputError('invalid-model', `buildModelTerms: a categorical factor cannot be squared (term "${text}", factor "${factors[i].key}")`);
    }
    if (powers[i] > MAX_POWER) {
      throw new DoeInputError('invalid-model', `buildModelTerms: powers above ${MAX_POWER} are not supported (term "${text}")`);
    }
  }
  return powers;
}

function degreeOf(powers: number[]): number {
  let total = 0;
  for (const p of powers) total += p;
  return total;
}

/** Order: degree, then highest single power (interactions before squares), then factor order. */
function compareTerms(a: number[], b: number[]): number {
  const degreeDiff = degreeOf(a) - degreeOf(b);
  if (degreeDiff !== 0) return degreeDiff;
  const maxDiff = Math.max(...a) - Math.max(...b);
  if (maxDiff !== 0) return maxDiff;
  for (let i = 0; i < a.length; i++) {
    // a factor used earlier in the list sorts first ("a*b" before "a*c" before "b*c")
    if (a[i] !== b[i]) return b[i] - a[i];
  }
  return 0;
}

/** All proper divisors of a monomial except the constant: the parents hierarchy requires. */
function parentsOf(powers: number[]): number[][] {
  const parents: number[][] = [];
  const current = new Array<number>(powers.length).fill(0);
  const walk = (i: number): void => {
    if (i === powers.length) {
      const degree = degreeOf(current);
      if (degree > 0 && degree < degreeOf(powers)) parents.push([...current]);
      return;
    }
    for (let p = 0; p <= powers[i]; p++) {
      current[i] = p;
      walk(i + 1);
    }
    current[i] = 0;
  };
  walk(0);
  return parents;
}

function standardTerms(factors: AnyFactor[], model: 'linear' | 'interactions' | 'quadratic'): number[][] {
  const k = factors.length;
  const list: number[][] = [];
  for (let i = 0; i < k; i++) {
    const powers = new Array<number>(k).fill(0);
    powers[i] = 1;
    list.push(powers);
  }
  if (model === 'interactions' || model === 'quadratic') {
    for (let i = 0; i < k; i++) {
      for (let j = i + 1; j < k; j++) {
        // two categorical factors are not crossed in the standard models: their interaction
        // is a separate cell-means question and eats runs quickly
        if (factors[i].kind === 'categorical' && factors[j].kind === 'categorical') continue;
        const powers = new Array<number>(k).fill(0);
        powers[i] = 1;
        powers[j] = 1;
        list.push(powers);
      }
    }
  }
  if (model === 'quadratic') {
    for (let i = 0; i < k; i++) {
      if (factors[i].kind !== 'continuous') continue;
      const powers = new Array<number>(k).fill(0);
      powers[i] = 2;
      list.push(powers);
    }
  }
  return list;
}

/**
 * Model terms and model-matrix columns for a response-surface model.
 * Definition: 'linear' = intercept + main effects; 'interactions' adds every two-factor
 * interaction (not categorical × categorical); 'quadratic' adds the square of every continuous
 * factor; { terms } takes the listed terms. Hierarchy is enforced: every parent of a term
 * (A and B for A*B, A for A^2) is added when missing, with a warning. Categorical factors are
 * treatment coded against their first level: one column per other level, named "gdl[level]".
 * Reference: Montgomery, Design and Analysis of Experiments, ch. 11 (second-order model);
 * Peixoto (1990), "A property of well-formulated polynomial regression models", Am. Stat. 44.
 * Cost: O(t·2^k) for t terms and k factors (the parents walk), negligible in practice.
 * @throws DoeInputError ('invalid-model') for unknown factors, squared categoricals, bad specs.
 * @example buildModelTerms(factors, 'quadratic').terms.map((t) => t.name) // ['intercept', 'a', 'b', 'a*b', 'a^2', 'b^2']
 */
export function buildModelTerms(factors: AnyFactor[], model: ModelSpec): ModelTerms {
  const warnings: string[] = [];
  let requested: number[][];
  if (model === 'linear' || model === 'interactions' || model === 'quadratic') {
    requested = standardTerms(factors, model);
  } else if (model && typeof model === 'object' && Array.isArray(model.terms)) {
    requested = [];
    for (const text of model.terms) {
      const trimmed = typeof text === 'string' ? text.trim() : text;
      if (trimmed === 'intercept' || trimmed === '1') continue;
      requested.push(parseTerm(text, factors));
    }
  } else {
    throw new DoeInputError('invalid-model', `buildModelTerms: model must be "linear", "interactions", "quadratic" or { terms: [...] } (got ${JSON.stringify(model)})`);
  }

  const byName = new Map<string, number[]>();
  for (const powers of requested) byName.set(termName(factors, powers), powers);
  const added: { powers: number[]; text: string }[] = [];
  // parentsOf returns every divisor, so parents of parents need no second pass
  for (const powers of [...byName.values()]) {
    for (const parent of parentsOf(powers)) {
      const name = termName(factors, parent);
      if (!byName.has(name)) {
        byName.set(name, parent);
        added.push({ powers: parent, text: `${termLabel(factors, { powers: parent })} (for ${termLabel(factors, { powers })})` });
      }
    }
  }
  if (added.length > 0) {
    added.sort((a, b) => compareTerms(a.powers, b.powers));
    const list = added.map((entry) => entry.text).join(', ');
    warnings.push(`Added ${added.length === 1 ? 'a parent term' : 'parent terms'} to keep the model hierarchical: ${list}.`);
  }

  const sorted = [...byName.values()].sort(compareTerms);
  const terms: ModelTerm[] = [{ name: 'intercept', powers: new Array<number>(factors.length).fill(0), degree: 0 }];
  const columns: ModelColumn[] = [{ name: 'intercept', term: 'intercept', powers: new Array<number>(factors.length).fill(0), indicators: [] }];
  for (const powers of sorted) {
    const name = termName(factors, powers);
    const termColumns = expandColumns(factors, powers, name);
    if (termColumns.length === 0) {
      warnings.push(`Term ${termLabel(factors, { powers })} was left out: its categorical factor has a single level.`);
      continue;
    }
    terms.push({ name, powers, degree: degreeOf(powers) });
    for (const column of termColumns) columns.push(column);
  }
  return { terms, columns, warnings };
}

/** One column per combination of non-baseline levels of the categorical factors in the term. */
function expandColumns(factors: AnyFactor[], powers: number[], termNameText: string): ModelColumn[] {
  const continuousPowers = new Array<number>(factors.length).fill(0);
  const categorical: number[] = [];
  for (let i = 0; i < factors.length; i++) {
    if (powers[i] === 0) continue;
    if (factors[i].kind === 'categorical') categorical.push(i);
    else continuousPowers[i] = powers[i];
  }
  let combos: { factor: number; level: string }[][] = [[]];
  for (const index of categorical) {
    const levels = (factors[index].levels ?? []).slice(1);
    const next: { factor: number; level: string }[][] = [];
    for (const combo of combos) {
      for (const level of levels) next.push([...combo, { factor: index, level }]);
    }
    combos = next;
  }
  return combos.map((indicators) => ({
    name: columnName(factors, continuousPowers, indicators),
    term: termNameText,
    powers: continuousPowers,
    indicators,
  }));
}

function columnName(factors: AnyFactor[], powers: number[], indicators: { factor: number; level: string }[]): string {
  const parts: string[] = [];
  for (let i = 0; i < factors.length; i++) {
    const indicator = indicators.find((entry) => entry.factor === i);
    if (indicator) parts.push(`${factors[i].key}[${indicator.level}]`);
    else if (powers[i] === 1) parts.push(factors[i].key);
    else if (powers[i] > 1) parts.push(`${factors[i].key}^${powers[i]}`);
  }
  return parts.length === 0 ? 'intercept' : parts.join('*');
}

/**
 * One row of the model matrix for an encoded point (coded numbers for continuous factors,
 * level text for categorical ones, aligned with the factor list).
 * Cost: O(c·k) for c columns.
 * @example modelRow(columns, [0.5, -1, 'cloth'])
 */
export function modelRow(columns: ModelColumn[], encoded: (number | string)[]): number[] {
  const row = new Array<number>(columns.length);
  for (let c = 0; c < columns.length; c++) {
    const column = columns[c];
    let value = 1;
    for (let i = 0; i < column.powers.length; i++) {
      const power = column.powers[i];
      if (power === 0) continue;
      const x = encoded[i] as number;
      value *= power === 1 ? x : power === 2 ? x * x : x ** power;
    }
    for (const indicator of column.indicators) {
      if (String(encoded[indicator.factor]) !== indicator.level) {
        value = 0;
        break;
      }
    }
    row[c] = value;
  }
  return row;
}
