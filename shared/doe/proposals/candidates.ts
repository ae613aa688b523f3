// The candidate set the proposal search starts from: vertices, a grid and random points of
// the allowed box (in unit coordinates 0…1 per free continuous factor), crossed with the
// allowed levels of the free categorical factors.

export interface CandidatePlan {
  /** number of free continuous factors */
  dimensions: number;
  /** allowed levels of each free categorical factor */
  levelChoices: string[][];
}

export interface Candidate {
  /** unit coordinates (0…1) of the free continuous factors */
  unit: number[];
  /** chosen level of each free categorical factor */
  levels: string[];
}

const MAX_LEVEL_COMBINATIONS = 24;

function vertices(dimensions: number, random: () => number): number[][] {
  const list: number[][] = [];
  if (dimensions <= 8) {
    for (let mask = 0; mask < 1 << dimensions; mask++) {
      const point: number[] = [];
      for (let d = 0; d < dimensions; d++) point.push((mask >> d) & 1);
      list.push(point);
    }
  } else {
    for (let i = 0; i < 256; i++) {
      const point: number[] = [];
      for (let d = 0; d < dimensions; d++) point.push(random() < 0.5 ? 0 : 1);
      list.push(point);
    }
  }
  return list;
}

function grid(dimensions: number): number[][] {
  if (dimensions === 0 || dimensions > 8) return [];
  const perAxis = Math.max(2, Math.min(11, Math.floor(400 ** (1 / dimensions))));
  if (perAxis === 2) return [];
  const list: number[][] = [];
  const total = perAxis ** dimensions;
  for (let index = 0; index < total; index++) {
    const point: number[] = [];
    let rest = index;
    for (let d = 0; d < dimensions; d++) {
      point.push((rest % perAxis) / (perAxis - 1));
      rest = Math.floor(rest / perAxis);
    }
    list.push(point);
  }
  return list;
}

function levelCombinations(levelChoices: string[][], random: () => number): string[][] {
  let total = 1;
  for (const choices of levelChoices) total *= choices.length;
  if (total <= MAX_LEVEL_COMBINATIONS) {
    let combos: string[][] = [[]];
    for (const choices of levelChoices) {
      const next: string[][] = [];
      for (const combo of combos) for (const level of choices) next.push([...combo, level]);
      combos = next;
    }
    return combos;
  }
  const seen = new Set<string>();
  const combos: string[][] = [];
  for (let attempt = 0; attempt < MAX_LEVEL_COMBINATIONS * 20 && combos.length < MAX_LEVEL_COMBINATIONS; attempt++) {
    const combo = levelChoices.map((choices) => choices[Math.floor(random() * choices.length)]);
    const key = JSON.stringify(combo);
    if (!seen.has(key)) {
      seen.add(key);
      combos.push(combo);
    }
  }
  return combos;
}

/**
 * Candidate points for the proposal search: box vertices (all 2^d up to d = 8), a regular grid
 * of about 400 points, the centre and 150 + 40·d uniform random points, each crossed with up
 * to 24 combinations of categorical levels (all of them when there are no more).
 * Reference: candidate-set approach of exchange algorithms, Atkinson, Donev & Tobias,
 * Optimum Experimental Designs, with SAS (2007), ch. 12.
 * Cost: O((2^d + 400 + 40·d)·L) candidates for L level combinations.
 * @example candidateSet({ dimensions: 2, levelChoices: [['paper', 'cloth']] }, mulberry32(1)).length
 */
export function candidateSet(plan: CandidatePlan, random: () => number): Candidate[] {
  const { dimensions, levelChoices } = plan;
  const continuous: number[][] = [];
  if (dimensions === 0) continuous.push([]);
  else {
    for (const point of vertices(dimensions, random)) continuous.push(point);
    for (const point of grid(dimensions)) continuous.push(point);
    continuous.push(new Array<number>(dimensions).fill(0.5));
    const randomCount = 150 + 40 * dimensions;
    for (let i = 0; i < randomCount; i++) {
      const point: number[] = [];
      for (let d = 0; d < dimensions; d++) point.push(random());
      continuous.push(point);
    }
  }
  const combos = levelCombinations(levelChoices, random);
  const candidates: Candidate[] = [];
  for (const levels of combos) for (const unit of continuous) candidates.push({ unit, levels });
  return candidates;
}
