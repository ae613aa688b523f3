// Words for factors, terms and model columns as a person reads them ("PTFE binder × Cell
// temperature", "GDL: carbon paper", "PTFE binder²"), never the keys the code uses.
import type { Factor, ModelColumn, ModelTerm, ResolvedFactor } from './types';
import { roundSignificantText, TEXT_DIGITS } from '../../units/significant';

type Named = Pick<Factor | ResolvedFactor, 'key' | 'label' | 'unit'>;

/** A factor's label, or its key when it has none. Cost: O(1). @example factorName({ key: 'binder', label: 'PTFE binder' }) // 'PTFE binder' */
export function factorName(factor: Named): string {
  return factor.label && factor.label.trim() !== '' ? factor.label : factor.key;
}

/** A factor's label with its unit in brackets, for axes and table heads. Cost: O(1). */
export function factorWithUnit(factor: Named): string {
  return factor.unit ? `${factorName(factor)} (${factor.unit})` : factorName(factor);
}

const SUPERSCRIPT: Record<number, string> = { 2: '²', 3: '³' };

/**
 * A model column in words: continuous factors by label with a power sign, categorical
 * indicators as "label: level", joined by " × "; the constant is "Constant".
 * Cost: O(k).
 * @example columnLabel(factors, column) // 'PTFE binder × GDL: carbon paper'
 */
export function columnLabel(factors: Named[], column: Pick<ModelColumn, 'powers' | 'indicators'>): string {
  const parts: string[] = [];
  for (let i = 0; i < factors.length; i++) {
    const indicator = column.indicators.find((entry) => entry.factor === i);
    if (indicator) parts.push(`${factorName(factors[i])}: ${indicator.level}`);
    else if (column.powers[i] === 1) parts.push(factorName(factors[i]));
    else if (column.powers[i] > 1) parts.push(`${factorName(factors[i])}${SUPERSCRIPT[column.powers[i]] ?? `^${column.powers[i]}`}`);
  }
  return parts.length === 0 ? 'Constant' : parts.join(' × ');
}

/**
 * A model term in words (all its columns together): "PTFE binder × GDL", "Cell temperature²".
 * Cost: O(k).
 * @example termLabel(factors, { name: 'binder*gdl', powers: [1, 1], degree: 2 }) // 'PTFE binder × GDL'
 */
export function termLabel(factors: Named[], term: Pick<ModelTerm, 'powers'>): string {
  const parts: string[] = [];
  for (let i = 0; i < factors.length; i++) {
    const power = term.powers[i];
    if (power === 1) parts.push(factorName(factors[i]));
    else if (power > 1) parts.push(`${factorName(factors[i])}${SUPERSCRIPT[power] ?? `^${power}`}`);
  }
  return parts.length === 0 ? 'Constant' : parts.join(' × ');
}

/** A number with at most `digits` significant digits and no float noise, for sentences. Cost: O(1). */
export function roundForText(value: number, digits = TEXT_DIGITS): string {
  return roundSignificantText(value, digits);
}
