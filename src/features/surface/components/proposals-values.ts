// The proposals form's values (as typed) and the one mapping from them to a proposals request,
// checked by the request schema the server validates with; and the reason asked for before a
// flagged proposal is planned. Kept apart from the component so each can be tested alone.
import type { Resolver } from 'react-hook-form';
import type { FactorDef } from '@shared/api-types';
import type { ProposalStrategy } from '@shared/doe/proposals/index';
import { proposalsRequestSchema, type ProposalsRequest, type SurfaceRequest } from '@shared/schemas/doe';
import { schemaResolver } from '@/lib/schema-form';

/** Most proposals asked for at once: more than a campaign's next round, and slow to compute. */
export const MAX_PROPOSALS = 10;
/** Shortest reason accepted for planning a flagged proposal (the server refuses shorter ones). */
import { MIN_PLAN_REASON_CHARS } from '@shared/schemas/doe';

export const MIN_REASON = MIN_PLAN_REASON_CHARS;

export interface ProposalsFormValues {
  /** proposals inside the support, as typed */
  count: string;
  /** '0' | '1' | '2' */
  exploratory: string;
  strategy: ProposalStrategy;
  goal: 'maximize' | 'minimize' | 'target';
  /** the target in display units, as typed */
  target: string;
  /** continuous factor key → narrower bounds, as typed (blank: the factor's own end) */
  bounds: Record<string, { min: string; max: string }>;
  /** categorical factor key → the one level to use ('' for any) */
  fixed: Record<string, string>;
}

/** How the response's values are shown: display value = stored value × scale. */
export interface ResponseDisplay {
  goal: 'maximize' | 'minimize' | 'target';
  target: number | null;
  scale: number;
}

export function initialProposalsValues(response: ResponseDisplay): ProposalsFormValues {
  return {
    count: '3',
    exploratory: '1',
    strategy: 'balance',
    goal: response.goal,
    target: response.target != null ? String(response.target * response.scale) : '',
    bounds: {},
    fixed: {},
  };
}

const numberOf = (text: string) => (text.trim() === '' ? undefined : Number(text.trim().replace(',', '.')));

/** The request the values stand for, on top of the fit they come from (seed fixed, so a repeat gives the same proposals). */
export function proposalsRequestFrom(values: ProposalsFormValues, fit: SurfaceRequest, scale: number): ProposalsRequest {
  const bounds: Record<string, { min?: number; max?: number }> = {};
  for (const [key, v] of Object.entries(values.bounds ?? {})) {
    const entry: { min?: number; max?: number } = {};
    const min = numberOf(v?.min ?? '');
    const max = numberOf(v?.max ?? '');
    if (min !== undefined) entry.min = min;
    if (max !== undefined) entry.max = max;
    if (min !== undefined || max !== undefined) bounds[key] = entry;
  }
  const fixed: Record<string, string> = {};
  for (const [key, v] of Object.entries(values.fixed ?? {})) if (v) fixed[key] = v;
  const target = numberOf(values.target);
  return {
    ...fit,
    count: numberOf(values.count) ?? 3,
    exploratory: Number(values.exploratory) || 0,
    strategy: values.strategy,
    goal: values.goal === 'target' ? { target: target === undefined ? Number.NaN : target / scale } : values.goal,
    constraints: { bounds, fixed },
    seed: 1,
  };
}

/** Which input a request path belongs to. */
function fieldOf(path: PropertyKey[]): string {
  const parts = path.map(String);
  if (parts[0] === 'count' || parts[0] === 'exploratory' || parts[0] === 'strategy') return parts[0];
  if (parts[0] === 'goal') return 'target';
  if (parts[0] === 'constraints' && parts[1] === 'bounds' && parts[2]) return `bounds.${parts[2]}.${parts[3] === 'max' ? 'max' : 'min'}`;
  if (parts[0] === 'constraints' && parts[1] === 'fixed' && parts[2]) return `fixed.${parts[2]}`;
  return 'root';
}

/** Narrower bounds must lie inside the factor's range and keep min ≤ max. */
function boundIssues(body: ProposalsRequest, factors: FactorDef[]) {
  const issues: { path: PropertyKey[]; message: string }[] = [];
  if ((body.count ?? 0) > MAX_PROPOSALS) issues.push({ path: ['count'], message: `must be at most ${MAX_PROPOSALS}` });
  for (const f of factors) {
    const b = body.constraints?.bounds?.[f.key];
    if (!b) continue;
    const unit = f.unit ? ` ${f.unit}` : '';
    if (b.min !== undefined && f.high != null && b.min > f.high) issues.push({ path: ['constraints', 'bounds', f.key, 'min'], message: `${f.label}: at least ${b.min}${unit} is above the range's end (${f.high}${unit})` });
    if (b.max !== undefined && f.low != null && b.max < f.low) issues.push({ path: ['constraints', 'bounds', f.key, 'max'], message: `${f.label}: at most ${b.max}${unit} is below the range's start (${f.low}${unit})` });
    if (b.min !== undefined && b.max !== undefined && b.min > b.max) issues.push({ path: ['constraints', 'bounds', f.key, 'max'], message: `${f.label}: "at most" must not be below "at least"` });
  }
  return issues;
}

export function proposalsResolver(fit: SurfaceRequest, scale: number, factors: FactorDef[], unit: string): Resolver<ProposalsFormValues> {
  return schemaResolver<ProposalsFormValues, ProposalsRequest>({
    schema: proposalsRequestSchema,
    toBody: (v) => proposalsRequestFrom(v, fit, scale),
    fieldOf,
    extra: (body) => boundIssues(body, factors),
    message: (issue) => {
      if (issue.path[0] === 'goal') return `the target must be a number${unit ? ` in ${unit}` : ''}`;
      if (issue.path[0] === 'constraints' && issue.code === 'invalid_type') return 'must be a number';
      return undefined;
    },
  });
}
