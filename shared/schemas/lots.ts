// Catalyst lot schemas shared by the client's form, the server's validation and the OpenAPI document.
import { z } from 'zod';

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'a date as YYYY-MM-DD');

export const lotCreateSchema = z.object({
  name: z.string().trim().min(1, 'required').max(60),
  maker: z.string().trim().max(80).default(''),
  batchSizeG: z.number().positive('must be above 0 g').max(1e6, 'must be at most 1000 kg').nullish(),
  madeOn: isoDate.nullish(),
  metalWtPct: z.number().min(0, 'must be at least 0 wt %').max(100, 'must be at most 100 wt %').nullish(),
  notes: z.string().trim().max(2000).default(''),
});
export type LotCreate = z.input<typeof lotCreateSchema>;

export const lotUpdateSchema = lotCreateSchema.partial();

/** POST /api/lots: a lot recorded in the project the body names. */
export const lotCreateInProjectSchema = lotCreateSchema.extend({ projectId: z.number().int().positive() });
export type LotCreateInProject = z.input<typeof lotCreateInProjectSchema>;

/** GET /api/lots: every lot of the projects one can read, optionally of one project or by name. */
export const lotsQuerySchema = z.object({
  projectId: z.coerce.number().int().positive().optional(),
  /** part of the lot's name or maker, any case */
  q: z.string().trim().max(60).optional(),
});

/** A file kept with a lot: a certificate of analysis, an ICP report, a supplier's data sheet. */
export interface LotFileView {
  id: number;
  name: string;
  sizeBytes: number;
  contentType: string;
  uploadedAt: string;
  uploadedBy: string | null;
}

export const lotComparisonQuerySchema = z.object({
  /** the lot to judge this one against */
  against: z.coerce.number().int().positive(),
  /** a curve metric or hand-entered response key; V at j_ref when not given */
  response: z.string().trim().min(1).max(40).default('vAtRef'),
});

export interface LotView {
  id: number;
  projectId: number;
  name: string;
  maker: string;
  batchSizeG: number | null;
  madeOn: string | null;
  metalWtPct: number | null;
  notes: string;
  buildCount: number;
  /** certificates and other files kept with the lot (newest first) */
  files: LotFileView[];
  /** the project's name (GET /api/lots, which spans projects) */
  projectName?: string;
}
