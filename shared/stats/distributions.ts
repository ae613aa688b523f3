// Quantiles and tail probabilities of the t, F and normal distributions, from jStat
// (a well-known statistics package), wrapped so every caller checks its inputs the same way.
import * as jstatModule from 'jstat';

// jStat is CommonJS: under Node's ESM loader it arrives as a default export, under bundlers as a
// named one. Accept either.
type JStat = typeof jstatModule.jStat;
const loaded = jstatModule as unknown as { jStat?: JStat; default?: { jStat?: JStat } & JStat };
const jStat: JStat = loaded.jStat ?? loaded.default?.jStat ?? (loaded.default as JStat);

function checkDf(name: string, df: number): void {
  if (!Number.isFinite(df) || df <= 0) throw new RangeError(`${name}: degrees of freedom must be a positive number, got ${df}`);
}

/**
 * Quantile of Student's t distribution: the t with P(T ≤ t) = p.
 * Reference: any t table (e.g. NIST/SEMATECH e-Handbook 1.3.6.7.2); t₀.₉₇₅ with 10 df = 2.228.
 * @throws RangeError when p is outside (0, 1) or df ≤ 0.
 * @example tQuantile(0.975, 10) // 2.228…
 */
export function tQuantile(p: number, df: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`tQuantile: p must be in (0, 1), got ${p}`);
  checkDf('tQuantile', df);
  return jStat.studentt.inv(p, df);
}

/**
 * Two-sided p-value of a t statistic: P(|T| ≥ |t|) with df degrees of freedom.
 * @throws RangeError when df ≤ 0.
 * @example tTwoSidedP(2.228, 10) // ≈ 0.05
 */
export function tTwoSidedP(t: number, df: number): number {
  checkDf('tTwoSidedP', df);
  if (!Number.isFinite(t)) return 0;
  return 2 * (1 - jStat.studentt.cdf(Math.abs(t), df));
}

/**
 * Upper-tail probability of an F statistic: P(F ≥ f) with (df1, df2) degrees of freedom.
 * @throws RangeError when a df ≤ 0.
 * @example fUpperP(4.96, 1, 10) // ≈ 0.05
 */
export function fUpperP(f: number, df1: number, df2: number): number {
  checkDf('fUpperP df1', df1);
  checkDf('fUpperP df2', df2);
  if (!Number.isFinite(f)) return 0;
  if (f <= 0) return 1;
  return 1 - jStat.centralF.cdf(f, df1, df2);
}

/**
 * Quantile of the standard normal distribution.
 * @throws RangeError when p is outside (0, 1).
 * @example normalQuantile(0.975) // 1.95996…
 */
export function normalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`normalQuantile: p must be in (0, 1), got ${p}`);
  return jStat.normal.inv(p, 0, 1);
}
