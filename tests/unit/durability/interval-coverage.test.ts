// Monte Carlo check of the degradation-rate interval under slow drifts: invented 1,000 h logs
// (shared/durability/synthetic-log.ts) with AR(1) noise of time constant τ (φ = e^(−Δt/τ) per
// 10 min row), 2 mV, a true loss of 10 µV/h (the generator's input), break-in set at 0 h so that
// only the interval is under test. Seeded: the same runs every time.
import { describe, it, expect } from 'vitest';
import { durabilityMetrics, generateSyntheticLog } from '../../../shared/durability';

const RUNS = 200;
const TRUE_RATE = 10;

function coverage(tauHours: number): { covered: number; given: number } {
  let covered = 0;
  let given = 0;
  for (let run = 1; run <= RUNS; run++) {
    const log = generateSyntheticLog({
      hours: 1000,
      stepMinutes: 10,
      v0: 0.65,
      breakInHours: 0,
      breakInDropMv: 0,
      rateUvPerH: TRUE_RATE,
      noiseMv: 2,
      noiseCorrelation: Math.exp(-(10 / 60) / tauHours),
      currentDensity: 0.2,
      seed: 90_000 + 1000 * tauHours + run,
    });
    const metrics = durabilityMetrics(log, { breakInHours: 0 });
    if (metrics.degradationRate === null) continue;
    given++;
    if (metrics.low! <= TRUE_RATE && TRUE_RATE <= metrics.high!) covered++;
  }
  return { covered, given };
}

describe('95 % interval of the degradation rate under slow drifts (Monte Carlo, 200 runs each)', () => {
  // The previous interval (lag-1 correlation clipped at 0.95, no bias correction) covered about
  // 97 % at τ = 10 h but about 65 % at τ = 100 h in the same set-up (numpy re-implementation).
  for (const tau of [10, 100]) {
    it(`covers the true rate in ≥ 90 % of runs at a drift time constant of ${tau} h`, () => {
      const { covered, given } = coverage(tau);
      expect(given).toBeGreaterThanOrEqual(0.95 * RUNS); // almost every run gets a rate
      // nominal 95 %; 90 % is 3.2 binomial standard errors below it for 200 runs
      expect(covered / given).toBeGreaterThanOrEqual(0.9);
    });
  }
});
