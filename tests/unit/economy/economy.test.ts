import { describe, it, expect } from 'vitest';
import { preciousMetalLoading, specificMetalUse, ratedPower, costPerKw, metalEconomy } from '../../../shared/economy';
import { generatePolarizationCurve } from '../../../shared/curves/semi-empirical';

// Invented MEA: cathode 1.0 mg/cm² of 40 wt % Pt/C; anode 0.5 mg/cm² of a Pt–Ru catalyst (40 wt % Pt, 20 wt % Ru).
const MEA = [
  { electrode: 'cathode', catalystLoadingMgCm2: 1.0, metals: [{ metal: 'Pt', contentWtPct: 40 }] },
  { electrode: 'anode', catalystLoadingMgCm2: 0.5, metals: [{ metal: 'Pt', contentWtPct: 40 }, { metal: 'Ru', contentWtPct: 20 }] },
];
const PRICES = [
  { metal: 'Pt', pricePerGram: 30, currency: 'EUR', date: '2025-01-15', source: 'invented quote' },
  { metal: 'Ru', pricePerGram: 15, currency: 'EUR', date: '2025-01-15', source: 'invented quote' },
];

describe('preciousMetalLoading', () => {
  it('multiplies loading by content per metal and sums per electrode and in total', () => {
    const result = preciousMetalLoading(MEA);
    // hand-worked: cathode 1.0 × 0.40 = 0.40; anode 0.5 × 0.40 = 0.20 Pt + 0.5 × 0.20 = 0.10 Ru
    expect(result.electrodes[0].metalLoadingMgCm2).toBeCloseTo(0.4, 15);
    expect(result.electrodes[1].metalLoadingMgCm2).toBeCloseTo(0.3, 15);
    expect(result.byMetal.Pt).toBeCloseTo(0.6, 15);
    expect(result.byMetal.Ru).toBeCloseTo(0.1, 15);
    expect(result.totalMgCm2).toBeCloseTo(0.7, 15);
  });

  it('takes a metal loading recorded directly, and a PGM-free electrode as zero', () => {
    const result = preciousMetalLoading([
      { electrode: 'cathode', metals: [] },
      { electrode: 'anode', catalystLoadingMgCm2: null, metals: [{ metal: 'Pt', loadingMgCm2: 0.25 }] },
    ]);
    expect(result.electrodes[0].metalLoadingMgCm2).toBe(0);
    expect(result.totalMgCm2).toBe(0.25);
  });

  it('refuses impossible recipes naming the electrode and metal', () => {
    expect(() => preciousMetalLoading([{ electrode: 'cathode', catalystLoadingMgCm2: 1, metals: [{ metal: 'Pt', contentWtPct: 140 }] }])).toThrow(/cathode: Pt: contentWtPct/);
    expect(() => preciousMetalLoading([{ electrode: 'anode', catalystLoadingMgCm2: 1, metals: [{ metal: 'Pt', contentWtPct: 70 }, { metal: 'Ru', contentWtPct: 40 }] }])).toThrow(/110 wt %/);
    expect(() => preciousMetalLoading([{ electrode: 'anode', metals: [{ metal: 'Pt', contentWtPct: 40 }] }])).toThrow(/catalyst loading/);
    expect(() => preciousMetalLoading([{ electrode: 'anode', catalystLoadingMgCm2: 1, metals: [{ metal: 'Pt' }] }])).toThrow(/neither/);
    expect(() => preciousMetalLoading([MEA[0], MEA[0]])).toThrow(/listed twice/);
    expect(() => preciousMetalLoading([{ electrode: 'anode', catalystLoadingMgCm2: -1, metals: [] }])).toThrow(/≥ 0/);
  });
});

describe('specificMetalUse', () => {
  it('gives g/kW = (mg/cm²)/(W/cm²) with no factor', () => {
    // hand-worked: 0.4 mg/cm² for 0.5 W/cm² is 0.8 mg/W; 1 mg/W = 1e-3 g / 1e-3 kW = 1 g/kW
    expect(specificMetalUse(0.4, 0.5)).toBeCloseTo(0.8, 15);
    expect(specificMetalUse(0, 0.5)).toBe(0);
    expect(() => specificMetalUse(0.4, 0)).toThrow(/powerDensityWcm2/);
    expect(() => specificMetalUse(-0.1, 0.5)).toThrow(/metalLoadingMgCm2/);
  });
});

describe('ratedPower', () => {
  // semi-empirical model with only the ohmic term: V = 1.0 − 0.5·j (invented), steps 0–1.4 A/cm²
  const curve = generatePolarizationCurve(
    { e0: 1.0, tafelSlope: 0, exchangeCurrentDensity: 1e-4, resistance: 0.5, massTransportCoefficient: 0, limitingCurrentDensity: 3 },
    { jPoints: [0, 0.2, 0.4, 0.6, 0.8, 1.0, 1.2, 1.4] },
  );

  it('reads P = V·j at a stated voltage', () => {
    const result = ratedPower(curve, { kind: 'voltage', voltage: 0.65 });
    // hand-worked: 0.65 = 1.0 − 0.5·j → j = 0.7 A/cm², P = 0.455 W/cm² (linear interpolation is exact here)
    expect(result.currentDensity!).toBeCloseTo(0.7, 12);
    expect(result.powerDensityWcm2!).toBeCloseTo(0.455, 12);
    expect(result.label).toBe('at 0.65 V');
  });

  it('reads the highest measured power at peak', () => {
    const result = ratedPower(curve, { kind: 'peak' });
    // hand-worked: P = j − 0.5·j² peaks at j = 1.0 A/cm², P = 0.5 W/cm² (a measured step)
    expect(result.powerDensityWcm2!).toBeCloseTo(0.5, 12);
    expect(result.currentDensity!).toBeCloseTo(1.0, 12);
    expect(result.label).toContain('highest measured');
  });

  it('says not reached instead of extrapolating', () => {
    const result = ratedPower(curve, { kind: 'voltage', voltage: 0.2 });
    expect(result.powerDensityWcm2).toBeNull();
    expect(result.note).toContain('not reached');
    expect(() => ratedPower(curve, { kind: 'voltage', voltage: 3 })).toThrow(/between 0 and 2 V/);
  });
});

describe('costPerKw and metalEconomy', () => {
  it('sums g/kW × price over metals and repeats the price date and source', () => {
    const cost = costPerKw({ Pt: 1.2, Ru: 0.2 }, PRICES);
    expect(cost.costPerKw!).toBeCloseTo(39, 12); // hand-worked: 1.2 × 30 + 0.2 × 15
    expect(cost.unit).toBe('EUR/kW');
    expect(cost.notes.join(' ')).toContain('2025-01-15, invented quote');
  });

  it('leaves out an unpriced metal and says so', () => {
    const cost = costPerKw({ Pt: 1.2, Ir: 0.1 }, PRICES);
    expect(cost.costPerKw!).toBeCloseTo(36, 12); // hand-worked: 1.2 × 30
    expect(cost.unpriced).toEqual(['Ir']);
    expect(cost.notes[0]).toContain('no price recorded for Ir');
  });

  it('refuses prices without date, source or in mixed currencies', () => {
    expect(() => costPerKw({ Pt: 1 }, [{ ...PRICES[0], date: '15.01.2025' }])).toThrow(/YYYY-MM-DD/);
    expect(() => costPerKw({ Pt: 1 }, [{ ...PRICES[0], date: '2025-02-30' }])).toThrow(/calendar date/);
    expect(() => costPerKw({ Pt: 1 }, [{ ...PRICES[0], source: ' ' }])).toThrow(/source/);
    expect(() => costPerKw({ Pt: 1 }, [PRICES[0], { ...PRICES[1], currency: 'USD' }])).toThrow(/more than one currency/);
    expect(() => costPerKw({ Pt: 1 }, [PRICES[0], PRICES[0]])).toThrow(/priced twice/);
  });

  it('puts it together for one build', () => {
    const economy = metalEconomy({ electrodes: MEA, powerDensityWcm2: 0.5, powerLabel: 'at peak power (highest measured)', prices: PRICES });
    // hand-worked: 0.7 mg/cm² / 0.5 W/cm² = 1.4 g/kW; Pt 1.2, Ru 0.2; cost 1.2 × 30 + 0.2 × 15 = 39 EUR/kW
    expect(economy.gPerKw!).toBeCloseTo(1.4, 12);
    expect(economy.gPerKwByMetal.Pt).toBeCloseTo(1.2, 12);
    expect(economy.cost!.costPerKw!).toBeCloseTo(39, 12);
  });

  it('gives no g/kW for a PGM-free MEA, or without a power', () => {
    expect(metalEconomy({ electrodes: [{ electrode: 'cathode', metals: [] }], powerDensityWcm2: 0.3, powerLabel: 'at 0.6 V' }).notes[0]).toContain('PGM-free');
    const none = metalEconomy({ electrodes: MEA, powerDensityWcm2: null, powerLabel: 'at 0.6 V' });
    expect(none.gPerKw).toBeNull();
    expect(none.notes[0]).toBe('no power density at 0.6 V: no g/kW');
  });
});
