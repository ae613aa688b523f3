// The plan-runs form's values (what its inputs hold, as typed) and the one mapping from them to
// the plan request, checked by the request schema the server validates with, plus the held
// values against each factor's range or levels. Kept apart from the component for testing.
import type { Resolver } from 'react-hook-form';
import type { Build, FactorDef } from '@shared/api-types';
import type { Design } from '@shared/doe/designs/types';
import { checkFactorValues } from '@shared/schemas/build';
import { planRunsSchema, type PlanRunsBody } from '@shared/schemas/doe';
import { schemaResolver } from '@/lib/schema-form';

export interface PlanRunsFormValues {
  /** build id, or '' for none */
  parentId: string;
  note: string;
  /** mg/cm², as typed */
  loading: string;
  /** cm², as typed */
  area: string;
  /** factor key → the value every build holds for a factor the design does not vary */
  held: Record<string, string>;
  /** block number → lab id, or '' for not set */
  labsByBlock: Record<string, string>;
}

/** The value a factor the design does not vary is held at: the parent's, else the first level or the middle of the range. */
export function defaultHeld(f: FactorDef, parent: Build | undefined): string {
  const fromParent = parent?.factors[f.key];
  if (fromParent !== undefined && fromParent !== '') return String(fromParent);
  if (f.kind === 'categorical') return (f.levels ?? [''])[0]!;
  return String(Number((((f.low ?? 0) + (f.high ?? 0)) / 2).toPrecision(4)));
}

/** The factors of the project the design does not vary. */
export const heldFactors = (design: Design, factors: FactorDef[]) => factors.filter((f) => !design.factorKeys.includes(f.key));

export function initialPlanRunsValues(design: Design, factors: FactorDef[], homeLabId: number | null): PlanRunsFormValues {
  const blocks = Array.from({ length: design.info.blocks }, (_, i) => String(i + 1));
  return {
    parentId: '',
    note: '',
    loading: '',
    area: '',
    held: Object.fromEntries(heldFactors(design, factors).map((f) => [f.key, defaultHeld(f, undefined)])),
    labsByBlock: Object.fromEntries(blocks.map((b) => [b, homeLabId != null ? String(homeLabId) : ''])),
  };
}

/** Typed text as a number (a decimal comma is read as a point); blank is "not given". */
const numberOrNull = (text: string) => (text.trim() === '' ? null : Number(text.trim().replace(',', '.')));

/** The request the values stand for: the design's runs and settings, with the form's choices. */
export function planRunsRequestFrom(values: PlanRunsFormValues, design: Design, factors: FactorDef[]): PlanRunsBody {
  const labsByBlock: Record<string, number> = {};
  for (const [block, lab] of Object.entries(values.labsByBlock)) if (lab) labsByBlock[block] = Number(lab);
  const held: Record<string, number | string> = {};
  for (const f of heldFactors(design, factors)) {
    const text = (values.held[f.key] ?? '').trim();
    held[f.key] = f.kind === 'continuous' ? (numberOrNull(text) ?? Number.NaN) : text;
  }
  const info = design.info;
  return {
    runs: design.runs,
    parentId: values.parentId ? Number(values.parentId) : null,
    labsByBlock,
    loadingMgCm2: numberOrNull(values.loading),
    areaCm2: numberOrNull(values.area),
    note: values.note.trim() || undefined,
    designKind: design.kind,
    seed: info.seed,
    held,
    designSettings: { variant: info.variant ?? null, alpha: info.alpha ?? null, centerPoints: info.centerPoints, replicates: info.replicates, blocks: info.blocks, generators: info.generators ?? null, runsByType: info.runsByType },
  };
}

/** Which input a request path belongs to. */
function fieldOf(path: PropertyKey[]): string {
  const [head, key] = path.map(String);
  if (head === 'held' && key) return `held.${key}`;
  if (head === 'factors' && key) return `held.${key}`;
  if (head === 'labsByBlock' && key) return `labsByBlock.${key}`;
  if (head === 'loadingMgCm2') return 'loading';
  if (head === 'areaCm2') return 'area';
  if (head === 'note' || head === 'parentId') return head;
  return 'root';
}

export function planRunsResolver(design: Design, factors: FactorDef[]): Resolver<PlanRunsFormValues> {
  const held = heldFactors(design, factors);
  return schemaResolver<PlanRunsFormValues, PlanRunsBody>({
    schema: planRunsSchema,
    toBody: (v) => planRunsRequestFrom(v, design, factors),
    fieldOf,
    // each held value within its factor's range, or one of its levels
    extra: (body) => checkFactorValues(body.held ?? {}, held, { requireAll: true }),
    message: (issue) => {
      if (issue.path[0] !== 'held' || issue.code !== 'invalid_union') return undefined;
      const f = held.find((h) => h.key === String(issue.path[1]));
      return f?.kind === 'continuous' ? `must be a number${f.unit ? ` in ${f.unit}` : ''}` : 'choose a level';
    },
  });
}
