// Metrics under everyday test protocols. Every curve comes from the semi-empirical model
// (tests/fixtures/curves/protocols.ts); every expected value is printed by
// tests/reference/protocol_metrics.py (numpy/scipy, independent of shared/curves) unless another
// source is named beside it. Each metric is either right within the stated tolerance or null with a note.
import { describe, it, expect } from 'vitest';
import { polarizationMetrics, semiEmpiricalVoltage } from '../../../shared/curves/index';
import type { ReferencePoint } from '../../../shared/curves/index';
import { FIXTURE_MODEL } from '../../fixtures/curves/model-parameters';
import {
  PGM_FREE_MODEL,
  POTENTIOSTATIC_VOLTAGES,
  RANDOMISED_ORDER,
  TOLERANCE_SET_POINTS,
  CROSSOVER_ACM2,
  ocvJumpDown,
  upSweep,
  noKineticPoints,
  noOpenCircuit,
  stepTolerance,
  potentiostaticDecay,
  galvanostaticTransient,
  crossoverCurve,
  sparseHfr,
  onlyIrFree,
} from '../../fixtures/curves/protocols';

const REF: ReferencePoint = { refCurrentDensity: 0.2, refVoltage: 0.6, irFree: true, loadingBasis: 'catalyst' };
const LOADING = { loadingMgCm2: 1.0, metalLoadingMgCm2: 0.4 };
const PY = 'tests/reference/protocol_metrics.py';
const relative = (value: number | null, expected: number): number => Math.abs((value as number) - expected) / Math.abs(expected);

describe('item 1: open circuit, a jump to the top current, then steps down', () => {
  const result = polarizationMetrics(ocvJumpDown(), REF, LOADING);
  it('the jump is not a sweep and the OCV belongs to none: one down sweep', () => {
    expect(result.summary.sweeps).toBe(1);
    expect(result.summary.sweepDirections).toBe('down');
    expect(result.summary.openCircuitReadings).toBe(3); // the fixture's three open-circuit rows
  });
  it('reads the real curve', () => {
    expect(result.metrics.vAtRef).toBeCloseTo(0.6247466867093168, 12); // PY item1.vAtRef
    expect(result.metrics.vAtRefIrFree).toBeCloseTo(0.6747466867093168, 12); // PY item1.vAtRefIrFree
    expect(relative(result.metrics.jAtRef, 0.2564480166143032)).toBeLessThan(1e-10); // PY item1.jAtRef@0.6V
    expect(Math.abs((result.metrics.jAtRef as number) - 0.254826040890162)).toBeLessThan(0.002); // PY model root; linear interpolation error < 2 mA/cm²
    expect(relative(result.metrics.jAtRefIrFree, 0.754520638095268)).toBeLessThan(1e-10); // PY item1.jAtRefIrFree@0.6V
    expect(result.metrics.tafelSlope).toBeCloseTo(87.31358011435387, 8); // PY item1.tafel (5 steps)
    expect(result.metrics.ocv).toBeCloseTo(0.95, 14); // the model's E0 at the zero-current rows
    expect(result.metrics.peakPower).toBeCloseTo(0.3223079479274772, 12); // PY item1.peakPower
    expect(result.metrics.massActivity).toBeCloseTo(754.520638095268, 6); // PY jAtRefIrFree / (1 mg/cm² × 1e-3 g/mg)
  });
});

describe('item 2: j at V_ref — never from the OCV point, log j in the kinetic region, "not reached" with the nearest point', () => {
  it('V_ref between OCV and the first loaded step → not reached, nearest measured named', () => {
    const result = polarizationMetrics(upSweep(), { ...REF, refVoltage: 0.9 }, LOADING);
    expect(result.metrics.jAtRef).toBeNull();
    expect(result.metrics.jAtRefIrFree).toBeNull();
    expect(result.metrics.massActivity).toBeNull();
    expect(result.metricNotes.jAtRef).toMatch(/^not reached: V_ref 0.900 V lies above the lowest-current loaded step \(nearest measured: 0.818 V at 5 mA\/cm²\)/); // PY item2.firstStepV 0.8177 V
    expect(result.metricNotes.massActivity).toMatch(/not available: not reached/);
  });
  it('between 20 and 50 mA/cm² the crossing is interpolated in log j', () => {
    const result = polarizationMetrics(upSweep(), { ...REF, refVoltage: 0.75 }, LOADING);
    expect(relative(result.metrics.jAtRefIrFree, 0.030938520354133466)).toBeLessThan(1e-10); // PY item2.jAtRefIrFree@0.75V(log)
    expect(relative(result.metrics.jAtRef, 0.02573642116770696)).toBeLessThan(1e-10); // PY item2.jAtRef@0.75V(log)
    // within 1.5 % of the model's own root (PY modelRootIrFree 0.031027), where linear j would be +10.8 % (PY 0.034284)
    expect(relative(result.metrics.jAtRefIrFree, 0.03102666886878882)).toBeLessThan(0.015);
    expect(result.metrics.massActivity).toBeCloseTo(30.938520354133466, 8); // PY ÷ (1 mg/cm² × 1e-3 g/mg)
  });
  it('metal basis: the same j per g of metal, said in the note', () => {
    const result = polarizationMetrics(upSweep(), { ...REF, refVoltage: 0.75, loadingBasis: 'metal' }, LOADING);
    expect(result.metrics.massActivity).toBeCloseTo(0.030938520354133466 / 0.4e-3, 6); // PY j ÷ (0.4 mg metal/cm² × 1e-3 g/mg)
    expect(result.metricNotes.massActivity).toBe('A/g per g of metal at 0.75 V iR-free');
  });
});

describe('item 3: Tafel slope only in the kinetic window', () => {
  it('no step in 5–50 mA/cm² → null, the window in the note (the old fallback fitted 0.1–1.0 A/cm²: 129.5 mV/dec, PY)', () => {
    const result = polarizationMetrics(noKineticPoints(), REF, LOADING);
    expect(result.metrics.tafelSlope).toBeNull();
    expect(result.metricNotes.tafelSlope).toBe('only 0 loaded steps with an iR-free voltage in the kinetic window 5–50 mA/cm²; at least 3 needed');
  });
  it('a fitted slope carries its window in the note', () => {
    const result = polarizationMetrics(ocvJumpDown(), REF, LOADING);
    expect(result.metricNotes.tafelSlope).toBe('fitted on iR-free V over 5–50 mA/cm² (5 steps)');
  });
});

describe('item 4: OCV only at zero current', () => {
  it('a curve without an open-circuit step → null with a note', () => {
    const result = polarizationMetrics(noOpenCircuit(), REF, LOADING);
    expect(result.metrics.ocv).toBeNull();
    expect(result.metricNotes.ocv).toBe('no reading at zero current (no open-circuit step); the lowest current measured is 5 mA/cm² at 0.818 V');
    expect(result.metrics.vAtRef).toBeCloseTo(semiEmpiricalVoltage(FIXTURE_MODEL, 0.2), 12); // the model at a measured step
  });
  it('a potentiostatic PGM-free curve from 0.95 to 0.30 V → null, not the mean of the low-current readings', () => {
    const result = polarizationMetrics(potentiostaticDecay(), REF, LOADING);
    expect(result.metrics.ocv).toBeNull();
    expect(result.metricNotes.ocv).toMatch(/^no reading at zero current: potentiostatic steps without an open-circuit reading/);
  });
});

describe('item 5: set points 0, 1, 2, 3 mA/cm² … stay apart', () => {
  const result = polarizationMetrics(stepTolerance(), { ...REF, refVoltage: 0.8 }, LOADING);
  it('one step per set point; OCV from the zero-current readings only', () => {
    expect(result.summary.steps).toBe(TOLERANCE_SET_POINTS.length); // the fixture's 14 set points
    expect(result.metrics.ocv).toBeCloseTo(0.95, 14); // E0: the 1 mA/cm² readings are not merged into it
    expect(result.summary.jMin).toBeCloseTo(0.001, 15); // PY item5.firstLoadedStepJ
  });
  it('metrics right', () => {
    expect(result.metrics.tafelSlope).toBeCloseTo(87.31305261734617, 8); // PY item5.tafel (7 steps)
    expect(result.metrics.vAtRef).toBeCloseTo(0.6247467320913596, 12); // PY item5.vAtRef
    expect(relative(result.metrics.jAtRefIrFree, 0.008285503975806425)).toBeLessThan(1e-10); // PY item5.jAtRefIrFree@0.8V
  });
  it('randomised step order: steps sorted by current, the same metrics, said in the method', () => {
    const shuffled = polarizationMetrics(stepTolerance(RANDOMISED_ORDER), { ...REF, refVoltage: 0.8 }, LOADING);
    expect(shuffled.summary.stepOrder).toBe('sorted');
    expect(shuffled.method.vAtRef?.method).toMatch(/steps sorted by current \(the row order does not read as sweeps\)/);
    for (const key of ['vAtRef', 'vAtRefIrFree', 'jAtRefIrFree', 'tafelSlope', 'ocv', 'peakPower'] as const) {
      expect(relative(shuffled.metrics[key], result.metrics[key] as number)).toBeLessThan(1e-12); // same readings, same step means
    }
  });
});

describe('item 6: potentiostatic steps with a decaying current; dwell transients', () => {
  const result = polarizationMetrics(potentiostaticDecay(), REF, LOADING);
  it('grouped by the voltage set point: one sweep, no step excluded, rule said', () => {
    expect(result.summary.control).toBe('voltage');
    expect(result.summary.steps).toBe(POTENTIOSTATIC_VOLTAGES.length); // the fixture's 14 voltages
    expect(result.summary.sweeps).toBe(1);
    expect(result.summary.pastLimitSteps).toBe(0);
    expect(result.summary.stepNotes).toMatch(/14 dwells with a transient: only the last 50 % of each averaged/);
    expect(result.method.vAtRef?.method).toMatch(/potentiostatic steps: readings grouped by voltage set point/);
  });
  it('settled part of each dwell averaged (last half)', () => {
    expect(result.metrics.vAtRef).toBeCloseTo(0.5066100388156821, 12); // PY item6a.vAtRef@0.2
    expect(result.metrics.vAtRefIrFree).toBeCloseTo(0.5766100388156821, 12); // PY item6a.vAtRefIrFree@0.2
    expect(relative(result.metrics.jAtRef, 0.06882720785423525)).toBeLessThan(1e-9); // PY item6a.jAtRef@0.6V
    // against the steady state of the model: the last half still holds ~1.3 % of the decay (PY: truth 0.50489 V, 0.06806 A/cm²)
    expect(Math.abs((result.metrics.vAtRef as number) - semiEmpiricalVoltage(PGM_FREE_MODEL, 0.2))).toBeLessThan(0.003);
    expect(relative(result.metrics.jAtRef, 0.0680584845322574)).toBeLessThan(0.015);
    expect(result.metrics.peakPower).toBeCloseTo(0.1640210652854891, 12); // PY item6a.peakPower
    expect(result.metrics.tafelSlope).toBeNull(); // PY: only 2 steps in 5–50 mA/cm²
    expect(result.metricNotes.tafelSlope).toMatch(/only 2 loaded steps/);
  });
  it('a 15 mV undershoot at the start of each galvanostatic dwell does not move V at j_ref', () => {
    const transient = polarizationMetrics(galvanostaticTransient(), REF, LOADING);
    expect(transient.metrics.vAtRef).toBeCloseTo(0.6245345870184428, 12); // PY item6b.vAtRef (all readings would give 0.62167, −3 mV)
    expect(transient.metrics.ocv).toBeCloseTo(0.95, 14); // flat open-circuit dwell averaged whole
  });
});

describe('item 7: peak power is the highest measured point', () => {
  it('labelled so, and never extrapolated past the last step', () => {
    const result = polarizationMetrics(upSweep(), REF, LOADING);
    expect(result.metrics.peakPower).toBeCloseTo(0.2801497773805152, 12); // PY item7.peakPower: 0.6 A/cm² × V(0.6)
    expect(result.metricNotes.peakPower).toBe('highest measured, at the highest current: the power was still rising, the true peak lies beyond the data');
    expect(result.method.peakPower?.method).toMatch(/^highest measured j·V/);
  });
});

describe('missing HFR readings, iR-free-only files and the H₂ crossover', () => {
  it('HFR present on one reading in three (NaN elsewhere, blank at open circuit): iR-free from the real readings', () => {
    const result = polarizationMetrics(sparseHfr(), REF, LOADING);
    expect(result.metrics.hfr).toBe(FIXTURE_MODEL.resistance); // the fixture's HFR readings
    expect(result.metrics.vAtRefIrFree).toBeCloseTo(semiEmpiricalVoltage(FIXTURE_MODEL, 0.2) + 0.2 * 0.25, 12); // model + j·R, by hand
    expect(result.metricNotes.hfr).toBe('19 HFR readings missing or 0, left out'); // 3 at open circuit + 2 × 8 steps
  });
  it('only an iR-free voltage: measured-V metrics null with the note, iR-free metrics from the file column', () => {
    const result = polarizationMetrics(onlyIrFree(), REF, LOADING);
    for (const key of ['vAtRef', 'jAtRef', 'peakPower'] as const) {
      expect(result.metrics[key]).toBeNull();
      expect(result.metricNotes[key]).toBe('the file gives only an iR-free voltage');
    }
    expect(result.metrics.vAtRefIrFree).toBeCloseTo(semiEmpiricalVoltage(FIXTURE_MODEL, 0.2) + 0.05, 12); // the file's column at a step
    expect(result.metrics.ocv).toBeCloseTo(0.95, 14); // the iR-free column at zero current (= V there)
    expect(result.summary.irFreeSource).toBe('file column');
  });
  it('crossover added to j for the kinetic metrics, shown in the method', () => {
    const withCrossover = polarizationMetrics(crossoverCurve(), { ...REF, refVoltage: 0.75 }, LOADING, { h2CrossoverAcm2: CROSSOVER_ACM2 });
    const without = polarizationMetrics(crossoverCurve(), { ...REF, refVoltage: 0.75 }, LOADING);
    expect(withCrossover.metrics.tafelSlope).toBeCloseTo(85.94624288569592, 8); // PY crossover.tafel(with jx) = the model's b
    expect(without.metrics.tafelSlope).toBeCloseTo(75.49038548914446, 8); // PY crossover.tafel(without jx)
    expect(relative(withCrossover.metrics.jAtRefIrFree, 0.03185130599800454)).toBeLessThan(1e-10); // PY crossover.jAtRefIrFree@0.75V(with jx)
    expect(withCrossover.metrics.massActivity).toBeCloseTo(31.85130599800454, 7); // PY ÷ 1e-3 g/cm²
    expect(withCrossover.method.tafelSlope?.method).toMatch(/\+ H₂ crossover 2 mA\/cm²/);
    expect(withCrossover.method.massActivity?.method).toMatch(/\+ H₂ crossover 2 mA\/cm²/);
    expect(withCrossover.metrics.vAtRef).toBe(without.metrics.vAtRef); // not a kinetic metric
    expect(withCrossover.summary.h2CrossoverMAcm2).toBe(2);
    expect(() => polarizationMetrics(crossoverCurve(), REF, LOADING, { h2CrossoverAcm2: -0.001 })).toThrow(/h2CrossoverAcm2/);
  });
});
