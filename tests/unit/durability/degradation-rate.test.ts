import { describe, it, expect } from 'vitest';
import { durabilityMetrics, generateSyntheticLog } from '../../../shared/durability';
import { fitLine } from '../../../shared/stats/linear-fit';
import type { CurveData } from '../../../shared/curves/types';

// Invented log: HT-PEM cell at 0.2 A/cm², 600 h, a row every 10 min, 8 µV/h, 1 mV noise, 50 h break-in.
const base = { hours: 600, stepMinutes: 10, v0: 0.65, breakInHours: 50, breakInDropMv: 30, rateUvPerH: 8, noiseMv: 1, currentDensity: 0.2 };
const TRUE_RATE = 8; // µV/h, the generator's input

describe('durabilityMetrics on a plain log', () => {
  const metrics = durabilityMetrics(generateSyntheticLog({ ...base, seed: 31 }));

  it('recovers the rate inside its 95 % interval', () => {
    expect(metrics.degradationRate!).toBeCloseTo(TRUE_RATE, 0); // generator input
    expect(metrics.low!).toBeLessThanOrEqual(TRUE_RATE); // generator input lies inside the interval
    expect(metrics.high!).toBeGreaterThanOrEqual(TRUE_RATE); // generator input lies inside the interval
  });

  it('finds the break-in near its true end and fits from there', () => {
    expect(metrics.breakInSource).toBe('detected');
    expect(Math.abs(metrics.breakInHours - 50)).toBeLessThanOrEqual(15); // generator: 50 h; ±15 h for 24 h windows
    expect(metrics.fitWindow!.fromHours).toBeGreaterThanOrEqual(metrics.breakInHours);
    expect(metrics.fitWindow!.toHours).toBeCloseTo(600, 6); // generator: last row at 600 h
    expect(metrics.hoursRun).toBeCloseTo(600, 6); // generator: 0–600 h
  });

  it('reports the voltage lost and says 10 % loss is not reached, with a marked projection', () => {
    // derived by hand: 8 µV/h × (600 − ~54) h ≈ 4.4 mV
    expect(metrics.voltageLossMv!).toBeGreaterThan(3.5);
    expect(metrics.voltageLossMv!).toBeLessThan(5.5);
    expect(metrics.hoursToLoss).toBeNull();
    // derived by hand: 10 % of ≈0.6496 V = 65 mV at 8 µV/h ≈ 8100 h after break-in
    expect(metrics.projectedHoursToLoss!.projected).toBe(true);
    expect(metrics.projectedHoursToLoss!.hours).toBeGreaterThan(7000);
    expect(metrics.projectedHoursToLoss!.hours).toBeLessThan(9500);
  });

  it('reports rates for requested windows', () => {
    const withWindows = durabilityMetrics(generateSyntheticLog({ ...base, seed: 31 }), {
      windows: [
        { fromHours: 100, toHours: 350 },
        { fromHours: 350, toHours: 600 },
        { fromHours: 700, toHours: 800 },
      ],
    });
    expect(withWindows.windows[0].rate!).toBeCloseTo(TRUE_RATE, -1); // generator input, ±5 µV/h on 250 h
    expect(withWindows.windows[0].n).toBe(1501); // derived by hand: 250 h · 6 rows/h + 1
    expect(withWindows.windows[1].rate!).toBeCloseTo(TRUE_RATE, -1); // generator input, ±5 µV/h on 250 h
    expect(withWindows.windows[1].low!).toBeLessThan(withWindows.windows[1].rate!);
    expect(withWindows.windows[1].high!).toBeGreaterThan(withWindows.windows[1].rate!);
    expect(withWindows.windows[2].rate).toBeNull(); // no data after 600 h
  });
});

describe('durabilityMetrics with interruptions', () => {
  it('detects a restart, does not fit through its step, and reports the segments', () => {
    const log = generateSyntheticLog({ ...base, restartAtHours: 300, restartShiftMv: 15, seed: 32 });
    const metrics = durabilityMetrics(log);
    expect(metrics.interruptions.map((event) => event.kind)).toEqual(['restart']);
    expect(metrics.segments).toHaveLength(2);
    expect(metrics.segments[1].startedBy).toBe('restart');
    expect(metrics.low!).toBeLessThanOrEqual(TRUE_RATE); // generator input inside the interval
    expect(metrics.high!).toBeGreaterThanOrEqual(TRUE_RATE);
    // One straight line through the +15 mV step would call the cell improving (negative rate):
    const from = log.tHours!.findIndex((hour) => hour >= metrics.breakInHours);
    const throughStep = -fitLine(log.tHours!, log.v, { from, to: log.v.length }).slope * 1e6;
    expect(throughStep).toBeLessThan(0); // derived by hand: +15 mV over ~550 h outweighs −8 µV/h
    // The segments' lines are 15 mV apart at the restart (minus 8 µV/h × 1 h pause).
    const step = (metrics.segments[1].startV - metrics.segments[0].endV) * 1000;
    expect(step).toBeCloseTo(15, 0); // generator: +15 mV
    // Each segment fitted on its own agrees with the common slope.
    expect(metrics.segments[0].rate!).toBeCloseTo(TRUE_RATE, -1); // generator input, ±5 µV/h
  });

  it('detects a gap and fits straight across it', () => {
    const metrics = durabilityMetrics(generateSyntheticLog({ ...base, gapAtHours: 400, gapHours: 8, seed: 33 }));
    expect(metrics.interruptions.map((event) => event.kind)).toEqual(['gap']);
    expect(metrics.segments).toHaveLength(1);
    expect(metrics.low!).toBeLessThanOrEqual(TRUE_RATE); // generator input inside the interval
    expect(metrics.high!).toBeGreaterThanOrEqual(TRUE_RATE);
  });

  it('leaves rows at another current out of the fit', () => {
    const metrics = durabilityMetrics(
      generateSyntheticLog({ ...base, currentChange: { atHours: 250, hours: 20, currentDensity: 0.6 }, seed: 34 }),
    );
    expect(metrics.interruptions.map((event) => event.kind)).toEqual(['current-change']);
    expect(metrics.notes.join(' ')).toMatch(/120 rows at another current density/); // derived by hand: 20 h · 6 rows/h
    expect(metrics.segments[1].startedBy).toBe('current-change');
    expect(metrics.low!).toBeLessThanOrEqual(TRUE_RATE); // generator input inside the interval
    expect(metrics.high!).toBeGreaterThanOrEqual(TRUE_RATE);
  });

  it('turns a time reset into a continuing clock', () => {
    const first = generateSyntheticLog({ ...base, hours: 300, seed: 35 });
    const second = generateSyntheticLog({ ...base, hours: 300, breakInDropMv: 0, v0: 0.65 - 300 * 8e-6, seed: 36 });
    const count = first.v.length + second.v.length;
    const joined: CurveData = { kind: 'durability', tHours: new Float64Array(count), v: new Float64Array(count), j: new Float64Array(count) };
    joined.tHours!.set(first.tHours!);
    joined.tHours!.set(second.tHours!, first.v.length);
    joined.v.set(first.v);
    joined.v.set(second.v, first.v.length);
    joined.j.set(first.j);
    joined.j.set(second.j, first.v.length);
    const metrics = durabilityMetrics(joined);
    expect(metrics.interruptions[0].kind).toBe('restart');
    expect(metrics.hoursRun).toBeCloseTo(600 + 10 / 60, 6); // derived by hand: 300 h + one step + 300 h
    expect(metrics.low!).toBeLessThanOrEqual(TRUE_RATE); // generator input inside the interval
    expect(metrics.high!).toBeGreaterThanOrEqual(TRUE_RATE);
  });
});

describe('durabilityMetrics options and other curve kinds', () => {
  it('uses a break-in set by the user', () => {
    const metrics = durabilityMetrics(generateSyntheticLog({ ...base, seed: 37 }), { breakInHours: 100 });
    expect(metrics.breakInHours).toBe(100); // the option
    expect(metrics.breakInSource).toBe('user');
    expect(metrics.breakInRule).toBe('set by the user');
    expect(metrics.fitWindow!.fromHours).toBeCloseTo(100, 9); // first row at or after 100 h
  });

  it('reads hours to a loss inside the data when it is reached', () => {
    // derived by hand: 500 µV/h from 0.65 V, 10 % = 65 mV → 130 h; no break-in
    const metrics = durabilityMetrics(
      generateSyntheticLog({ ...base, hours: 200, breakInHours: 0, breakInDropMv: 0, rateUvPerH: 500, noiseMv: 0.5, seed: 38 }),
      { breakInHours: 0 },
    );
    expect(metrics.hoursToLoss!).toBeCloseTo(130, -1); // derived by hand above, ±5 h
    expect(metrics.projectedHoursToLoss).toBeNull();
  });

  it('treats an open-circuit hold the same way', () => {
    const metrics = durabilityMetrics(
      generateSyntheticLog({ ...base, currentDensity: 0, v0: 0.95, rateUvPerH: 30, breakInDropMv: 0, breakInHours: 0, seed: 39 }),
    );
    expect(metrics.notes[0]).toMatch(/open-circuit hold/);
    expect(metrics.degradationRate!).toBeCloseTo(30, -1); // generator: 30 µV/h OCV loss, ±5 µV/h
    expect(metrics.voltageLossMv!).toBeGreaterThan(0);
  });

  it('leaves out non-finite rows and says so', () => {
    const log = generateSyntheticLog({ ...base, seed: 40 });
    log.v[100] = NaN;
    const metrics = durabilityMetrics(log);
    expect(metrics.notes.join(' ')).toMatch(/1 rows with a missing/);
    expect(metrics.degradationRate).not.toBeNull();
  });

  it('returns a null rate with a reason when there is too little data', () => {
    const tiny: CurveData = { kind: 'durability', tHours: new Float64Array([0, 1]), v: new Float64Array([0.6, 0.6]), j: new Float64Array([0.2, 0.2]) };
    const metrics = durabilityMetrics(tiny);
    expect(metrics.degradationRate).toBeNull();
    expect(metrics.notes.join(' ')).toMatch(/at least 3 needed/);
  });

  it('throws on a polarization curve, a missing time column, mismatched lengths and bad options', () => {
    const v = new Float64Array(3);
    expect(() => durabilityMetrics({ kind: 'polarization', v, j: v, tHours: v })).toThrow(/kind/);
    expect(() => durabilityMetrics({ kind: 'durability', v, j: v })).toThrow(/time column/);
    expect(() => durabilityMetrics({ kind: 'durability', v, j: new Float64Array(2), tHours: v })).toThrow(/same length/);
    expect(() => durabilityMetrics({ kind: 'durability', v, j: v, tHours: v }, { lossFraction: 1.5 })).toThrow(/lossFraction/);
    expect(() => durabilityMetrics({ kind: 'durability', v, j: v, tHours: v }, { breakInHours: -1 })).toThrow(/breakInHours/);
    expect(() => durabilityMetrics({ kind: 'durability', v, j: v, tHours: v }, { windows: [{ fromHours: 5, toHours: 1 }] })).toThrow(/window/);
  });
});

describe('the 95 % interval is honest for autocorrelated noise', () => {
  it('covers the true slope in most seeds, where plain OLS does not', () => {
    // Invented logs with AR(1) noise, φ = 0.96 per 10 min row (correlation time ≈ 4 h), 1 mV.
    // Break-in set by hand so only the interval is under test.
    let covered = 0;
    let naiveCovered = 0;
    const seeds = 30;
    for (let seed = 1; seed <= seeds; seed++) {
      const log = generateSyntheticLog({ ...base, hours: 400, noiseCorrelation: 0.96, seed: 1000 + seed });
      const metrics = durabilityMetrics(log, { breakInHours: 60 });
      if (metrics.low! <= TRUE_RATE && TRUE_RATE <= metrics.high!) covered++;
      const from = log.tHours!.findIndex((hour) => hour >= 60);
      const fit = fitLine(log.tHours!, log.v, { from, to: log.v.length });
      const halfWidth = 1.96 * fit.slopeSE * 1e6; // normal quantile 1.96, from memory
      if (Math.abs(-fit.slope * 1e6 - TRUE_RATE) <= halfWidth) naiveCovered++;
    }
    // Nominal 95 %; "most seeds" = at least 80 % (binomial: 30 draws at 0.95 fall below 24 with p < 0.5 %).
    expect(covered / seeds).toBeGreaterThanOrEqual(0.8);
    // Plain OLS on the raw rows treats 2000 correlated rows as independent and covers far less often.
    expect(naiveCovered / seeds).toBeLessThan(0.6);
  });
});
