import { describe, it, expect } from 'vitest';
import { bestPath, buildLineageTree, groupReplicates } from '../../../shared/lineage';

// Invented campaign: baseline 1 (replicated by 2), 3 from 1, 4 and 5 from 3 (5 replicated by 6,
// whose parent is also 3), 7 planned from 5, 8 discarded from 5, 9 a lone build. Values in V.
const builds = [
  { id: 1, code: 'B-001', parentId: null, status: 'reviewed', changeNote: 'baseline', value: 0.5, binder: 20 },
  { id: 2, code: 'B-002', parentId: null, status: 'tested', changeNote: 'replicate', value: 0.52, binder: 20 },
  { id: 3, code: 'B-003', parentId: 1, status: 'tested', changeNote: 'binder up', value: 0.55, binder: 30 },
  { id: 4, code: 'B-004', parentId: 3, status: 'tested', changeNote: 'GDL', value: 0.54, binder: 31 },
  { id: 5, code: 'B-005', parentId: 3, status: 'tested', changeNote: 'hotter', value: 0.58, binder: 32 },
  { id: 6, code: 'B-006', parentId: 3, status: 'tested', changeNote: 'hotter, again', value: 0.6, binder: 32 },
  { id: 7, code: 'B-007', parentId: 5, status: 'planned', changeNote: 'next', value: null, binder: 33 },
  { id: 8, code: 'B-008', parentId: 5, status: 'discarded', changeNote: 'oops', value: null, binder: 34 },
  { id: 9, code: 'B-009', parentId: null, status: 'tested', changeNote: 'lone check', value: 0.7, binder: 40 },
];
const grouping = groupReplicates(builds.map((x) => ({ id: x.id, factors: { binder: x.binder }, status: x.status })));
const tree = buildLineageTree(builds, grouping);

describe('buildLineageTree', () => {
  it('hangs replicate groups under their parents in depth-first order', () => {
    expect(tree.roots).toEqual([1, 9]); // input data
    expect(tree.nodes.map((n) => `${n.depth}:${n.code}`)).toEqual(['0:B-001', '1:B-003', '2:B-004', '2:B-005', '3:B-007', '3:B-008', '0:B-009']); // input data
    const five = tree.nodes.find((n) => n.groupId === 5)!;
    expect(five.members.map((m) => m.code)).toEqual(['B-005', 'B-006']); // same recipe
    expect(five.summary!.mean).toBeCloseTo(0.59, 12); // derived by hand: (0.58 + 0.60)/2
    expect(five.summary!.sd).toBeCloseTo(0.0141421356, 9); // derived by hand: |0.60 − 0.58|/√2
    expect(five.summary!.n).toBe(2); // input data
  });

  it('gives unmeasured nodes no summary', () => {
    expect(tree.nodes.find((n) => n.groupId === 7)!.summary).toBeNull(); // planned, no value
  });

  it('cuts a loop of group parents instead of hanging forever', () => {
    // 11 → 12 by parent, and 12's recipe equals 10's, whose parent is 11: a loop once grouped.
    const loopBuilds = [
      { id: 10, code: 'L-010', parentId: 11, status: 'tested', changeNote: null, value: 1 },
      { id: 11, code: 'L-011', parentId: 12, status: 'tested', changeNote: null, value: 2 },
      { id: 12, code: 'L-012', parentId: null, status: 'tested', changeNote: null, value: 3 },
    ];
    const g = groupReplicates([
      { id: 10, factors: { x: 1 }, status: 'tested' },
      { id: 11, factors: { x: 2 }, status: 'tested' },
      { id: 12, factors: { x: 1 }, status: 'tested' },
    ]);
    const looped = buildLineageTree(loopBuilds, g);
    expect(looped.cutLoops).toEqual([10]); // derived by hand: group 10 {10, 12} → 11 → 10
    expect(looped.nodes.map((n) => n.code)).toEqual(['L-010', 'L-011']); // input data
  });

  it('throws when a build is not in the grouping or a value is not finite', () => {
    expect(() => buildLineageTree([{ id: 99, code: 'X', parentId: null, status: 'tested', changeNote: null, value: 1 }], grouping)).toThrow('buildLineageTree: build X (id 99) is not in the replicate grouping');
    expect(() => buildLineageTree([{ ...builds[0], value: Number.NaN }], grouping)).toThrow(RangeError);
  });
});

describe('bestPath', () => {
  it('walks from the baseline to the best descendant, not to a better lone build', () => {
    // B-009 (0.70 V) has no parent: it tells no story, so the best descendant B-005 group wins.
    expect(bestPath(tree, 'maximize')).toEqual({ bestGroupId: 5, path: [1, 3, 5] }); // derived by hand: 0.59 is the top descendant mean
  });

  it('follows the goal: lowest, or closest to a target', () => {
    expect(bestPath(tree, 'minimize')!.path).toEqual([1, 3, 4]); // derived by hand: 0.54 is the lowest descendant
    expect(bestPath(tree, { target: 0.551 })!.path).toEqual([1, 3]); // derived by hand: |0.55 − 0.551| is the smallest
  });

  it('falls back to a root when nothing descends, and to null when nothing is measured', () => {
    const flat = buildLineageTree([builds[8]], groupReplicates([{ id: 9, factors: {}, status: 'tested' }]));
    expect(bestPath(flat, 'maximize')).toEqual({ bestGroupId: 9, path: [9] }); // input data
    const none = buildLineageTree([builds[6]], groupReplicates([{ id: 7, factors: {}, status: 'planned' }]));
    expect(bestPath(none, 'maximize')).toBeNull(); // input data: only a planned build
  });

  it('throws on a target that is not a number', () => {
    expect(() => bestPath(tree, { target: Number.NaN })).toThrow('bestPath: target must be a finite number, got NaN');
  });
});
