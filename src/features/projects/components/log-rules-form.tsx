// The project's rules for long logs: when an accelerated test counts as failing (onset of rapid
// failure) and how long an open-circuit hold settles. Saving re-measures the project's logs.
import { useState } from 'react';
import type { Project } from '@shared/api-types';
import { Button } from '@/components/ui/button';
import { Input } from '@/components/ui/field';
import { ErrorNote } from '@/components/ui/panel';

type Update = { mutate: (input: { settings: Project['settings'] }, options?: { onSuccess?: (r: { recomputedCurves: number }) => void }) => void; isPending: boolean; error: unknown };

export function LogRulesForm({ project, update, disabled }: { project: Project; update: Update; disabled: boolean }) {
  const onset = project.settings.onsetRule ?? {};
  const hold = project.settings.holdRule ?? {};
  const [ratio, setRatio] = useState(String(onset.minRateRatio ?? 3));
  const [rise, setRise] = useState(String(onset.minRateIncreaseUvPerH ?? 20));
  const [alpha, setAlpha] = useState(String(onset.alpha ?? 0.001));
  const [settle, setSettle] = useState(String(hold.settleMinutes ?? 15));
  const [edge, setEdge] = useState(String(hold.edgeMinutes ?? 10));
  const [message, setMessage] = useState<string | null>(null);
  const valid = Number(ratio) >= 1 && Number(rise) >= 0 && Number(alpha) > 0 && Number(alpha) < 0.5 && Number(settle) >= 0 && Number(edge) > 0;
  const field = (label: string, value: string, set: (v: string) => void, hint: string) => (
    <label className="text-xs text-ink-700">{label}
      <Input type="number" step="any" value={value} disabled={disabled} onChange={(e) => set(e.target.value)} aria-label={label} />
      <span className="mt-0.5 block text-[11px] text-ink-500">{hint}</span>
    </label>
  );
  return (
    <form
      className="space-y-3"
      aria-label="Rules for long logs"
      onSubmit={(e) => {
        e.preventDefault();
        update.mutate(
          { settings: { ...project.settings, onsetRule: { ...onset, minRateRatio: Number(ratio), minRateIncreaseUvPerH: Number(rise), alpha: Number(alpha) }, holdRule: { ...hold, settleMinutes: Number(settle), edgeMinutes: Number(edge) } } },
          { onSuccess: (r) => setMessage(`Saved. ${r.recomputedCurves} curves were measured again by the new rules.`) },
        );
      }}
    >
      <div className="grid gap-3 sm:grid-cols-3">
        {field('Onset: rate after ≥ × stable rate', ratio, setRatio, 'default 3')}
        {field('Onset: rise of at least (µV/h)', rise, setRise, 'default 20 µV/h')}
        {field('Onset: significance level', alpha, setAlpha, 'one-sided, default 0.001')}
        {field('Hold: settling skipped (min)', settle, setSettle, 'default 15 min after the load is removed')}
        {field('Hold: edge averaged for the loss (min)', edge, setEdge, 'default 10 min at each end')}
      </div>
      <ErrorNote error={update.error} />
      {!disabled && <Button type="submit" variant="primary" disabled={!valid || update.isPending}>Save rules</Button>}
      {message && <p role="status" className="text-sm text-moss-700">{message}</p>}
    </form>
  );
}
