// The design request form: which design, over which factors, with centre points, replicates,
// blocks and a seed. Options that only apply to one kind of design appear with it.
import { useState } from 'react';
import type { FactorDef } from '@shared/api-types';
import type { DesignKind } from '@shared/doe/designs/types';
import { Field, Input, Select } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import type { DesignBody } from '../api/designs';

export const KIND_LABELS: Record<DesignKind, string> = {
  'full-factorial-2': '2-level full factorial (2^k)',
  'fractional-factorial': 'Fractional factorial 2^(k−p)',
  'full-factorial-3': '3-level full factorial (3^k)',
  'central-composite': 'Central composite',
  'box-behnken': 'Box–Behnken',
  'latin-hypercube': 'Latin hypercube',
};

/** What each central-composite variant does with the ranges, shown with the chosen one. */
export const VARIANT_HELP: Record<'circumscribed' | 'inscribed' | 'face-centred', string> = {
  circumscribed: 'Corners at the ends of each range; the axial builds go α beyond them (outside the ranges set in the project), so check they can be made. Five levels per factor.',
  inscribed: 'The whole design is shrunk so the axial builds sit at the ends of each range and the corners at ±1/α inside them: every build stays in range. Five levels per factor.',
  'face-centred': 'Axial builds at the middle of each face of the box (α = 1): every build stays in range, three levels per factor, at the cost of rotatability.',
};

const numberOr = (text: string, fallback: number | undefined) => (text.trim() === '' || !Number.isFinite(Number(text)) ? fallback : Number(text));

export function DesignForm({ factors, busy, onSubmit }: { factors: FactorDef[]; busy: boolean; onSubmit: (body: DesignBody) => void }) {
  const [kind, setKind] = useState<DesignKind>('central-composite');
  const [chosen, setChosen] = useState<Set<string>>(() => new Set(factors.filter((f) => f.kind === 'continuous').slice(0, 3).map((f) => f.key)));
  const [centerPoints, setCenterPoints] = useState('3');
  const [replicates, setReplicates] = useState('1');
  const [blocks, setBlocks] = useState('1');
  const [seed, setSeed] = useState(() => String(Math.floor(Math.random() * 100000)));
  const [randomize, setRandomize] = useState(true);
  const [generators, setGenerators] = useState('');
  const [fraction, setFraction] = useState('');
  const [variant, setVariant] = useState<'circumscribed' | 'inscribed' | 'face-centred'>('face-centred');
  const [alpha, setAlpha] = useState<'rotatable' | 'orthogonal' | 'custom'>('rotatable');
  const [alphaValue, setAlphaValue] = useState('1.5');
  const [runs, setRuns] = useState('12');
  const [maximin, setMaximin] = useState(true);

  const submit = (event: React.FormEvent) => {
    event.preventDefault();
    const body: DesignBody = {
      kind,
      factors: factors.filter((f) => chosen.has(f.key)).map((f) => f.key),
      centerPoints: numberOr(centerPoints, 0),
      replicates: numberOr(replicates, 1),
      blocks: numberOr(blocks, 1),
      seed: numberOr(seed, undefined),
      randomize,
    };
    if (kind === 'fractional-factorial') {
      const list = generators.split(/[,;\s]+/).map((g) => g.trim()).filter(Boolean);
      if (list.length) body.generators = list;
      else if (fraction.trim()) body.runs = numberOr(fraction, undefined);
    }
    if (kind === 'central-composite') {
      body.variant = variant;
      if (variant !== 'face-centred') body.alpha = alpha === 'custom' ? Number(alphaValue) : alpha;
    }
    if (kind === 'latin-hypercube') {
      body.runs = numberOr(runs, 10);
      body.maximin = maximin;
    }
    onSubmit(body);
  };

  const continuous = factors.filter((f) => f.kind === 'continuous');
  const categorical = factors.filter((f) => f.kind === 'categorical');
  const toggle = (key: string, on: boolean) => setChosen((s) => { const n = new Set(s); if (on) n.add(key); else n.delete(key); return n; });

  return (
    <form onSubmit={submit} className="flex flex-col gap-4" aria-label="Design request">
      <Field label="Design">
        {(p) => (
          <Select {...p} value={kind} onChange={(e) => setKind(e.target.value as DesignKind)}>
            {Object.entries(KIND_LABELS).map(([k, label]) => <option key={k} value={k}>{label}</option>)}
          </Select>
        )}
      </Field>
      <fieldset className="flex flex-col gap-1.5">
        <legend className="mb-1 text-xs font-medium text-ink-700">Factors</legend>
        {continuous.map((f) => (
          <label key={f.key} className="flex items-center gap-2 text-sm">
            <input type="checkbox" checked={chosen.has(f.key)} onChange={(e) => toggle(f.key, e.target.checked)} />
            <span>{f.label}</span>
            <span className="num text-xs text-ink-500">{f.low}–{f.high} {f.unit}</span>
          </label>
        ))}
        {categorical.map((f) => (
          <label key={f.key} className="flex items-center gap-2 text-sm">
            <input type="checkbox" checked={chosen.has(f.key)} onChange={(e) => toggle(f.key, e.target.checked)} />
            <span>{f.label}</span>
            <span className="text-xs text-ink-500">crossed: {(f.levels ?? []).join(' / ')}</span>
          </label>
        ))}
      </fieldset>
      {kind === 'fractional-factorial' && (
        <div className="grid grid-cols-2 gap-3">
          <Field label="Generators" hint="e.g. D=ABC, E=ABD (letters A, B, C… follow the continuous factors in order)">
            {(p) => <Input {...p} value={generators} onChange={(e) => setGenerators(e.target.value)} placeholder="D=ABC" />}
          </Field>
          <Field label="Runs in the fraction" hint="used when no generators are given">
            {(p) => <Input {...p} inputMode="numeric" value={fraction} onChange={(e) => setFraction(e.target.value)} placeholder="8" />}
          </Field>
        </div>
      )}
      {kind === 'central-composite' && (
        <div className="grid grid-cols-1 gap-3">
          <Field label="Variant" hint={VARIANT_HELP[variant]}>
            {(p) => (
              <Select {...p} value={variant} onChange={(e) => setVariant(e.target.value as typeof variant)}>
                <option value="circumscribed">circumscribed</option>
                <option value="inscribed">inscribed</option>
                <option value="face-centred">face-centred (α = 1)</option>
              </Select>
            )}
          </Field>
          {variant !== 'face-centred' && (
            <Field label="Axial distance α">
              {(p) => (
                <div className="flex gap-2">
                  <Select {...p} value={alpha} onChange={(e) => setAlpha(e.target.value as typeof alpha)}>
                    <option value="rotatable">rotatable</option>
                    <option value="orthogonal">orthogonal</option>
                    <option value="custom">set by hand</option>
                  </Select>
                  {alpha === 'custom' && <Input aria-label="α (coded units)" className="w-20" inputMode="decimal" value={alphaValue} onChange={(e) => setAlphaValue(e.target.value)} />}
                </div>
              )}
            </Field>
          )}
        </div>
      )}
      {kind === 'latin-hypercube' && (
        <div className="grid grid-cols-2 gap-3">
          <Field label="Points">{(p) => <Input {...p} inputMode="numeric" value={runs} onChange={(e) => setRuns(e.target.value)} />}</Field>
          <label className="mt-6 flex items-center gap-2 text-sm"><input type="checkbox" checked={maximin} onChange={(e) => setMaximin(e.target.checked)} /> Spread out (maximin)</label>
        </div>
      )}
      <div className="grid grid-cols-3 gap-3">
        <Field label="Centre points">{(p) => <Input {...p} inputMode="numeric" value={centerPoints} onChange={(e) => setCenterPoints(e.target.value)} />}</Field>
        <Field label="Replicates">{(p) => <Input {...p} inputMode="numeric" value={replicates} onChange={(e) => setReplicates(e.target.value)} />}</Field>
        <Field label="Blocks" hint="e.g. one per lab or day">{(p) => <Input {...p} inputMode="numeric" value={blocks} onChange={(e) => setBlocks(e.target.value)} />}</Field>
      </div>
      <div className="grid grid-cols-2 items-end gap-3">
        <Field label="Seed" hint="the same seed gives the same run order">{(p) => <Input {...p} inputMode="numeric" value={seed} onChange={(e) => setSeed(e.target.value)} />}</Field>
        <label className="mb-6 flex items-center gap-2 text-sm"><input type="checkbox" checked={randomize} onChange={(e) => setRandomize(e.target.checked)} /> Randomise run order</label>
      </div>
      <div>
        <Button type="submit" variant="primary" disabled={busy || chosen.size === 0}>{busy ? 'Generating…' : 'Generate design'}</Button>
      </div>
    </form>
  );
}
