// What to fit: a response (curve metric or hand-entered), the model and the factors.
import { useState } from 'react';
import type { FactorDef, ResponseDef } from '@shared/api-types';
import { Field, Input, Select } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { METRICS } from '@/lib/format';
import type { SurfaceRequest } from '../api/surface';

export function FitForm({ factors, responses, initial, busy, onFit }: { factors: FactorDef[]; responses: ResponseDef[]; initial: SurfaceRequest; busy: boolean; onFit: (request: SurfaceRequest) => void }) {
  const [response, setResponse] = useState(initial.response);
  const [model, setModel] = useState<string>(typeof initial.model === 'string' ? initial.model : 'terms');
  const [terms, setTerms] = useState(typeof initial.model === 'object' ? initial.model.terms.join(', ') : '');
  const [chosen, setChosen] = useState<Set<string>>(new Set(initial.factors ?? factors.map((f) => f.key)));
  const submit = (event: React.FormEvent) => {
    event.preventDefault();
    const keys = factors.filter((f) => chosen.has(f.key)).map((f) => f.key);
    onFit({
      response,
      model: model === 'terms' ? { terms: terms.split(/[,;\n]+/).map((t) => t.trim()).filter(Boolean) } : (model as 'linear' | 'interactions' | 'quadratic'),
      factors: keys,
    });
  };
  return (
    <form onSubmit={submit} aria-label="Fit request" className="flex flex-col gap-3">
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
      <Field label="Model" hint="fitted in coded units; categorical factors dummy-coded">
        {(p) => (
          <Select {...p} value={model} onChange={(e) => setModel(e.target.value)}>
            <option value="linear">linear (main effects)</option>
            <option value="interactions">main effects + two-factor interactions</option>
            <option value="quadratic">full quadratic</option>
            <option value="terms">my own term list</option>
          </Select>
        )}
      </Field>
      {model === 'terms' && (
        <Field label="Terms" hint="hierarchical, e.g. binder, cellTemp, binder*cellTemp, binder^2">
          {(p) => <Input {...p} value={terms} onChange={(e) => setTerms(e.target.value)} placeholder="binder, cellTemp, binder^2" />}
        </Field>
      )}
      <fieldset className="flex flex-col gap-1">
        <legend className="mb-1 text-xs font-medium text-ink-700">Factors</legend>
        {factors.map((f) => (
          <label key={f.key} className="flex items-center gap-2 text-sm">
            <input type="checkbox" checked={chosen.has(f.key)} onChange={(e) => setChosen((s) => { const n = new Set(s); if (e.target.checked) n.add(f.key); else n.delete(f.key); return n; })} />
            {f.label}{f.unit ? <span className="text-xs text-ink-500">({f.unit})</span> : null}
          </label>
        ))}
      </fieldset>
      <div><Button type="submit" variant="primary" disabled={busy || chosen.size === 0}>{busy ? 'Fitting…' : 'Fit surface'}</Button></div>
    </form>
  );
}
