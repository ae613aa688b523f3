// "How far to trust it": the model's error on a build it has not seen, against how much builds
// of the same recipe differ, with a verdict by a yardstick stated on the page; which model was
// fitted and why; and the fit's warnings, in words.
import type { ModelCandidate } from '@shared/doe/model/index';
import { QUALITY_RATIO_GOOD, QUALITY_RATIO_POOR } from '@shared/doe/model/index';
import type { FactorDef } from '@shared/api-types';
import type { SurfaceResult } from '../api/surface';
import { displayOf, showSpread } from './display';

const CANDIDATE_NAMES: Record<string, string> = {
  linear: 'main effects only',
  interactions: 'every two-factor interaction',
  quadratic: 'the full quadratic',
  selected: 'a term-by-term selection',
};

function describeModel(termLabels: string[], factors: FactorDef[]): string {
  const mains = new Set(factors.map((f) => f.label));
  const main = termLabels.filter((t) => mains.has(t));
  const extra = termLabels.filter((t) => !mains.has(t));
  const first = main.length === factors.length ? 'every main effect' : main.length === 0 ? 'no main effect' : main.length === 1 ? `the main effect of ${main[0]}` : `main effects of ${main.join(', ')}`;
  return extra.length ? `${first} + ${extra.join(', ')}` : first;
}

export function QualitySentence({ result }: { result: SurfaceResult }) {
  const d = displayOf(result.response);
  const q = result.quality;
  const ratio = q.ratio == null ? null : q.ratio.toFixed(1);
  const verdicts: Record<typeof q.verdict, { shape: string; tone: string; text: string }> = {
    'as-good-as-repeats': { shape: '●', tone: 'text-moss-700', text: `As good as the builds allow: its error is ${ratio} × the replicate spread.` },
    usable: { shape: '◐', tone: 'text-amber-700', text: `Usable with care: its error is ${ratio} × the replicate spread, so part of what the builds show is not in the model.` },
    'misses-something': { shape: '▲', tone: 'text-rust-700', text: `The model misses something: its error is ${ratio} × the replicate spread. Treat its numbers as rough and look at the builds with the largest left-out errors under Statistics.` },
    'no-better-than-average': { shape: '▲', tone: 'text-rust-700', text: `No better than guessing the average of the builds (their spread is ±${showSpread(q.responseSd, d)}): the factors fitted do not explain this response yet.` },
    'no-replicates': { shape: '◇', tone: 'text-ink-700', text: `No recipe has been built twice, so the build-to-build spread is unknown (the residual spread, which includes any misfit, is ±${showSpread(result.fit.rmse, d)}). Repeat a build to judge the model.` },
    'cannot-tell': { shape: '◇', tone: 'text-ink-700', text: 'One build alone fixes a term of the model, so its error on a left-out build cannot be worked out; add builds or fit fewer terms.' },
  };
  const v = verdicts[q.verdict];
  return (
    <div className="flex flex-col gap-2">
      <p className="text-base text-ink-950" data-testid="quality-sentence">
        {q.looRmse != null ? (
          <>Predicts a new build to <strong className="num">±{showSpread(q.looRmse, d)}</strong> (leave-one-out)</>
        ) : (
          <>Its error on a left-out build cannot be worked out</>
        )}
        {q.replicateSd != null ? (
          <>; builds of the same recipe vary by <strong className="num">±{showSpread(q.replicateSd, d)}</strong> ({q.replicateGroups} recipe{q.replicateGroups === 1 ? '' : 's'} built more than once).</>
        ) : (
          <>; no recipe has been built twice yet.</>
        )}
      </p>
      <p className={`text-sm ${v.tone}`}><span aria-hidden className="mr-1">{v.shape}</span>{v.text}</p>
      <p className="text-xs text-ink-500">
        Our yardstick: each build is predicted from a fit without it, and the root-mean-square of those errors is set against the standard deviation of builds made to one recipe.
        Up to {QUALITY_RATIO_GOOD} × is as good as the builds allow; above {QUALITY_RATIO_POOR} × the model misses something.
      </p>
    </div>
  );
}

function candidateLine(c: ModelCandidate, d: ReturnType<typeof displayOf>): string {
  const name = CANDIDATE_NAMES[c.name] ?? c.name;
  if (c.supported) return `${name}: ±${showSpread(c.looRmse, d)}`;
  return `${name}: ${c.reason}`;
}

export function ModelChoiceNote({ result }: { result: SurfaceResult }) {
  const d = displayOf(result.response);
  const { model } = result;
  const terms = describeModel(model.termLabels, result.factors);
  if (!model.choice) {
    return <p className="text-sm text-ink-700">Fitted as asked: {terms} ({result.fit.coefficients.length} terms with the constant), on {result.fit.n} builds ({result.fit.distinctRuns} distinct recipes).</p>;
  }
  const { choice } = model;
  const others = choice.candidates.filter((c) => c.name !== choice.chosen.name);
  return (
    <div className="flex flex-col gap-1 text-sm text-ink-700">
      <p>
        <span className="font-medium text-ink-900">Model chosen automatically:</span> {terms} ({choice.chosen.columns} terms with the constant).
        Of the models these {choice.runs} builds ({choice.distinctRuns} distinct recipes) can support, it predicts a left-out build best for its size.
      </p>
      {others.length > 0 && <p className="text-ink-500">Compared with {others.map((c) => candidateLine(c, d)).join('; ')}.</p>}
      <p className="text-xs text-ink-500">{choice.rule}</p>
    </div>
  );
}

export function FitNotes({ result }: { result: SurfaceResult }) {
  const labelOf = (key: string) => result.factors.find((f) => f.key === key)?.label ?? key;
  return (
    <div className="flex flex-col gap-2">
      {result.fit.warnings.map((w) => <p key={w} role="note" className="rounded-md border border-amber-700/30 bg-amber-100 px-3 py-1.5 text-sm text-amber-700">▲ {w}</p>)}
      {result.omittedFactors.length > 0 && <p className="text-sm text-ink-500">Not in the fit: {result.omittedFactors.map((o) => `${labelOf(o.key)} (${o.reason})`).join('; ')}.</p>}
      {result.skipped.length > 0 && (
        <details className="text-sm text-ink-500">
          <summary className="cursor-pointer">{result.skipped.length} tested build{result.skipped.length === 1 ? '' : 's'} not in the fit</summary>
          <ul className="mt-1">{result.skipped.map((s) => <li key={s.buildId}>{s.code}: {s.reason}</li>)}</ul>
        </details>
      )}
    </div>
  );
}
