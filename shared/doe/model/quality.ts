// How far to trust a fitted surface, in the response's own unit: how well it predicts a build
// it has not seen (leave-one-out), against how much builds of the same recipe differ.
import { compensatedSum } from '../../stats/compensated-sum';
import type { SurfaceFit } from './types';

/**
 * The yardstick Cellwright states on the surface page: the model's leave-one-out error is
 * compared with the replicate spread. Up to 1.5 times the spread, the model predicts about as
 * well as the builds can be repeated; above 2.5 times, it misses something the builds show.
 */
export const QUALITY_RATIO_GOOD = 1.5;
export const QUALITY_RATIO_POOR = 2.5;

export type QualityVerdict =
  | 'as-good-as-repeats'
  | 'usable'
  | 'misses-something'
  | 'no-better-than-average'
  | 'no-replicates'
  | 'cannot-tell';

export interface ModelQuality {
  /** root mean square of the leave-one-out prediction errors, √(PRESS/n); null when a run has leverage 1 */
  looRmse: number | null;
  /** pooled standard deviation of builds made to the same recipe, √(MS pure error); null without replicates */
  replicateSd: number | null;
  replicateDf: number;
  /** number of recipes built more than once */
  replicateGroups: number;
  /** standard deviation of the observed responses: the error of guessing their average */
  responseSd: number;
  /** looRmse / replicateSd */
  ratio: number | null;
  verdict: QualityVerdict;
}

/**
 * The model's quality in the response's unit.
 * Definition: looRmse = √(PRESS/n) with PRESS = Σ(eᵢ/(1 − hᵢᵢ))², the error of predicting each
 * build from a fit without it; replicateSd = √(SS_pure error / df_pure error) pooled over the
 * recipes built more than once; responseSd = the sample SD of the responses. Verdict: no better
 * than guessing the average when looRmse ≥ responseSd; otherwise, with replicates, by the ratio
 * looRmse/replicateSd against QUALITY_RATIO_GOOD and QUALITY_RATIO_POOR; without replicates the
 * repeatability is unknown ('no-replicates'); 'cannot-tell' when PRESS is undefined.
 * Reference: Allen (1974), Technometrics 16, 125–127 (PRESS); Montgomery, Design and Analysis
 * of Experiments, §6.8 and §10.4 (pure error, lack of fit). The 1.5 and 2.5 limits are our own.
 * Cost: O(n) (the fit already holds PRESS and the pure-error sum of squares).
 * @throws never.
 * @example modelQuality(fit).looRmse // 0.0091 (V)
 */
export function modelQuality(fit: SurfaceFit): ModelQuality {
  const n = fit.n;
  const looRmse = fit.press === null ? null : Math.sqrt(fit.press / n);
  const pure = fit.anova.pureError;
  const replicateSd = pure && pure.df > 0 ? Math.sqrt(pure.ss / pure.df) : null;
  const observed = fit.predicted.map((value, i) => value + fit.residuals[i]);
  const mean = compensatedSum(observed) / n;
  const responseSd = n > 1 ? Math.sqrt(compensatedSum(observed.map((v) => (v - mean) * (v - mean))) / (n - 1)) : 0;
  const replicateGroups = fit.replicateGroups ?? 0;
  const ratio = looRmse !== null && replicateSd !== null && replicateSd > 0 ? looRmse / replicateSd : null;
  let verdict: QualityVerdict;
  if (looRmse === null) verdict = 'cannot-tell';
  else if (responseSd > 0 && looRmse >= responseSd) verdict = 'no-better-than-average';
  else if (replicateSd === null || replicateSd === 0 || ratio === null) verdict = 'no-replicates';
  else if (ratio <= QUALITY_RATIO_GOOD) verdict = 'as-good-as-repeats';
  else if (ratio <= QUALITY_RATIO_POOR) verdict = 'usable';
  else verdict = 'misses-something';
  return { looRmse, replicateSd, replicateDf: pure?.df ?? 0, replicateGroups, responseSd, ratio, verdict };
}
