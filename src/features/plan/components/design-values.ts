// The design form's values (what the inputs hold, as typed) and the one mapping from them to a
// design request, checked by the request schema the server validates with
// (shared/schemas/doe.ts). Kept apart from the component so the mapping can be tested alone.
import type { Resolver } from 'react-hook-form';
import type { FactorDef } from '@shared/api-types';
import type { DesignKind } from '@shared/doe/designs/types';
import { designRequestSchema, type DesignBody } from '@shared/schemas/doe';
import { schemaResolver } from '@/lib/schema-form';

export type CcdVariantChoice = 'circumscribed' | 'inscribed' | 'face-centred';

export interface DesignFormValues {
  kind: DesignKind;
  /** factor key → chosen */
  chosen: Record<string, boolean>;
  centerPoints: string;
  replicates: string;
  blocks: string;
  seed: string;
  randomize: boolean;
  generators: string;
  /** fractional factorial without generators: runs in the fraction */
  fraction: string;
  variant: CcdVariantChoice;
  alpha: 'rotatable' | 'orthogonal' | 'custom';
  alphaValue: string;
  /** Latin hypercube points */
  runs: string;
  maximin: boolean;
}

/** The form as it opens: a face-centred central composite over the first three continuous factors. */
export function initialDesignValues(factors: FactorDef[], seed: number): DesignFormValues {
  const first = new Set(factors.filter((f) => f.kind === 'continuous').slice(0, 3).map((f) => f.key));
  return {
    kind: 'central-composite',
    chosen: Object.fromEntries(factors.map((f) => [f.key, first.has(f.key)])),
    centerPoints: '3',
    replicates: '1',
    blocks: '1',
    seed: String(seed),
    randomize: true,
    generators: '',
    fraction: '',
    variant: 'face-centred',
    alpha: 'rotatable',
    alphaValue: '1.5',
    runs: '12',
    maximin: true,
  };
}

/** A typed number: blank gives the fallback, anything else must read as a number (NaN is left for the schema to refuse). */
const numberOr = (text: string, fallback: number | undefined) => (text.trim() === '' ? fallback : Number(text.trim().replace(',', '.')));

/** The request the values stand for; options that belong to another kind of design are left out. */
export function designRequestFrom(values: DesignFormValues, factors: FactorDef[]): DesignBody {
  const body: DesignBody = {
    kind: values.kind,
    factors: factors.filter((f) => values.chosen[f.key]).map((f) => f.key),
    centerPoints: numberOr(values.centerPoints, 0),
    replicates: numberOr(values.replicates, 1),
    blocks: numberOr(values.blocks, 1),
    seed: numberOr(values.seed, undefined),
    randomize: values.randomize,
  };
  if (values.kind === 'fractional-factorial') {
    const list = values.generators.split(/[,;\s]+/).map((g) => g.trim()).filter(Boolean);
    if (list.length) body.generators = list;
    else if (values.fraction.trim()) body.runs = numberOr(values.fraction, undefined);
  }
  if (values.kind === 'central-composite') {
    body.variant = values.variant;
    if (values.variant !== 'face-centred') body.alpha = values.alpha === 'custom' ? numberOr(values.alphaValue, Number.NaN) : values.alpha;
  }
  if (values.kind === 'latin-hypercube') {
    body.runs = numberOr(values.runs, 10);
    body.maximin = values.maximin;
  }
  return body;
}

/** Which input a schema issue belongs to. */
function fieldOf(path: PropertyKey[], kind: DesignKind): keyof DesignFormValues {
  const head = String(path[0] ?? 'kind');
  if (head === 'factors') return 'chosen';
  if (head === 'alpha') return 'alphaValue';
  if (head === 'generators') return 'generators';
  if (head === 'runs') return kind === 'latin-hypercube' ? 'runs' : 'fraction';
  return (['kind', 'centerPoints', 'replicates', 'blocks', 'seed', 'variant', 'maximin', 'randomize'].includes(head) ? head : 'kind') as keyof DesignFormValues;
}

/**
 * The form's resolver: map the values to a request and check it with the shared schema; each
 * issue is shown at its input in the schema's words. α is a word (rotatable, orthogonal) or a
 * number, so a union failure means a hand-typed α that was not a number.
 */
export function designResolver(factors: FactorDef[]): Resolver<DesignFormValues> {
  return (values, context, options) =>
    schemaResolver<DesignFormValues, DesignBody>({
      schema: designRequestSchema,
      toBody: (v) => designRequestFrom(v, factors),
      fieldOf: (path) => fieldOf(path, values.kind),
      message: (issue) => (issue.code === 'invalid_union' ? 'must be a number above 0, e.g. 1.682' : undefined),
    })(values, context, options);
}
