import { describe, it, expect } from 'vitest';
import { DesignInputError, codedToActual, designToCsv, generateDesign } from '../../../shared/doe/designs';
import type { Design, DesignFactor, DesignRequest } from '../../../shared/doe/designs';

// Invented factors for an HT-PEM cathode campaign at an invented lab.
const binder: DesignFactor = { key: 'binderWt', kind: 'continuous', low: 10, high: 30 }; // wt %
const cell: DesignFactor = { key: 'cellC', kind: 'continuous', low: 160, high: 180 }; // °C
const loading: DesignFactor = { key: 'loadingMgCm2', kind: 'continuous', low: 0.8, high: 1.2 }; // mg/cm²
const extra1: DesignFactor = { key: 'hotPressMin', kind: 'continuous', low: 2, high: 8 };
const extra2: DesignFactor = { key: 'acidDoping', kind: 'continuous', low: 6, high: 10 };
const gdl: DesignFactor = { key: 'gdl', kind: 'categorical', levels: ['paper-A7', 'cloth-C2'] };
const lot: DesignFactor = { key: 'catalystLot', kind: 'categorical', levels: ['L-101', 'L-102', 'L-103'] };

function signOfBlock(run: Design['runs'][number]): number {
  return run.block === 1 ? 1 : -1;
}

describe('codedToActual', () => {
  it('is the linear map actual = centre + coded · halfRange', () => {
    expect(codedToActual(-1, 160, 180)).toBe(160); // derived by hand: 170 − 10
    expect(codedToActual(1.682, 160, 180)).toBeCloseTo(186.82, 10); // derived by hand: 170 + 1.682 · 10
    expect(codedToActual(0.5, 0.1, 0.3)).toBe(0.25); // derived by hand: 0.2 + 0.5 · 0.1, printed without binary noise
    expect(() => codedToActual(0, 5, 5)).toThrow('codedToActual: high: must be greater than low');
    expect(() => codedToActual(Number.NaN, 0, 1)).toThrow(RangeError);
  });
});

describe('categorical factors', () => {
  it('are crossed with every continuous run, multiplying the run count', () => {
    const plain = generateDesign({ kind: 'box-behnken', factors: [binder, cell, loading], centerPoints: 3, seed: 1 });
    const crossed = generateDesign({ kind: 'box-behnken', factors: [binder, gdl, cell, loading, lot], centerPoints: 3, seed: 1 });
    expect(plain.runs.length).toBe(15); // NIST §5.3.3.6.2: 12 edge runs + 3 centre points
    expect(crossed.runs.length).toBe(15 * 2 * 3); // derived by hand: 15 runs × 2 GDLs × 3 lots = 90
    expect(crossed.info.levelCombinations).toBe(6); // derived by hand: 2 · 3
    expect(crossed.factorKeys).toEqual(['binderWt', 'gdl', 'cellC', 'loadingMgCm2', 'catalystLot']);
    const perCombination = new Map<string, number>();
    for (const run of crossed.runs) {
      const key = `${run.coded.gdl}|${run.coded.catalystLot}`;
      perCombination.set(key, (perCombination.get(key) ?? 0) + 1);
      expect(run.actual.gdl).toBe(run.coded.gdl);
    }
    expect([...perCombination.values()]).toEqual([15, 15, 15, 15, 15, 15]); // derived by hand: the whole design at each combination
  });

  it('alone give the full level grid', () => {
    const design = generateDesign({ kind: 'full-factorial-2', factors: [gdl, lot], seed: 1, centerPoints: 2 });
    expect(design.runs.length).toBe(6); // derived by hand: 2 · 3 combinations
    expect(design.info.runsByType).toEqual({ level: 6 });
    expect(design.warnings.some((warning) => warning.startsWith('centerPoints was ignored'))).toBe(true);
  });
});

describe('run order, replicates and blocks', () => {
  it('randomises within blocks as a permutation, the same for the same seed', () => {
    const request: DesignRequest = { kind: 'full-factorial-2', factors: [binder, cell, loading, extra1], centerPoints: 4, seed: 31 };
    const design = generateDesign(request);
    const n = 20; // derived by hand: 2^4 + 4
    expect(design.runs.map((run) => run.runOrder)).toEqual(Array.from({ length: n }, (_, index) => index + 1));
    expect(design.runs.map((run) => run.standardOrder).sort((a, b) => a - b)).toEqual(Array.from({ length: n }, (_, index) => index + 1));
    expect(design.runs.map((run) => run.standardOrder)).not.toEqual(Array.from({ length: n }, (_, index) => index + 1));
    expect(generateDesign(request).runs).toEqual(design.runs);
    expect(generateDesign({ ...request, seed: 32 }).runs).not.toEqual(design.runs);
    const fixed = generateDesign({ ...request, randomize: false });
    expect(fixed.runs.map((run) => run.standardOrder)).toEqual(Array.from({ length: n }, (_, index) => index + 1));
    expect(fixed.info.randomized).toBe(false);
  });

  it('picks and reports a seed when none is given', () => {
    const design = generateDesign({ kind: 'full-factorial-2', factors: [binder, cell] });
    expect(Number.isInteger(design.info.seed)).toBe(true);
    expect(generateDesign({ kind: 'full-factorial-2', factors: [binder, cell], seed: design.info.seed }).runs).toEqual(design.runs);
  });

  it('repeats the whole design per replicate, one block per replicate', () => {
    const design = generateDesign({ kind: 'full-factorial-2', factors: [binder, cell], centerPoints: 1, replicates: 3, blocks: 3, seed: 2 });
    expect(design.runs.length).toBe(15); // derived by hand: (4 + 1) · 3
    expect(design.info.blocks).toBe(3);
    expect(design.info.blocking).toMatch(/^by replicate/);
    for (const block of [1, 2, 3]) {
      const inBlock = design.runs.filter((run) => run.block === block);
      expect(inBlock.length).toBe(5); // derived by hand: one replicate of 5 runs per block
      expect(new Set(inBlock.map((run) => `${run.coded.binderWt},${run.coded.cellC}`)).size).toBe(5); // derived by hand: 4 corners + centre, each once
    }
    let previousBlock = 0;
    for (const run of design.runs) {
      expect(run.block).toBeGreaterThanOrEqual(previousBlock); // blocks run in sequence
      previousBlock = run.block;
    }
  });

  it('splits a 2^3 into 2 blocks on ABC, orthogonal to main effects and two-factor interactions', () => {
    const design = generateDesign({ kind: 'full-factorial-2', factors: [binder, cell, loading], blocks: 2, seed: 5 });
    expect(design.info.blockGenerators).toEqual(['ABC']); // NIST/SEMATECH e-Handbook §5.3.3.3.3: 2^3 in 2 blocks confounds ABC
    expect(design.runs.filter((run) => run.block === 1).length).toBe(4); // derived by hand: 8 / 2
    const keys = ['binderWt', 'cellC', 'loadingMgCm2'];
    for (let first = 0; first < 3; first++) {
      let mainSum = 0;
      for (const run of design.runs) mainSum += signOfBlock(run) * (run.coded[keys[first] as string] as number);
      expect(mainSum).toBe(0); // derived by hand: each block is a half fraction I = ±ABC, balanced in every factor
      for (let second = first + 1; second < 3; second++) {
        let interactionSum = 0;
        for (const run of design.runs) interactionSum += signOfBlock(run) * (run.coded[keys[first] as string] as number) * (run.coded[keys[second] as string] as number);
        expect(interactionSum).toBe(0); // derived by hand: AB·ABC = C, balanced within each block
      }
    }
  });

  it('splits a 2^5 into 4 blocks confounding only three-factor or higher interactions', () => {
    const design = generateDesign({ kind: 'full-factorial-2', factors: [binder, cell, loading, extra1, extra2], blocks: 4, centerPoints: 4, seed: 5 });
    // Montgomery, Design and Analysis of Experiments, table of 2^k blocking (from memory): 2^5 in 4 blocks, e.g. ABC, CDE, ABDE
    for (const word of design.info.confoundedWithBlocks ?? []) expect(word.length).toBeGreaterThanOrEqual(3);
    expect(design.info.confoundedWithBlocks?.length).toBe(3); // derived by hand: 2^2 − 1 block contrasts
    for (const block of [1, 2, 3, 4]) expect(design.runs.filter((run) => run.block === block).length).toBe(9); // derived by hand: 32/4 = 8 + 1 centre point each
    expect(design.warnings.some((warning) => warning.startsWith('Blocks are confounded'))).toBe(false);
  });

  it('reaches the best possible lowest confounded order for 8 blocks of a 2^6 and a 2^7', () => {
    const six = [binder, cell, loading, extra1, extra2, { key: 'inkMin', kind: 'continuous', low: 10, high: 30 } as DesignFactor];
    const seven = [...six, { key: 'dryC', kind: 'continuous', low: 60, high: 90 } as DesignFactor];
    // derived by hand: the 7 block contrasts form a 3-dimensional binary code of length k; the Griesmer bound
    // n ≥ d + ⌈d/2⌉ + ⌈d/4⌉ allows d = 3 for n = 6 (3+2+1) and d = 4 for n = 7 (4+2+1), and no more
    // (Montgomery's blocking table, from memory: 2^6 in 8 blocks ABEF, ABCD, ACE — lowest order 3)
    const orders6 = (generateDesign({ kind: 'full-factorial-2', factors: six, blocks: 8, seed: 1 }).info.confoundedWithBlocks ?? []).map((word) => word.length);
    const orders7 = (generateDesign({ kind: 'full-factorial-2', factors: seven, blocks: 8, seed: 1 }).info.confoundedWithBlocks ?? []).map((word) => word.length);
    expect(Math.min(...orders6)).toBe(3);
    expect(Math.min(...orders7)).toBe(4);
    expect(orders7.length).toBe(7); // derived by hand: 2^3 − 1 contrasts
  });

  it('blocks a CCD with the axial runs apart', () => {
    const design = generateDesign({ kind: 'central-composite', factors: [binder, cell, loading], centerPoints: 6, blocks: 3, seed: 5 });
    for (const run of design.runs.filter((item) => item.pointType === 'axial')) expect(run.block).toBe(3);
    for (const run of design.runs.filter((item) => item.pointType === 'factorial')) expect([1, 2]).toContain(run.block);
    expect(design.runs.filter((run) => run.pointType === 'centre' && run.block === 3).length).toBe(2); // derived by hand: 6 centre points round-robin over 3 blocks
  });

  it('warns when blocks must be confounded with a two-factor interaction', () => {
    const design = generateDesign({ kind: 'full-factorial-2', factors: [binder, cell, loading], blocks: 4, seed: 5 });
    // derived by hand: any two effects of a 2^3 and their product include a two-factor interaction
    expect(design.warnings.some((warning) => warning.startsWith('Blocks are confounded with a two-factor interaction'))).toBe(true);
  });
});

describe('designToCsv', () => {
  it('writes a header and one row per run in run order, coded or actual', () => {
    const design = generateDesign({ kind: 'box-behnken', factors: [binder, cell, loading, gdl], centerPoints: 2, seed: 3 });
    const actual = designToCsv(design, { coded: false }).split('\r\n');
    expect(actual[0]).toBe('runOrder,standardOrder,block,pointType,binderWt,cellC,loadingMgCm2,gdl');
    expect(actual.length).toBe(1 + 28 + 1); // derived by hand: header + (12 + 2) · 2 GDLs + the empty string after the final CRLF
    expect(actual[actual.length - 1]).toBe('');
    const first = design.runs[0] as Design['runs'][number];
    expect(actual[1]).toBe(`1,${first.standardOrder},1,${first.pointType},${first.actual.binderWt},${first.actual.cellC},${first.actual.loadingMgCm2},${first.actual.gdl}`);
    const coded = designToCsv(design, { coded: true }).split('\r\n');
    expect(coded[1]).toBe(`1,${first.standardOrder},1,${first.pointType},${first.coded.binderWt},${first.coded.cellC},${first.coded.loadingMgCm2},${first.coded.gdl}`);
  });

  it('quotes text with commas and defuses formula-like text', () => {
    const tricky: DesignFactor = { key: 'gdl, type', kind: 'categorical', levels: ['paper, 0.2 mm', '=cmd|x'] };
    const csv = designToCsv(generateDesign({ kind: 'full-factorial-2', factors: [binder, tricky], seed: 1, randomize: false }), { coded: true });
    const lines = csv.split('\r\n');
    expect(lines[0]).toBe('runOrder,standardOrder,block,pointType,binderWt,"gdl, type"'); // RFC 4180: fields with commas are quoted
    expect(lines[1]).toBe('1,1,1,factorial,-1,"paper, 0.2 mm"');
    expect(lines[3]).toBe(`3,3,1,factorial,-1,"'=cmd|x"`); // OWASP CSV injection guidance: leading apostrophe, quoted
    expect(() => designToCsv(generateDesign({ kind: 'full-factorial-2', factors: [binder], seed: 1 }), {} as { coded: boolean })).toThrow('designToCsv: options.coded: must be true or false');
    expect(() => designToCsv(null as unknown as Design, { coded: true })).toThrow('designToCsv: design:');
  });
});

describe('input errors', () => {
  const expectField = (request: unknown, field: string, message: string): void => {
    let caught: unknown;
    try {
      generateDesign(request as DesignRequest);
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(DesignInputError);
    expect((caught as DesignInputError).field).toBe(field);
    expect((caught as DesignInputError).message).toContain(message);
  };

  it('names the field for every bad request', () => {
    expectField({ kind: 'plackett', factors: [binder] }, 'kind', 'generateDesign: kind: must be one of');
    expectField({ kind: 'full-factorial-2', factors: [] }, 'factors', 'must be a non-empty list');
    expectField({ kind: 'full-factorial-2', factors: [binder, { ...cell, key: 'binderWt' }] }, 'factors[1].key', '"binderWt" is used by another factor');
    expectField({ kind: 'full-factorial-2', factors: [{ ...binder, high: 10 }] }, 'factors[0].high', 'must be greater than low (10), got 10');
    expectField({ kind: 'full-factorial-2', factors: [{ ...binder, low: Number.NaN }] }, 'factors[0].low', 'must be a finite number');
    expectField({ kind: 'full-factorial-2', factors: [{ key: 'gdl', kind: 'categorical', levels: ['only'] }] }, 'factors[0].levels', 'needs at least 2 levels, got 1');
    expectField({ kind: 'full-factorial-2', factors: [{ key: 'gdl', kind: 'categorical', levels: ['a', 'a'] }] }, 'factors[0].levels[1]', '"a" is listed twice');
    expectField({ kind: 'full-factorial-2', factors: [{ key: 'gdl', kind: 'ordinal' }] }, 'factors[0].kind', "must be 'continuous' or 'categorical'");
    expectField({ kind: 'full-factorial-2', factors: [binder], centerPoints: -1 }, 'centerPoints', 'must be a whole number from 0 to 100, got -1');
    expectField({ kind: 'full-factorial-2', factors: [binder], replicates: 0 }, 'replicates', 'must be a whole number from 1 to 100, got 0');
    expectField({ kind: 'full-factorial-2', factors: [binder], seed: 1.5 }, 'seed', 'must be an integer, got 1.5');
    expectField({ kind: 'full-factorial-2', factors: [binder], randomize: 'yes' }, 'randomize', 'must be true or false');
    expectField({ kind: 'box-behnken', factors: [binder, cell] }, 'factors', 'a Box–Behnken design needs 3 to 7 continuous factors, got 2');
    expectField({ kind: 'latin-hypercube', factors: [binder] }, 'runs', 'is required for a Latin hypercube');
    expectField({ kind: 'fractional-factorial', factors: [binder, cell, loading], generators: ['C=AQ'] }, 'generators[0]', 'names factor letter Q');
  });

  it('refuses designs above 4096 runs, counting categorical crossing and replicates', () => {
    const ten: DesignFactor[] = [];
    for (let index = 0; index < 10; index++) ten.push({ key: `f${index}`, kind: 'continuous', low: 0, high: 1 });
    const fiveLots: DesignFactor = { key: 'lot', kind: 'categorical', levels: ['L1', 'L2', 'L3', 'L4', 'L5'] };
    // derived by hand: 2^10 = 1024 runs × 5 lots = 5120 > 4096
    expectField({ kind: 'full-factorial-2', factors: [...ten, fiveLots] }, 'factors', '1024 runs × 5 level combinations × 1 replicates = 5120 runs is more than 4096');
    expectField({ kind: 'full-factorial-2', factors: ten, replicates: 5 }, 'factors', '= 5120 runs is more than 4096'); // derived by hand: 1024 · 5
  });

  it('refuses blockings that do not fit', () => {
    expectField({ kind: 'full-factorial-2', factors: [binder, cell, loading], blocks: 3 }, 'blocks', 'the factorial part can be split into 2, 4 or 8 blocks, not 3');
    expectField({ kind: 'full-factorial-2', factors: [binder, cell], blocks: 4 }, 'blocks', '4 factorial runs cannot be split into 4 blocks of at least 2 runs');
    expectField({ kind: 'box-behnken', factors: [binder, cell, loading], blocks: 2 }, 'blocks', "use blockBy 'replicate' with blocks = replicates");
    expectField({ kind: 'full-factorial-2', factors: [binder, cell], replicates: 2, blocks: 3, blockBy: 'replicate' }, 'blocks', 'one block per replicate (2), got blocks = 3');
    expectField({ kind: 'full-factorial-2', factors: [binder, cell, loading], replicates: 2, blocks: 3 }, 'blocks', '3 blocks cannot be shared equally among 2 replicates');
    expectField({ kind: 'full-factorial-2', factors: [binder], blockBy: 'weekday' }, 'blockBy', "must be 'replicate' or 'interaction'");
    expectField({ kind: 'central-composite', factors: [binder, cell, loading], blocks: 4 }, 'blocks', 'a central composite design takes 2, 3, 5 or 9 blocks per replicate');
  });

  it('warns about options the kind does not use', () => {
    const design = generateDesign({ kind: 'box-behnken', factors: [binder, cell, loading], centerPoints: 3, alpha: 'rotatable', maximin: true, seed: 1 });
    expect(design.warnings).toContain('Ignored for a box-behnken design: alpha, maximin.');
  });
});
