// Build schemas and the rule that checks factor values against the project's factors,
// used by the build form (inline errors) and by the server (400 with field errors).
import { z } from 'zod';
import { testConditionsSchema, type FactorDef } from './project';

export const BUILD_STATUSES = ['planned', 'built', 'tested', 'reviewed', 'discarded'] as const;
export type BuildStatus = (typeof BUILD_STATUSES)[number];

const factorValue = z.union([z.number().finite(), z.string().trim().min(1)]);

export const buildCreateSchema = z.object({
  code: z.string().trim().regex(/^[A-Za-z0-9][A-Za-z0-9._-]{0,29}$/, 'letters, digits, . _ - (max 30)').optional(),
  parentId: z.number().int().positive().nullish(),
  changeNote: z.string().trim().max(500).nullish(),
  factors: z.record(z.string(), factorValue).default({}),
  loadingMgCm2: z.number().positive('must be above 0 mg/cm²').max(50, 'must be at most 50 mg/cm²').nullish(),
  metalLoadingMgCm2: z.number().positive('must be above 0 mg/cm²').max(50).nullish(),
  areaCm2: z.number().positive('must be above 0 cm²').max(1000, 'must be at most 1000 cm²').nullish(),
  catalystLot: z.string().trim().max(60).nullish(),
  /** the lot record the build was made from (GET /api/projects/:id/lots); its name fills catalystLot */
  lotId: z.number().int().positive().nullish(),
  labId: z.number().int().positive().nullish(),
  status: z.enum(BUILD_STATUSES).optional(),
  builtOn: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'a date like 2026-11-30').nullish(),
  testedOn: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'a date like 2026-11-30').nullish(),
  replicateOf: z.number().int().positive().nullish(),
  testConditions: testConditionsSchema.default({}),
  responses: z.record(z.string(), z.number().finite()).optional(),
  notes: z.string().max(5000).optional(),
  /** the day the build was planned; set to today when a planned build is created without one */
  plannedOn: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'a date like 2026-11-30').nullish(),
  /** why a flagged proposal (outside the data's support, at a physical limit) was planned anyway */
  planReason: z.string().trim().max(1000).nullish(),
});
export type BuildCreate = z.input<typeof buildCreateSchema>;

export const buildUpdateSchema = buildCreateSchema.partial().extend({
  factors: z.record(z.string(), factorValue).optional(),
  testConditions: testConditionsSchema.optional(),
});

/** GET /api/projects/:id/builds: one status, one page. */
export const buildListQuery = z.object({
  status: z.enum(BUILD_STATUSES).optional(),
  limit: z.coerce.number().int().min(1).max(100000).optional(),
  offset: z.coerce.number().int().min(0).optional(),
  /** `brief`: only what a picker needs (BuildBrief: id, code, change note, status, lab, parent, curves), for a project of thousands of builds */
  view: z.enum(['full', 'brief']).optional(),
});
export type BuildListQuery = z.infer<typeof buildListQuery>;

/** PUT /api/builds/:id/record: make one curve the build's curve of record of its kind. */
export const recordChoiceSchema = z.object({
  /** optional check: must be the kind of the chosen curve */
  kind: z.enum(['polarization', 'durability', 'hold', 'impedance']).optional(),
  curveId: z.number().int().positive(),
});
export type RecordChoice = z.infer<typeof recordChoiceSchema>;

export interface FactorValueIssue {
  path: string[];
  message: string;
}

/**
 * Check build factor values against the project's factor definitions.
 * Continuous values must be numbers within [low, high]; categorical values one of the levels;
 * unknown keys are refused. Missing values are allowed only for planned builds.
 */
export function checkFactorValues(
  values: Record<string, number | string>,
  factorDefs: FactorDef[],
  options: { requireAll: boolean },
): FactorValueIssue[] {
  const issues: FactorValueIssue[] = [];
  const byKey = new Map(factorDefs.map((f) => [f.key, f]));
  for (const key of Object.keys(values)) {
    if (!byKey.has(key)) issues.push({ path: ['factors', key], message: `unknown factor "${key}"` });
  }
  for (const f of factorDefs) {
    const value = values[f.key];
    const where = ['factors', f.key];
    if (value === undefined || value === '') {
      if (options.requireAll) issues.push({ path: where, message: `${f.label}: a value is required` });
      continue;
    }
    if (f.kind === 'continuous') {
      if (typeof value !== 'number' || !Number.isFinite(value)) {
        issues.push({ path: where, message: `${f.label}: must be a number${f.unit ? ` in ${f.unit}` : ''}` });
      } else if (f.low != null && f.high != null && (value < f.low || value > f.high)) {
        issues.push({ path: where, message: `${f.label}: ${value} is outside ${f.low}–${f.high}${f.unit ? ` ${f.unit}` : ''}` });
      }
    } else {
      const levels = f.levels ?? [];
      if (typeof value !== 'string' || !levels.includes(value)) {
        issues.push({ path: where, message: `${f.label}: must be one of ${levels.join(', ')}` });
      }
    }
  }
  return issues;
}
