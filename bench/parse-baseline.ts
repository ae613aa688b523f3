// Baselines for the ingest figure: the raw parse of the same bytes by plain CSV parsers — uDSV's
// typed-column parse (numbers per column), papaparse (fast mode, strings; and with numbers) and a
// hand-rolled split loop with Number(). `node parse-baseline.ts FILE [repeats]`: the median of the
// repeats for each, with the fastest and slowest beside it.
import fs from 'node:fs';
import Papa from 'papaparse';
import { inferSchema, initParser } from 'udsv';
import { rssSampler } from './lib';

const file = process.argv[2]!;
const gc = (globalThis as { gc?: () => void }).gc;

const repeats = Number(process.argv[3] ?? 3);

function timeBest(run: () => number) {
  const times: number[] = [];
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
    times.push(ms);
  }
  times.sort((a, b) => a - b);
  return { ms: times[times.length >> 1]!, minMs: times[0]!, maxMs: times[times.length - 1]!, times, rows, peakDeltaBytes: peak };
}

// The read from disk is part of both sides' job, so it is timed here too.
const results = {
  udsvTypedCols: timeBest(() => {
    const text = fs.readFileSync(file, 'utf8');
    const schema = inferSchema(text);
    const cols = initParser(schema).typedCols<number[]>(text);
    return cols[0]!.length;
  }),
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
