// Every CSV export goes through the shared writer: text a person typed (change notes, factor
// levels, build codes) that starts like a formula reaches the spreadsheet as inert text.
import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { gainsCsv } from '../../../src/features/gains/components/gains-table';
import { comparedCurvesCsv } from '../../../src/features/curves/components/compare-csv';
import { designToCsv, generateDesign } from '../../../shared/doe/designs';
import type { GainsData } from '../../../shared/api-types';

const HOSTILE = '=HYPERLINK("http://attacker.example","open")';

function cells(csv: string): string[][] {
  return Papa.parse<string[]>(csv.trimEnd()).data;
}

describe('exports are safe to open in a spreadsheet', () => {
  it('gains CSV: a change note and a method note that start with = or the minus sign U+2212 are neutralised', () => {
    const step = { buildId: 1, code: 'B-001', value: 0.61, gain: null, low: null, high: null, withinNoise: null, n: 2, sd: 0.004, method: 'none' as const, note: null, changeNote: null, changeText: null, replicates: ['B-001'], status: 'tested', changeClass: null, testChanges: [] as string[] };
    const data: GainsData = {
      response: { key: 'vAtRef', label: 'V at j_ref', unit: 'V' } as GainsData['response'],
      unit: 'V', confidence: 0.95, chain: 'given', pooledSd: null,
      steps: [step, { ...step, buildId: 2, code: 'B-002', value: 0.63, gain: 0.02, low: 0.01, high: 0.03, withinNoise: false, changeNote: HOSTILE, note: '\u2212cmd|x' }],
      total: { gain: 0.02, low: 0.01, high: 0.03, withinNoise: false, method: 'welch', note: null, value: 0.63 },
      baseline: { buildId: 1, code: 'B-001', value: 0.61 },
      byClass: { recipeOnlyTotal: 0.02, testConditionTotal: 0, mixedTotal: 0 },
    };
    const rows = cells(gainsCsv(data));
    expect(rows[2]![3]).toBe(`'${HOSTILE}`);
    expect(rows[2]![12]).toBe("'\u2212cmd|x");
    // numbers stay numbers (gain in mV, display units of vAtRef)
    expect(rows[2]![8]).toBe('20');
  });

  it('compared-curves CSV: a build name that starts with @ is neutralised; negative values stay numbers', () => {
    const csv = comparedCurvesCsv([{ name: '@SUM(1+1)', points: { j: [0, 0.2], v: [0.98, -0.01], hfr: null, tHours: null, temperatureC: null, downsampled: false, total: 2 } }]);
    const rows = cells(csv);
    expect(rows[0]).toEqual(['build', 'j (A/cm2)', 'V (V)', 'HFR (ohm cm2)']);
    expect(rows[1]![0]).toBe("'@SUM(1+1)");
    expect(rows[2]).toEqual(["'@SUM(1+1)", '0.2', '-0.01', '']);
  });

  it('design CSV: a factor level that starts with the minus sign U+2212 is neutralised', () => {
    const csv = designToCsv(generateDesign({ kind: 'full-factorial-2', factors: [{ key: 'gdl', kind: 'categorical', levels: ['paper', '\u22121+1'] }], seed: 1, randomize: false }), { coded: false });
    expect(cells(csv).map((r) => r[4])).toContain("'\u22121+1");
  });
});
