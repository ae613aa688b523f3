// The review pack's query: an optional date range (YYYY-MM-DD, inclusive) of the builds it covers.
import { z } from 'zod';

const day = z.string().trim().regex(/^\d{4}-\d{2}-\d{2}$/, 'must be a date written YYYY-MM-DD').refine((text) => !Number.isNaN(Date.parse(`${text}T00:00:00Z`)), 'is not a calendar date');

export const reviewPackQuery = z
  .object({ from: day.optional(), to: day.optional() })
  .refine((q) => !q.from || !q.to || q.from <= q.to, { message: 'must not be before from', path: ['to'] });

export type ReviewPackQuery = z.infer<typeof reviewPackQuery>;
