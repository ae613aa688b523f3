import { describe, it, expect } from 'vitest';
import { demoTemperatureSeries, demoPressureSeries } from '../../../shared/demo';
import { analyseSeries } from '../../../shared/series';

// The demo generators build curves from the project's semi-empirical model with a stated Eₐ or
// order at 0.85 V iR-free; the series analysis must return it.
const members = (series: ReturnType<typeof demoTemperatureSeries>, pick: 'temperatureC' | 'backPressureKPa') =>
  series.map((member, index) => ({ buildId: 100 + index, value: member[pick], curve: member.curve }));

describe('demo series through the series analysis', () => {
  it('returns the stated Eₐ from noise-free curves at 160/180/200 °C', () => {
    const series = demoTemperatureSeries({ activationEnergyKJmol: 60, noiseV: 0 });
    expect(series.map((member) => member.temperatureC)).toEqual([160, 180, 200]);
    const analysis = analyseSeries({ kind: 'arrhenius', voltage: 0.85, members: members(series, 'temperatureC') });
    // generator input 60 kJ/mol; tolerance 0.05 kJ/mol for reading j between steps (log-j interpolation
    // over the model's small mass-transport curvature)
    expect(Math.abs(analysis.result!.estimate - 60)).toBeLessThan(0.05);
    expect(analysis.basis).toBe('iR-free');
    expect(analysis.leftOut).toEqual([]);
  });

  it('holds the stated Eₐ inside its interval with 1 mV noise', () => {
    const series = demoTemperatureSeries({ activationEnergyKJmol: 60, noiseV: 0.001, seed: 5 });
    const result = analyseSeries({ kind: 'arrhenius', voltage: 0.85, members: members(series, 'temperatureC') }).result!;
    expect(result.low!).toBeLessThanOrEqual(60); // generator input inside the 95 % interval
    expect(result.high!).toBeGreaterThanOrEqual(60);
    expect(Math.abs(result.estimate - 60)).toBeLessThan(3); // 1 mV on a 90 mV/dec line ≈ 2.6 % in j
  });

  it('returns the stated order from a noise-free pressure series', () => {
    const series = demoPressureSeries({ order: 0.5, noiseV: 0 });
    const result = analyseSeries({ kind: 'order', voltage: 0.85, members: members(series, 'backPressureKPa') }).result!;
    expect(Math.abs(result.estimate - 0.5)).toBeLessThan(0.002); // generator input, same interpolation tolerance
    expect(result.noDependenceWithinNoise).toBe(false);
  });

  it('reads a zero-order series as no dependence within noise', () => {
    const series = demoPressureSeries({ order: 0, noiseV: 0.001, seed: 9 });
    const result = analyseSeries({ kind: 'order', voltage: 0.85, members: members(series, 'backPressureKPa') }).result!;
    expect(result.noDependenceWithinNoise).toBe(true);
  });

  it('leaves out a member whose curve does not reach the voltage and names it', () => {
    const series = demoTemperatureSeries({ noiseV: 0 });
    const list = members(series, 'temperatureC');
    const analysis = analyseSeries({ kind: 'arrhenius', voltage: 0.85, members: [...list, { buildId: 999, value: 190, curve: { j: [0, 0.5, 0.6, 0.7], v: [0.95, 0.6, 0.55, 0.5], hfr: [0.1, 0.1, 0.1, 0.1] } }] });
    expect(analysis.leftOut.map((entry) => entry.buildId)).toEqual([999]);
    expect(analysis.leftOut[0].reason).toContain('not reached');
    expect(analysis.result!.fit.n).toBe(3);
  });
});
