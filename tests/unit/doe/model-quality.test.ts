import { describe, expect, it } from 'vitest';
import { fitSurface, modelQuality, QUALITY_RATIO_GOOD, QUALITY_RATIO_POOR, type Factor, type Observation } from '../../../shared/doe/model';
import { pontiusRows } from '../../fixtures/nist/pontius';

// The hand-worked 2² factorial with three centre points (binder 10–40 wt %, cell 160–200 °C)
const factors: Factor[] = [
  { key: 'binder', label: 'PTFE binder', unit: 'wt %', kind: 'continuous', low: 10, high: 40 },
  { key: 'cellTemp', label: 'Cell temperature', unit: '°C', kind: 'continuous', low: 160, high: 200 },
];
const runs: [number, number, number][] = [[10, 160, 10], [40, 160, 14], [10, 200, 12], [40, 200, 18], [25, 180, 13], [25, 180, 13.5], [25, 180, 12.5]];
const rows: Observation[] = runs.map(([binder, cellTemp, y], i) => ({ factors: { binder, cellTemp }, y, label: `B-${i + 1}` }));

describe('modelQuality: leave-one-out error against the replicate spread', () => {
  it('matches leave-one-out refits computed independently in numpy (2² + centre points)', () => {
    const fit = fitSurface({ factors, rows, model: 'interactions' });
    const q = modelQuality(fit);
    // numpy, explicit refits without each run: tests/reference/leave_one_out.py
    expect(q.looRmse).toBeCloseTo(1.55902391115581, 12);
    expect(fit.press).toBeCloseTo(17.0138888888888, 10);
    // derived by hand: centre runs 13, 13.5, 12.5 → SD 0.5 on 2 df, one replicated recipe
    expect(q.replicateSd).toBeCloseTo(0.5, 12);
    expect(q.replicateDf).toBe(2);
    expect(q.replicateGroups).toBe(1);
    // ratio 3.12 > 2.5: the model misses the curvature the centre points show
    expect(q.ratio).toBeCloseTo(1.55902391115581 / 0.5, 10);
    expect(q.verdict).toBe('misses-something');
  });

  it('matches numpy on NIST Pontius (quadratic, 20 replicate pairs)', () => {
    const fit = fitSurface({ factors: [{ key: 'load', kind: 'continuous', low: 150000, high: 3000000 }], rows: pontiusRows.map((r) => ({ factors: { load: r.x }, y: r.y })), model: 'quadratic' });
    const q = modelQuality(fit);
    // numpy, explicit refits: tests/reference/leave_one_out.py
    expect(Math.abs(q.looRmse! / 0.0002148975383779 - 1)).toBeLessThan(1e-9);
    expect(q.replicateGroups).toBe(20);
    expect(q.verdict).toBe('as-good-as-repeats');
  });

  it('says when there are no replicates, and when the model is no better than the average', () => {
    const noRepeats = fitSurface({ factors, rows: rows.slice(0, 5).concat([{ factors: { binder: 20, cellTemp: 170 }, y: 11.6 }]), model: 'linear' });
    expect(modelQuality(noRepeats).replicateSd).toBeNull();
    expect(modelQuality(noRepeats).verdict).toBe('no-replicates');
    // a pure interaction pattern (+1 −1 −1 +1 at the corners, 0 at the centre, 0.2 off-centre)
    // seen through a linear model: nothing to explain, leave-one-out error ≥ the SD of the runs
    const pattern: [number, number, number][] = [[10, 160, 1], [40, 160, -1], [10, 200, -1], [40, 200, 1], [25, 180, 0], [20, 175, 0.2]];
    const flat = fitSurface({ factors, rows: pattern.map(([binder, cellTemp, y]) => ({ factors: { binder, cellTemp }, y })), model: 'linear' });
    expect(modelQuality(flat).verdict).toBe('no-better-than-average');
    expect(QUALITY_RATIO_GOOD).toBeLessThan(QUALITY_RATIO_POOR);
  });
});
