// Factor letters for two-level designs: A, B, C… in the order of the continuous factors.
// I is skipped because it stands for the identity column in defining relations (I = ABCDE),
// so the 9th factor is J — the usual convention in fractional-factorial tables.
// Effects and words are bit masks: bit i set = letter i appears in the product.

export const FACTOR_LETTERS = 'ABCDEFGHJKLMNOPQRSTUVWXYZ';

/** Most continuous factors a two-level design may name (letters A…P without I). */
export const MAX_LETTERED_FACTORS = 15;

/**
 * The word of a bit mask, letters in alphabetical (factor) order; the empty mask is "I".
 * Cost: O(number of letters).
 * @example wordOfMask(0b10101) // "ACE"
 */
export function wordOfMask(mask: number): string {
  if (mask === 0) return 'I';
  let word = '';
  for (let index = 0; index < FACTOR_LETTERS.length; index++) {
    if ((mask >>> index) & 1) word += FACTOR_LETTERS[index];
  }
  return word;
}

/**
 * Number of letters in a word (its order: 1 = main effect, 2 = two-factor interaction…).
 * Cost: O(1).
 * @example wordLength(0b1011) // 3
 */
export function wordLength(mask: number): number {
  let bits = mask >>> 0;
  bits = bits - ((bits >>> 1) & 0x55555555);
  bits = (bits & 0x33333333) + ((bits >>> 2) & 0x33333333);
  return (Math.imul((bits + (bits >>> 4)) & 0x0f0f0f0f, 0x01010101) >>> 24) & 0xff;
}

/**
 * Orders words the way design tables list them: shorter first, then alphabetically.
 * Cost: O(1) per comparison.
 * @example [0b111, 0b11].sort(compareWords) // AB before ABC
 */
export function compareWords(first: number, second: number): number {
  const byLength = wordLength(first) - wordLength(second);
  if (byLength !== 0) return byLength;
  const firstWord = wordOfMask(first);
  const secondWord = wordOfMask(second);
  return firstWord < secondWord ? -1 : firstWord > secondWord ? 1 : 0;
}

/**
 * Letter → factor key map for the info block.
 * Cost: O(k).
 * @example letterMap(['binderWt', 'tempC']) // { A: 'binderWt', B: 'tempC' }
 */
export function letterMap(continuousKeys: readonly string[]): Record<string, string> {
  const map: Record<string, string> = {};
  const count = Math.min(continuousKeys.length, FACTOR_LETTERS.length);
  for (let index = 0; index < count; index++) {
    map[FACTOR_LETTERS[index] as string] = continuousKeys[index] as string;
  }
  return map;
}
