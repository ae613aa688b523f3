// The design form's values → the design request, checked by the schema the server uses.
import { describe, expect, it } from 'vitest';
import type { FactorDef } from '../../../shared/api-types';
import { designRequestFrom, designResolver, initialDesignValues } from '../../../src/features/plan/components/design-values';

const factors: FactorDef[] = [
  { id: 1, key: 'binder', label: 'PTFE binder', unit: 'wt %', kind: 'continuous', low: 10, high: 40, levels: null, testVariable: false },
  { id: 2, key: 'activationTemp', label: 'Activation temperature', unit: '°C', kind: 'continuous', low: 300, high: 380, levels: null, testVariable: false },
  { id: 3, key: 'gdl', label: 'GDL', unit: '', kind: 'categorical', low: null, high: null, levels: ['woven carbon', 'carbon paper'], testVariable: false },
  { id: 4, key: 'activationTime', label: 'Activation time', unit: 'h', kind: 'continuous', low: 1, high: 4, levels: null, testVariable: false },
  { id: 5, key: 'cellTemp', label: 'Cell temperature', unit: '°C', kind: 'continuous', low: 160, high: 200, levels: null, testVariable: false },
];
const resolve = async (values: ReturnType<typeof initialDesignValues>) => designResolver(factors)(values, undefined, { fields: {}, shouldUseNativeValidation: false });

describe('design form values', () => {
  it('opens on a face-centred central composite over the first three continuous factors', async () => {
    const values = initialDesignValues(factors, 42);
    expect(designRequestFrom(values, factors)).toEqual({ kind: 'central-composite', factors: ['binder', 'activationTemp', 'activationTime'], centerPoints: 3, replicates: 1, blocks: 1, seed: 42, randomize: true, variant: 'face-centred' });
    const result = await resolve(values);
    expect(result.errors).toEqual({});
  });

  it('sends only the options of the chosen kind', () => {
    const values = { ...initialDesignValues(factors, 1), kind: 'latin-hypercube' as const, runs: '20', maximin: false, generators: 'D=ABC' };
    expect(designRequestFrom(values, factors)).toMatchObject({ kind: 'latin-hypercube', runs: 20, maximin: false });
    expect(designRequestFrom(values, factors)).not.toHaveProperty('generators');
    const fractional = { ...initialDesignValues(factors, 1), kind: 'fractional-factorial' as const, generators: 'D=ABC, E=ABD', fraction: '8' };
    expect(designRequestFrom(fractional, factors)).toMatchObject({ generators: ['D=ABC', 'E=ABD'] });
    expect(designRequestFrom(fractional, factors)).not.toHaveProperty('runs');
    const custom = { ...initialDesignValues(factors, 1), variant: 'circumscribed' as const, alpha: 'custom' as const, alphaValue: '1,682' };
    expect(designRequestFrom(custom, factors)).toMatchObject({ variant: 'circumscribed', alpha: 1.682 });
  });

  it('shows the schema’s refusals at their inputs', async () => {
    const values = { ...initialDesignValues(factors, 1), chosen: {}, centerPoints: '2.5', replicates: 'two', seed: '-3', blocks: '' };
    const { errors } = await resolve(values);
    expect(errors).toEqual({
      chosen: { type: 'schema', message: 'choose at least one factor' },
      centerPoints: { type: 'schema', message: 'must be a whole number' },
      replicates: { type: 'schema', message: 'must be a number' },
      seed: { type: 'schema', message: 'must be at least 0' },
    });
    const alpha = await resolve({ ...initialDesignValues(factors, 1), variant: 'inscribed', alpha: 'custom', alphaValue: 'abc' });
    expect(alpha.errors).toEqual({ alphaValue: { type: 'schema', message: 'must be a number above 0, e.g. 1.682' } });
    const lhs = await resolve({ ...initialDesignValues(factors, 1), kind: 'latin-hypercube', runs: '0' });
    expect(lhs.errors).toEqual({ runs: { type: 'schema', message: 'must be at least 1' } });
  });
});
