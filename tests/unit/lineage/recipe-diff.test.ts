import { describe, it, expect } from 'vitest';
import { describeChanges, diffRecipe } from '../../../shared/lineage';

// Invented factor list in the shape of a PGM-free cathode campaign.
const factors = [
  { key: 'binder', label: 'binder', unit: 'wt %' },
  { key: 'activationTime', label: 'activation', unit: 'h' },
  { key: 'gdl', label: 'GDL', unit: '' },
  { key: 'cellTemp', label: 'cell temperature', unit: '°C' },
];
const parent = { factors: { binder: 20, activationTime: 2, gdl: 'woven carbon', cellTemp: 160 }, loadingMgCm2: 3, catalystLot: 'LOT-A', labName: 'Home lab', testConditions: { temperatureC: 160, cathodeGas: 'air' } };

describe('diffRecipe and describeChanges', () => {
  it('reads two factor changes in the words of a change note', () => {
    const child = { ...parent, factors: { ...parent.factors, binder: 30, activationTime: 4 } };
    const changes = diffRecipe(parent, child, factors);
    expect(changes.map((c) => c.key)).toEqual(['binder', 'activationTime']); // input data: the two factors changed
    expect(describeChanges(changes)).toBe('binder 20 → 30 wt %, activation 2 → 4 h'); // how a researcher writes it in a change note
  });

  it('finds loading, lot, lab and test-condition changes after the factors', () => {
    const child = { ...parent, loadingMgCm2: 2.5, catalystLot: 'LOT-B', labName: 'Partner lab', testConditions: { temperatureC: 160, cathodeGas: 'O2' } };
    expect(describeChanges(diffRecipe(parent, child, factors))).toBe('catalyst loading 3 → 2.5 mg/cm², catalyst lot LOT-A → LOT-B, lab Home lab → Partner lab, cathode gas air → O2'); // input data
  });

  it('says a cell temperature kept as a factor and as a condition once', () => {
    const child = { ...parent, factors: { ...parent.factors, cellTemp: 180 }, testConditions: { temperatureC: 180, cathodeGas: 'air' } };
    expect(describeChanges(diffRecipe(parent, child, factors))).toBe('cell temperature 160 → 180 °C'); // input data
  });

  it('ignores float noise and treats empty and missing alike', () => {
    const child = { ...parent, factors: { ...parent.factors, binder: 0.1 + 0.2 - 0.3 + 20 }, catalystLot: 'LOT-A', testConditions: { temperatureC: 160, cathodeGas: 'air', anodeGas: '' } };
    expect(diffRecipe(parent, child, factors)).toEqual([]); // derived by hand: 20 + 5.6e-17 is 20 within 1e-9
  });

  it('names a factor added later and an emptied value', () => {
    const child = { ...parent, factors: { binder: 20, activationTime: 2, gdl: 'woven carbon', cellTemp: 160, inkSolids: 3 }, loadingMgCm2: null };
    expect(describeChanges(diffRecipe(parent, child, factors))).toBe('inkSolids (none) → 3, catalyst loading 3 mg/cm² → (none)'); // input data
  });

  it('throws on a snapshot without factors', () => {
    expect(() => diffRecipe({} as never, parent, factors)).toThrow(TypeError);
    expect(() => diffRecipe(parent, { factors: null } as never, factors)).toThrow('diffRecipe: child.factors must be a record');
    expect(() => describeChanges('x' as never)).toThrow('describeChanges: changes must be an array');
  });
});
