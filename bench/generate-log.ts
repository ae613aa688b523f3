// Writes the invented 1,000,000-row durability log used by the ingest figure (15 s steps ≈ 4,167 h,
// 8 µV/h after a 150 h break-in, a restart at 2,000 h), streamed to disk in blocks.
import fs from 'node:fs';
import { generateSyntheticLog, DURABILITY_CSV_HEADER } from '../shared/durability';

const [file, rowsText] = process.argv.slice(2);
const rows = Number(rowsText ?? 1_000_000);
const stepMinutes = 0.25;
const log = generateSyntheticLog({
  hours: ((rows - 1) * stepMinutes) / 60, stepMinutes, v0: 0.62, breakInHours: 150, breakInDropMv: -15, rateUvPerH: 8,
  noiseMv: 1, noiseCorrelation: 0.5, restartAtHours: 2000, restartShiftMv: 5, restartPauseHours: 0.1, currentDensity: 0.2, seed: 2024,
});
const out = fs.openSync(file, 'w');
fs.writeSync(out, `${DURABILITY_CSV_HEADER},Temperature (C)\n`);
const t = log.tHours!, j = log.j, v = log.v, temp = log.temperatureC!;
let block: string[] = [];
for (let i = 0; i < v.length; i++) {
  block.push(`${t[i].toFixed(4)},${j[i].toFixed(5)},${v[i].toFixed(6)},${temp[i].toFixed(2)}`);
  if (block.length === 50_000) { fs.writeSync(out, block.join('\n') + '\n'); block = []; }
}
if (block.length) fs.writeSync(out, block.join('\n') + '\n');
fs.closeSync(out);
console.log(JSON.stringify({ file, rows: v.length, bytes: fs.statSync(file).size }));
