// One line of text for a list of recipe changes, as people write change notes.
import type { RecipeChange } from './recipe-diff';
import { roundSignificantText, SETTING_DIGITS } from '../units/significant';

function show(value: number | string | null): string {
  if (value === null) return '(none)';
  if (typeof value === 'number') return roundSignificantText(value, SETTING_DIGITS);
  return value;
}

/**
 * "binder 20 → 30 wt %, activation time 2 → 4 h": each change as "label from → to unit",
 * joined by commas; the unit goes once after the new value (after both when one side is empty).
 * Reference: none (house wording).
 * Cost: O(number of changes).
 * @throws TypeError when changes is not an array.
 * @example describeChanges([{ key: 'binder', label: 'binder', unit: 'wt %', from: 20, to: 30 }]) // 'binder 20 → 30 wt %'
 */
export function describeChanges(changes: readonly RecipeChange[]): string {
  if (!Array.isArray(changes)) throw new TypeError(`describeChanges: changes must be an array, got ${typeof changes}`);
  const parts: string[] = [];
  for (const change of changes) {
    const unit = change.unit ? ` ${change.unit}` : '';
    const from = show(change.from);
    const to = show(change.to);
    const fromPart = change.from === null || change.to === null ? `${from}${change.from === null ? '' : unit}` : from;
    parts.push(`${change.label} ${fromPart} → ${to}${change.to === null ? '' : unit}`);
  }
  return parts.join(', ');
}
