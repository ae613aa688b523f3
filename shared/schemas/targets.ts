// Target schemas shared by the client's form, the server's validation and the OpenAPI document.
import { z } from 'zod';

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'a date as YYYY-MM-DD');

export const targetCreateSchema = z.object({
  /** a curve metric key (vAtRef, massActivity …) or a hand-entered response key of the project */
  metric: z.string().trim().min(1, 'required').max(40),
  comparator: z.enum(['>=', '<=']),
  value: z.number().finite('must be a number'),
  unit: z.string().trim().min(1, 'required').max(20),
  basis: z.enum(['catalyst', 'metal']).nullish(),
  conditions: z.string().trim().max(200).default(''),
  dueDate: isoDate.nullish(),
  name: z.string().trim().max(80).default(''),
});
export type TargetCreate = z.input<typeof targetCreateSchema>;

export const targetUpdateSchema = z.object({
  metric: z.string().trim().min(1, 'required').max(40).optional(),
  comparator: z.enum(['>=', '<=']).optional(),
  value: z.number().finite('must be a number').optional(),
  unit: z.string().trim().min(1, 'required').max(20).optional(),
  basis: z.enum(['catalyst', 'metal']).nullish(),
  conditions: z.string().trim().max(200).optional(),
  dueDate: isoDate.nullish(),
  name: z.string().trim().max(80).optional(),
});
export type TargetUpdate = z.input<typeof targetUpdateSchema>;

export interface TargetPointView { buildId: number; code: string; date: string; value: number }

/** A target with its status, as the API answers it. */
export interface TargetView {
  id: number;
  projectId: number;
  metric: string;
  /** label of the metric or response */
  metricLabel: string;
  comparator: '>=' | '<=';
  value: number;
  unit: string;
  basis: 'catalyst' | 'metal' | null;
  conditions: string;
  dueDate: string | null;
  name: string;
  status: {
    state: 'met' | 'not-yet' | 'no-data';
    metBy: TargetPointView | null;
    best: TargetPointView | null;
    /** in the target's unit; > 0 still missing */
    gap: number | null;
    series: (TargetPointView & { best: number; bestCode: string })[];
    notComparable: { code: string; reason: string }[];
  };
}
