// Baselines for the ingest figure: the raw parse of the same bytes by plain CSV parsers — uDSV's
// typed columns (schema inferred from the text, every column a number array), papaparse (fast mode,
// strings; and with numbers) and a hand-rolled split loop with Number() — best of 3 each.
import fs from 'node:fs';
import Papa from 'papaparse';
import { inferSchema, initParser } from 'udsv';
import { rssSampler } from './lib';

const file = process.argv[2]!;
// `udsv` as the second argument: only uDSV's typed parse, once (the interleaved ingest runs)
const onlyUdsv = process.argv[3] === 'udsv';
const gc = (globalThis as { gc?: () => void }).gc;

function timeBest(run: () => number, repeats = 3) {
  let best = Infinity;
  let rows = 0;
  let peak = 0;
  for (let r = 0; r < repeats; r++) {
    gc?.();
    const before = process.memoryUsage.rss();
    const sampler = rssSampler();
    const started = performance.now();
    rows = run();
    const ms = performance.now() - started;
    peak = Math.max(peak, sampler.stop() - before);
    best = Math.min(best, ms);
  }
  return { ms: best, rows, peakDeltaBytes: peak };
}

// The read from disk is part of both sides' job, so it is timed here too.
const udsvTyped = () => {
    const text = fs.readFileSync(file, 'utf8');
    const parser = initParser(inferSchema(text));
    const columns = parser.typedCols(text) as unknown as number[][];
    return columns[0]!.length;
};
if (onlyUdsv) {
  console.log(JSON.stringify({ udsvTyped: timeBest(udsvTyped, 1) }));
  process.exit(0);
}
const results = {
  udsvTyped: timeBest(udsvTyped),
  papaparseFast: timeBest(() => {
    const text = fs.readFileSync(file, 'utf8');
    return Papa.parse<string[]>(text, { fastMode: true, skipEmptyLines: true }).data.length - 1;
  }),
  papaparseTyped: timeBest(() => {
    const text = fs.readFileSync(file, 'utf8');
    return Papa.parse<unknown[]>(text, { fastMode: true, dynamicTyping: true, skipEmptyLines: true }).data.length - 1;
  }),
  splitLoop: timeBest(() => {
    const text = fs.readFileSync(file, 'utf8');
    const lines = text.split('\n');
    const columns = lines[0].split(',').length;
    const values = new Float64Array((lines.length - 1) * columns);
    let rows = 0;
    for (let i = 1; i < lines.length; i++) {
      if (lines[i].length === 0) continue;
      const cells = lines[i].split(',');
      for (let c = 0; c < columns; c++) values[rows * columns + c] = Number(cells[c]);
      rows++;
    }
    return rows;
  }),
};
console.log(JSON.stringify(results));
