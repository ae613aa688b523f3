// The fit form's values (the response, the model choice, ticked factors and terms) and the one
// mapping from them to a surface request, checked by the request schema the server validates
// with. Kept apart from the component so the mapping can be tested alone.
import type { Resolver } from 'react-hook-form';
import type { FactorDef } from '@shared/api-types';
import { surfaceRequestSchema, type SurfaceRequest } from '@shared/schemas/doe';
import { schemaResolver } from '@/lib/schema-form';

export type ModelChoice = 'auto' | 'linear' | 'interactions' | 'quadratic' | 'terms';

export interface FitFormValues {
  response: string;
  model: ModelChoice;
  /** factor key → ticked */
  chosen: Record<string, boolean>;
  /** term name → ticked (only with model "terms") */
  terms: Record<string, boolean>;
}

export interface TermChoice {
  name: string;
  label: string;
}

/** The model's own name for a term (the API's term syntax), never shown on screen. */
function termName(factors: FactorDef[], powers: number[]): string {
  return factors.map((f, i) => (powers[i] === 1 ? f.key : powers[i]! > 1 ? `${f.key}^${powers[i]}` : '')).filter(Boolean).join('*');
}

/** Every term a person may tick: main effects, pairs (not two categorical factors), squares of continuous factors. */
export function termChoices(factors: FactorDef[]): TermChoice[] {
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

/** The form as it opens for a request (every factor ticked when the request names none). */
export function initialFitValues(initial: SurfaceRequest, factors: FactorDef[]): FitFormValues {
  const chosen = new Set(initial.factors ?? factors.map((f) => f.key));
  const terms = new Set(typeof initial.model === 'object' ? initial.model.terms : []);
  return {
    response: initial.response,
    model: typeof initial.model === 'string' ? initial.model : 'terms',
    chosen: Object.fromEntries(factors.map((f) => [f.key, chosen.has(f.key)])),
    terms: Object.fromEntries([...terms].map((t) => [t, true])),
  };
}

/** The ticked factors, in the project's order. */
export const pickedFactors = (values: Pick<FitFormValues, 'chosen'>, factors: FactorDef[]) => factors.filter((f) => values.chosen?.[f.key]);

/** The request the values stand for; ticked terms count only while their factors are ticked. */
export function surfaceRequestFrom(values: FitFormValues, factors: FactorDef[]): SurfaceRequest {
  const picked = pickedFactors(values, factors);
  const model = values.model === 'terms' ? { terms: termChoices(picked).filter((c) => values.terms?.[c.name]).map((c) => c.name) } : values.model;
  return { response: values.response, model, factors: picked.map((f) => f.key) };
}

/** Which input a request path belongs to. */
function fieldOf(path: PropertyKey[]): string {
  const head = String(path[0] ?? '');
  if (head === 'model') return 'terms';
  if (head === 'factors') return 'chosen';
  return head === 'response' ? 'response' : 'root';
}

export function fitResolver(factors: FactorDef[]): Resolver<FitFormValues> {
  return schemaResolver<FitFormValues, SurfaceRequest>({ schema: surfaceRequestSchema, toBody: (v) => surfaceRequestFrom(v, factors), fieldOf });
}
