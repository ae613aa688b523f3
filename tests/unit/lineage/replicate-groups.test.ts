import { describe, it, expect } from 'vitest';
import { groupReplicates } from '../../../shared/lineage';

const b = (id: number, binder: number, extra: Record<string, unknown> = {}) => ({ id, factors: { binder, gdl: 'paper' }, loadingMgCm2: 3, catalystLot: 'L1', labId: 1, status: 'tested', ...extra });

describe('groupReplicates', () => {
  it('groups the same recipe and marked replicates; the first build names the group', () => {
    const { groups, groupOf } = groupReplicates([
      b(1, 20),
      b(2, 20), // same recipe as 1
      b(3, 30),
      b(4, 25, { replicateOf: 3 }), // marked, though typed with another binder value
      b(5, 30 + 1e-13), // same recipe as 3 up to float noise
    ]);
    expect(groups).toEqual([{ id: 1, memberIds: [1, 2] }, { id: 3, memberIds: [3, 4, 5] }]); // input data
    expect(groupOf.get(5)).toBe(3); // input data
  });

  it('keeps another lot, another lab, another loading apart', () => {
    const { groups } = groupReplicates([b(1, 20), b(2, 20, { catalystLot: 'L2' }), b(3, 20, { labId: 2 }), b(4, 20, { loadingMgCm2: 2 })]);
    expect(groups.map((g) => g.memberIds)).toEqual([[1], [2], [3], [4]]); // input data: every recipe differs in one field
  });

  it('never pools planned or discarded builds, even when marked', () => {
    const { groups } = groupReplicates([b(1, 20), b(2, 20, { status: 'planned' }), b(3, 20, { status: 'discarded', replicateOf: 1 }), b(4, 20, { replicateOf: 2 })]);
    expect(groups.map((g) => g.memberIds)).toEqual([[1, 4], [2], [3]]); // input data: 4 joins 1 by recipe, not planned 2
  });

  it('joins chains of marks transitively', () => {
    const { groups } = groupReplicates([b(7, 10), b(8, 11, { replicateOf: 7 }), b(9, 12, { replicateOf: 8 })]);
    expect(groups).toEqual([{ id: 7, memberIds: [7, 8, 9] }]); // input data
  });

  it('throws on repeated or invalid ids', () => {
    expect(() => groupReplicates([b(1, 20), b(1, 30)])).toThrow('groupReplicates: build ids must be unique, got 1 twice');
    expect(() => groupReplicates([b(0, 20)])).toThrow(RangeError);
  });
});
