import { describe, it, expect } from 'vitest';
import { buildModelTerms, DoeInputError, modelRow } from '../../../shared/doe/model';
import type { Factor } from '../../../shared/doe/model';

const factors: Factor[] = [
  { key: 'binder', kind: 'continuous', low: 10, high: 40, unit: 'wt %' },
  { key: 'temp', kind: 'continuous', low: 160, high: 200, unit: '°C' },
  { key: 'gdl', kind: 'categorical', levels: ['paper', 'cloth', 'felt'] },
];

describe('buildModelTerms', () => {
  it('builds the standard models in order: mains, interactions, squares (never a categorical square)', () => {
    // common practice in the trade: second-order model = mains + two-factor interactions + squares
    expect(buildModelTerms(factors, 'linear').terms.map((t) => t.name)).toEqual(['intercept', 'binder', 'temp', 'gdl']);
    expect(buildModelTerms(factors, 'interactions').terms.map((t) => t.name)).toEqual([
      'intercept', 'binder', 'temp', 'gdl', 'binder*temp', 'binder*gdl', 'temp*gdl',
    ]);
    expect(buildModelTerms(factors, 'quadratic').terms.map((t) => t.name)).toEqual([
      'intercept', 'binder', 'temp', 'gdl', 'binder*temp', 'binder*gdl', 'temp*gdl', 'binder^2', 'temp^2',
    ]);
  });

  it('does not cross two categorical factors in the standard models', () => {
    const two: Factor[] = [...factors, { key: 'lot', kind: 'categorical', levels: ['A', 'B'] }];
    const names = buildModelTerms(two, 'interactions').terms.map((t) => t.name);
    expect(names).not.toContain('gdl*lot');
    expect(names).toContain('temp*lot');
  });

  it('treatment-codes categorical factors against the first level, columns named gdl[level]', () => {
    const { columns } = buildModelTerms(factors, 'interactions');
    // derived by hand: 3 levels → 2 columns per term containing gdl
    expect(columns.map((c) => c.name)).toEqual([
      'intercept', 'binder', 'temp', 'gdl[cloth]', 'gdl[felt]', 'binder*temp',
      'binder*gdl[cloth]', 'binder*gdl[felt]', 'temp*gdl[cloth]', 'temp*gdl[felt]',
    ]);
    // derived by hand: at binder = 0.5, temp = −1 (coded), gdl = felt
    expect(modelRow(columns, [0.5, -1, 'felt'])).toEqual([1, 0.5, -1, 0, 1, -0.5, 0, 0.5, 0, -1]);
    // the baseline level has all indicators 0
    const baseline = modelRow(columns, [0.5, -1, 'paper']);
    expect(baseline[3]).toBe(0);
    expect(baseline[4]).toBe(0);
  });

  it('adds missing parent terms and says so (hierarchy)', () => {
    const result = buildModelTerms(factors, { terms: ['binder*temp', 'temp^2'] });
    expect(result.terms.map((t) => t.name)).toEqual(['intercept', 'binder', 'temp', 'binder*temp', 'temp^2']);
    expect(result.warnings.join(' ')).toMatch(/parent terms.*binder \(for binder × temp\).*temp \(for binder × temp\)/);
    // a three-factor term pulls in all its two-factor parents too
    const three = buildModelTerms(factors, { terms: ['binder*temp*gdl'] });
    expect(three.terms.map((t) => t.name)).toEqual([
      'intercept', 'binder', 'temp', 'gdl', 'binder*temp', 'binder*gdl', 'temp*gdl', 'binder*temp*gdl',
    ]);
    // nothing added → no warning
    expect(buildModelTerms(factors, { terms: ['binder', 'temp', 'binder*temp'] }).warnings).toEqual([]);
  });

  it('reads binder*binder as binder^2 and tolerates spaces', () => {
    const names = buildModelTerms(factors, { terms: [' binder * binder '] }).terms.map((t) => t.name);
    expect(names).toEqual(['intercept', 'binder', 'binder^2']);
  });

  it('throws on unknown factors, squared categoricals and bad model specs', () => {
    expect(() => buildModelTerms(factors, { terms: ['ionomer'] })).toThrow(DoeInputError);
    expect(() => buildModelTerms(factors, { terms: ['ionomer'] })).toThrow(/unknown factor "ionomer"/);
    expect(() => buildModelTerms(factors, { terms: ['gdl^2'] })).toThrow(/categorical factor cannot be squared/);
    expect(() => buildModelTerms(factors, { terms: ['binder^4'] })).toThrow(/powers above 3/);
    expect(() => buildModelTerms(factors, { terms: [''] })).toThrow(/non-empty/);
    expect(() => buildModelTerms(factors, 'cubic' as never)).toThrow(/model must be/);
  });
});
