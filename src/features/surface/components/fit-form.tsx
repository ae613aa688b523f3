// What is fitted: the response (a curve metric or a hand-entered one), the model — chosen
// automatically from the builds, or a ladder step, or terms ticked by hand — and the factors.
import { useState } from 'react';
import type { FactorDef, ResponseDef } from '@shared/api-types';
import { Field, Select } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { METRICS } from '@/lib/format';
import type { SurfaceRequest } from '../api/surface';

interface TermChoice {
  name: string;
  label: string;
}

/** The model's own name for a term (the API's term syntax), never shown on screen. */
function termName(factors: FactorDef[], powers: number[]): string {
  return factors.map((f, i) => (powers[i] === 1 ? f.key : powers[i]! > 1 ? `${f.key}^${powers[i]}` : '')).filter(Boolean).join('*');
}

/** Every term a person may tick: main effects, pairs (not two categorical factors), squares of continuous factors. */
function termChoices(factors: FactorDef[]): TermChoice[] {
  const out: TermChoice[] = [];
  const powers = (entries: [number, number][]) => {
    const p = new Array<number>(factors.length).fill(0);
    for (const [i, v] of entries) p[i] = v;
    return p;
  };
  factors.forEach((f, i) => out.push({ name: termName(factors, powers([[i, 1]])), label: f.label }));
  factors.forEach((a, i) => factors.forEach((b, j) => {
    if (j <= i || (a.kind === 'categorical' && b.kind === 'categorical')) return;
    out.push({ name: termName(factors, powers([[i, 1], [j, 1]])), label: `${a.label} × ${b.label}` });
  }));
  factors.forEach((f, i) => {
    if (f.kind === 'continuous') out.push({ name: termName(factors, powers([[i, 2]])), label: `${f.label}²` });
  });
  return out;
}

export function FitForm({ factors, responses, initial, busy, onFit }: { factors: FactorDef[]; responses: ResponseDef[]; initial: SurfaceRequest; busy: boolean; onFit: (request: SurfaceRequest) => void }) {
  const [response, setResponse] = useState(initial.response);
  const [model, setModel] = useState<string>(typeof initial.model === 'string' ? initial.model : 'terms');
  const [chosen, setChosen] = useState<Set<string>>(new Set(initial.factors ?? factors.map((f) => f.key)));
  const [terms, setTerms] = useState<Set<string>>(new Set(typeof initial.model === 'object' ? initial.model.terms : []));
  const picked = factors.filter((f) => chosen.has(f.key));
  const choices = termChoices(picked);
  const submit = (event: React.FormEvent) => {
    event.preventDefault();
    onFit({
      response,
      model: model === 'terms' ? { terms: choices.filter((c) => terms.has(c.name)).map((c) => c.name) } : (model as 'auto' | 'linear' | 'interactions' | 'quadratic'),
      factors: picked.map((f) => f.key),
    });
  };
  const toggle = (set: Set<string>, key: string, on: boolean) => { const n = new Set(set); if (on) n.add(key); else n.delete(key); return n; };
  return (
    <form onSubmit={submit} aria-label="What is fitted" className="flex flex-col gap-3">
      <Field label="Response">
        {(p) => (
          <Select {...p} value={response} onChange={(e) => setResponse(e.target.value)}>
            <optgroup label="From curves">
              {Object.values(METRICS).map((m) => <option key={m.key} value={m.key}>{m.label} ({m.unit})</option>)}
            </optgroup>
            {responses.length > 0 && (
              <optgroup label="Entered by hand">
                {responses.map((r) => <option key={r.key} value={r.key}>{r.label}{r.unit ? ` (${r.unit})` : ''}</option>)}
              </optgroup>
            )}
          </Select>
        )}
      </Field>
      <Field label="Model" hint="“chosen from the builds” is recommended: the simplest model they support that predicts well. Factors are scaled −1…+1 over their ranges; levels are compared with the first level.">
        {(p) => (
          <Select {...p} value={model} onChange={(e) => setModel(e.target.value)}>
            <option value="auto">chosen from the builds</option>
            <option value="linear">main effects only</option>
            <option value="interactions">main effects and every pair of factors</option>
            <option value="quadratic">pairs and curvature of every factor</option>
            <option value="terms">terms I tick</option>
          </Select>
        )}
      </Field>
      <fieldset className="flex flex-col gap-1">
        <legend className="mb-1 text-xs font-medium text-ink-700">Factors</legend>
        {factors.map((f) => (
          <label key={f.key} className="flex items-center gap-2 text-sm">
            <input type="checkbox" checked={chosen.has(f.key)} onChange={(e) => setChosen((s) => toggle(s, f.key, e.target.checked))} />
            {f.label}{f.unit ? <span className="text-xs text-ink-500">({f.unit})</span> : null}
          </label>
        ))}
      </fieldset>
      {model === 'terms' && (
        <fieldset className="flex max-h-64 flex-col gap-1 overflow-y-auto rounded-md border border-line p-2">
          <legend className="px-1 text-xs font-medium text-ink-700">Terms (a term's factors are added when missing)</legend>
          {choices.map((c) => (
            <label key={c.name} className="flex items-center gap-2 text-sm">
              <input type="checkbox" checked={terms.has(c.name)} onChange={(e) => setTerms((s) => toggle(s, c.name, e.target.checked))} />
              {c.label}
            </label>
          ))}
        </fieldset>
      )}
      <div><Button type="submit" variant="primary" disabled={busy || chosen.size === 0 || (model === 'terms' && terms.size === 0)}>{busy ? 'Fitting…' : 'Fit'}</Button></div>
    </form>
  );
}
