// The precious-metal figures beside a build: measured metal loading, g/kW at V_ref or at peak
// power, cost per kW with the price's date; missing inputs give nulls with what is needed.
import { describe, expect, it } from 'vitest';
import { buildEconomy } from '../../../shared/economy';

const PRICE = { metal: 'Pt', pricePerGram: 30, currency: 'EUR', date: '2026-11-02', source: 'invented quote' };

describe('buildEconomy', () => {
  it('quotes g/kW at V_ref when the curve reaches it, with the cost and its date', () => {
    // derived by hand: P = 0.6 V × 0.5 A/cm² = 0.3 W/cm²; 0.3 mg/cm² ÷ 0.3 W/cm² = 1 g/kW; × 30 EUR/g = 30 EUR/kW
    const e = buildEconomy({ loadingMgCm2: 1, metalLoadingMgCm2: 0.3, values: { jAtRef: 0.5, peakPower: 0.4 } }, { refVoltage: 0.6, metalPrices: [PRICE] });
    expect(e.gPerKw).toBeCloseTo(1, 12);
    expect(e.powerLabel).toBe('at 0.6 V');
    expect(e.costPerKw).toBeCloseTo(30, 10);
    expect(e.costUnit).toBe('EUR/kW');
    expect(e.priceDate).toBe('2026-11-02');
  });

  it('falls back to peak power, and says what is missing', () => {
    // derived by hand: 0.4 mg/cm² ÷ 0.5 W/cm² = 0.8 g/kW
    const peak = buildEconomy({ loadingMgCm2: 1, metalLoadingMgCm2: 0.4, values: { jAtRef: null, peakPower: 0.5 } }, { refVoltage: 0.6, metalPrices: [PRICE] });
    expect(peak.gPerKw).toBeCloseTo(0.8, 12);
    expect(peak.powerLabel).toMatch(/peak/);
    expect(peak.costPerKw).toBeCloseTo(24, 10); // 0.8 g/kW × 30 EUR/g (derived by hand)
    // no precious metal named (a PGM-free project): no figures, and why
    const pgmFree = buildEconomy({ loadingMgCm2: 3, metalLoadingMgCm2: 0.06, values: { peakPower: 0.5 } }, { refVoltage: 0.6 });
    expect(pgmFree.gPerKw).toBeNull();
    expect(pgmFree.loadingNote).toMatch(/no precious metal named/);
    const noMetal = buildEconomy({ loadingMgCm2: 1, metalLoadingMgCm2: null, values: { peakPower: 0.5 } }, { refVoltage: 0.6, metalPrices: [PRICE] });
    expect(noMetal.gPerKw).toBeNull();
    expect(noMetal.loadingNote).toMatch(/needs the catalyst’s metal content/);
    const twoPrices = buildEconomy({ loadingMgCm2: 1, metalLoadingMgCm2: 0.4, values: { peakPower: 0.5 } }, { refVoltage: 0.6, metalPrices: [PRICE, { ...PRICE, metal: 'Ru', pricePerGram: 15 }] });
    expect(twoPrices.costPerKw).toBeNull();
    expect(twoPrices.costNote).toMatch(/per metal/);
  });

  it('takes the metal loading from the catalyst lot when none was measured; a measured one wins', () => {
    // mass balance (derived by hand): 1.0 mg/cm² of a 40 wt % catalyst holds 0.4 mg/cm² of metal;
    // P = 0.6 V × 0.5 A/cm² = 0.3 W/cm², so 0.4 ÷ 0.3 = 1.333… g/kW
    const fromLot = buildEconomy({ loadingMgCm2: 1, metalLoadingMgCm2: null, lotMetalWtPct: 40, values: { jAtRef: 0.5 } }, { refVoltage: 0.6, metalPrices: [PRICE] });
    expect(fromLot.metalLoadingMgCm2).toBeCloseTo(0.4, 12);
    expect(fromLot.loadingSource).toBe('lot');
    expect(fromLot.gPerKw).toBeCloseTo(4 / 3, 12);
    expect(fromLot.method.loading).toMatch(/40 wt %/);
    const measured = buildEconomy({ loadingMgCm2: 1, metalLoadingMgCm2: 0.3, lotMetalWtPct: 40, values: { jAtRef: 0.5 } }, { refVoltage: 0.6, metalPrices: [PRICE] });
    expect(measured.metalLoadingMgCm2).toBe(0.3);
    expect(measured.loadingSource).toBe('measured');
  });
});
