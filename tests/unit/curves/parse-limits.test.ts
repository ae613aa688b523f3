// Bounds of the delimited parser that keep a hostile file cheap: line length and cells per row
// are checked where lines are split, before any cell is read, with the line named.
import { describe, expect, it } from 'vitest';
import { createDelimitedParser, parseDelimitedText } from '../../../shared/curves';
import { MAX_CELLS_PER_ROW, MAX_LINE_CHARS } from '../../../shared/curves/parse-delimited';
import { CurveFileError } from '../../../shared/curves/types';

function caught(action: () => unknown): CurveFileError {
  try {
    action();
  } catch (error) {
    if (error instanceof CurveFileError) return error;
    throw error;
  }
  throw new Error('expected a CurveFileError');
}

describe('line bounds of the delimited parser', () => {
  it('refuses a line longer than the limit, naming the line, as soon as the limit is passed while streaming', () => {
    const parser = createDelimitedParser();
    parser.push('j (A/cm2),V (V)\n0.2,0.65\n');
    const chunk = '1'.repeat(64 * 1024);
    let error: CurveFileError | null = null;
    let pushed = 0;
    try {
      // 45 MB in 64 kB chunks without a line break: refused long before the end
      for (; pushed < 720; pushed++) parser.push(chunk);
    } catch (e) {
      error = e as CurveFileError;
    }
    expect(error).toBeInstanceOf(CurveFileError);
    expect(error!.code).toBe('line-too-long');
    expect(error!.line).toBe(3);
    expect(error!.message).toMatch(/^line 3: longer than 262,144 characters/);
    expect(pushed).toBeLessThanOrEqual(Math.ceil(MAX_LINE_CHARS / chunk.length));
  });

  it('refuses a complete long line too (one push)', () => {
    const error = caught(() => parseDelimitedText(`j,V\n${'9'.repeat(MAX_LINE_CHARS + 1)}\n`));
    expect(error.code).toBe('line-too-long');
    expect(error.line).toBe(2);
  });

  it('refuses a row with more cells than the limit, naming the line', () => {
    const wide = Array.from({ length: MAX_CELLS_PER_ROW + 1 }, (_, k) => `c${k}`).join(',');
    const error = caught(() => parseDelimitedText(`# station log\n${wide}\n`));
    expect(error.code).toBe('too-many-cells');
    expect(error.line).toBe(2);
    expect(error.message).toMatch(/^line 2: more than 1,024 cells/);
  });

  it('accepts a row of exactly the limit', () => {
    const header = Array.from({ length: MAX_CELLS_PER_ROW }, (_, k) => `c${k}`).join(',');
    const row = Array.from({ length: MAX_CELLS_PER_ROW }, (_, k) => String(k / 1000)).join(',');
    expect(parseDelimitedText(`${header}\n${row}\n${row}\n`).header.length).toBe(MAX_CELLS_PER_ROW);
  });
});
