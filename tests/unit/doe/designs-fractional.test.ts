import { describe, it, expect } from 'vitest';
import { DEFAULT_GENERATORS, DesignInputError, FACTOR_LETTERS, definingWords, generateDesign, parseGenerators } from '../../../shared/doe/designs';
import type { DesignFactor } from '../../../shared/doe/designs';

function continuousFactors(count: number): DesignFactor[] {
  const factors: DesignFactor[] = [];
  // Invented electrode-recipe factors, coded −1…+1 over made-up ranges.
  for (let index = 0; index < count; index++) factors.push({ key: `recipe${index + 1}`, kind: 'continuous', low: index, high: index + 2 });
  return factors;
}

function letterColumn(design: ReturnType<typeof generateDesign>, letter: string): number[] {
  const key = design.info.factorLetters[letter] as string;
  return design.runs
    .slice()
    .sort((a, b) => a.standardOrder - b.standardOrder)
    .map((run) => run.coded[key] as number);
}

function bitCount(mask: number): number {
  let count = 0;
  for (let bits = mask; bits !== 0; bits &= bits - 1) count++;
  return count;
}

/** Word-length pattern (A1, A2, …, Ak): how many defining words have each length. */
function wordLengthPattern(k: number, generators: string[]): number[] {
  const pattern = new Array<number>(k + 1).fill(0);
  for (const word of definingWords(parseGenerators(k, generators))) pattern[bitCount(word.mask)] = (pattern[bitCount(word.mask)] as number) + 1;
  return pattern.slice(1);
}

function lexicographicallyLess(first: number[], second: number[]): boolean {
  for (let index = 0; index < first.length; index++) {
    if ((first[index] as number) !== (second[index] as number)) return (first[index] as number) < (second[index] as number);
  }
  return false;
}

describe('fractional factorial 2^(k−p)', () => {
  it('2^(5−1) with E = ABCD is resolution V with I = ABCDE', () => {
    const design = generateDesign({ kind: 'fractional-factorial', factors: continuousFactors(5), generators: ['E=ABCD'], seed: 2 });
    expect(design.runs.length).toBe(16); // NIST/SEMATECH e-Handbook §5.3.3.4.2: 2^(5−1) has 16 runs
    expect(design.info.definingRelation).toBe('I = ABCDE'); // NIST/SEMATECH e-Handbook §5.3.3.4.x: E = ABCD gives I = ABCDE
    expect(design.info.resolution).toBe(5); // NIST/SEMATECH e-Handbook §5.3.3.4.4: length of the shortest word, 5 = resolution V
    expect(design.info.aliases).toContain('A = BCDE'); // derived by hand: A·ABCDE = BCDE
    expect(design.info.aliases).toContain('AB = CDE'); // derived by hand: AB·ABCDE = CDE
    expect(design.info.aliasChains?.length).toBe(15); // derived by hand: 5 main effects + 10 two-factor interactions, each chain of 2
    const product = letterColumn(design, 'A').map((value, run) => value * (letterColumn(design, 'B')[run] as number) * (letterColumn(design, 'C')[run] as number) * (letterColumn(design, 'D')[run] as number));
    expect(letterColumn(design, 'E')).toEqual(product); // derived by hand: the generator E = ABCD, column by column
  });

  it('2^(7−4) with D = AB, E = AC, F = BC, G = ABC is resolution III', () => {
    const design = generateDesign({ kind: 'fractional-factorial', factors: continuousFactors(7), generators: ['D=AB', 'E=AC', 'F=BC', 'G=ABC'], seed: 2 });
    expect(design.runs.length).toBe(8); // NIST/SEMATECH e-Handbook §5.3.3.4.7: 2^(7−4) has 8 runs
    expect(design.info.resolution).toBe(3); // NIST/SEMATECH e-Handbook §5.3.3.4.7: 2^(7−4) is resolution III
    expect(design.info.definingWords?.length).toBe(15); // derived by hand: 2^4 − 1 products of the 4 generator words
    expect(design.info.definingWords?.slice(0, 7)).toEqual(['ABD', 'ACE', 'AFG', 'BCF', 'BEG', 'CDG', 'DEF']); // derived by hand: the seven 3-letter words
    const chainOfA = design.info.aliasChains?.find((chain) => chain.effect === 'A');
    // derived by hand: A·ABD = BD, A·ACE = CE, A·AFG = FG (AFG = BCF·ABCG)
    expect(chainOfA?.aliases.slice(0, 3)).toEqual(['BD', 'CE', 'FG']);
  });

  it('a negative generator picks the other half and carries its sign into the aliases', () => {
    const design = generateDesign({ kind: 'fractional-factorial', factors: continuousFactors(4), generators: ['D = -ABC'], seed: 2 });
    expect(design.info.generators).toEqual(['D=-ABC']);
    expect(design.info.definingRelation).toBe('I = -ABCD'); // derived by hand: D = −ABC ⇒ I = −ABCD
    expect(design.info.aliases).toContain('A = -BCD'); // derived by hand: A·(−ABCD) = −BCD
    const a = letterColumn(design, 'A');
    const b = letterColumn(design, 'B');
    const c = letterColumn(design, 'C');
    expect(letterColumn(design, 'D')).toEqual(a.map((value, run) => -value * (b[run] as number) * (c[run] as number))); // derived by hand: D = −ABC
  });

  it('main-effect columns of a fraction are balanced and orthogonal', () => {
    const design = generateDesign({ kind: 'fractional-factorial', factors: continuousFactors(7), runs: 16, seed: 4 });
    const columns = ['A', 'B', 'C', 'D', 'E', 'F', 'G'].map((letter) => letterColumn(design, letter));
    for (let first = 0; first < columns.length; first++) {
      expect((columns[first] as number[]).reduce((sum, value) => sum + value, 0)).toBe(0); // derived by hand: 8 runs at −1, 8 at +1
      for (let second = first + 1; second < columns.length; second++) {
        const products = (columns[first] as number[]).map((value, run) => value * ((columns[second] as number[])[run] as number));
        expect(products.reduce((sum, value) => sum + value, 0)).toBe(0); // derived by hand: resolution IV keeps main effects orthogonal
      }
    }
  });

  it('skips the letter I: the 9th factor is J', () => {
    const design = generateDesign({ kind: 'fractional-factorial', factors: continuousFactors(9), generators: ['J=ABCDEFGH'], seed: 1 });
    expect(FACTOR_LETTERS.slice(0, 9)).toBe('ABCDEFGHJ'); // common practice in the trade: I is the identity in defining relations
    expect(design.info.definingRelation).toBe('I = ABCDEFGHJ');
    expect(design.runs.length).toBe(256); // derived by hand: 2^(9−1) = 256
    expect(() => generateDesign({ kind: 'fractional-factorial', factors: continuousFactors(9), generators: ['I=ABC'] })).toThrow('names factor letter I');
  });
});

describe('default generator table (from memory / NIST e-Handbook §5.3.3.4.7)', () => {
  // NIST/SEMATECH e-Handbook §5.3.3.4.7 summary table, resolutions (from memory): verified below by enumeration
  const expectedResolution: Record<string, number> = { '3-1': 3, '4-1': 4, '5-1': 5, '5-2': 3, '6-1': 6, '6-2': 4, '6-3': 3, '7-1': 7, '7-2': 4, '7-3': 4, '7-4': 3 };

  it('each entry has the tabled resolution', () => {
    for (const [entry, generators] of Object.entries(DEFAULT_GENERATORS)) {
      const [k, p] = entry.split('-').map(Number) as [number, number];
      const design = generateDesign({ kind: 'fractional-factorial', factors: continuousFactors(k), runs: 2 ** (k - p), seed: 1 });
      expect(design.info.generators).toEqual(generators);
      expect(design.info.resolution).toBe(expectedResolution[entry]);
    }
  });

  it('each entry is minimum aberration: no generator set on the same base factors has a smaller word-length pattern', () => {
    for (const [entry, generators] of Object.entries(DEFAULT_GENERATORS)) {
      const [k, p] = entry.split('-').map(Number) as [number, number];
      const baseCount = k - p;
      const products: string[] = [];
      for (let mask = 1; mask < 2 ** baseCount; mask++) {
        if (bitCount(mask) < 2) continue;
        let word = '';
        for (let bit = 0; bit < baseCount; bit++) if ((mask >>> bit) & 1) word += FACTOR_LETTERS[bit];
        products.push(word);
      }
      const tabled = wordLengthPattern(k, generators.slice());
      const choice = new Array<number>(p).fill(0);
      let alternatives = 0;
      // Every assignment of a product to each generated letter (the last p letters).
      for (;;) {
        const candidate = choice.map((productIndex, position) => `${FACTOR_LETTERS[baseCount + position]}=${products[productIndex]}`);
        expect(lexicographicallyLess(wordLengthPattern(k, candidate), tabled)).toBe(false);
        alternatives++;
        let position = 0;
        while (position < p && (choice[position] as number) === products.length - 1) choice[position++] = 0;
        if (position === p) break;
        choice[position] = (choice[position] as number) + 1;
      }
      expect(alternatives).toBe(products.length ** p); // derived by hand: (number of products of ≥ 2 base letters)^p
    }
  });
});

describe('fractional factorial input errors', () => {
  const five = continuousFactors(5);
  it('names the field and the problem', () => {
    expect(() => generateDesign({ kind: 'fractional-factorial', factors: five, generators: ['E=ABCX'] })).toThrow(
      'fractionalFactorial: generators[0]: "E=ABCX" names factor letter X, but the continuous factors are A–E (I is not used)',
    );
    expect(() => generateDesign({ kind: 'fractional-factorial', factors: five, generators: ['E:ABCD'] })).toThrow('generators[0]: "E:ABCD" is not of the form "E=ABCD"');
    expect(() => generateDesign({ kind: 'fractional-factorial', factors: five, generators: ['E=AAB'] })).toThrow('repeats letter A');
    expect(() => generateDesign({ kind: 'fractional-factorial', factors: five, generators: ['E=A'] })).toThrow('at least two other factors');
    expect(() => generateDesign({ kind: 'fractional-factorial', factors: five, generators: ['D=AB', 'E=ABD'] })).toThrow('uses generated factor D on the right');
    expect(() => generateDesign({ kind: 'fractional-factorial', factors: five, generators: ['E=AB', 'E=AC'] })).toThrow('factor E is already generated');
    expect(() => generateDesign({ kind: 'fractional-factorial', factors: five, generators: ['D=AB', 'E=AB'] })).toThrow('resolution II');
    expect(() => generateDesign({ kind: 'fractional-factorial', factors: five })).toThrow('fractionalFactorial: generators: give generators');
    expect(() => generateDesign({ kind: 'fractional-factorial', factors: five, runs: 12 })).toThrow('fractionalFactorial: runs: must be a power of two from 4 to 16');
    expect(() => generateDesign({ kind: 'fractional-factorial', factors: continuousFactors(8), runs: 16 })).toThrow('no default generators for a 2^(8-4) design');
    expect(() => generateDesign({ kind: 'fractional-factorial', factors: continuousFactors(2), runs: 4 })).toThrow('generateDesign: factors: a fractional factorial needs at least 3 continuous factors, got 2');
    expect(() => generateDesign({ kind: 'fractional-factorial', factors: five, generators: [7 as unknown as string] })).toThrow(DesignInputError);
  });
});
