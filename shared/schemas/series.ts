// Request schema of a series analysis: which variable, which builds (default: chosen by the
// recipe diff), at which iR-free voltage.
import { z } from 'zod';

export const SERIES_VARIABLES = ['temperature', 'pressure'] as const;
/** the largest series a request may name */
export const MAX_SERIES_BUILDS = 40;

export const seriesRequestSchema = z.object({
  variable: z.enum(SERIES_VARIABLES).describe('temperature → apparent activation energy (Arrhenius); pressure → apparent reaction order'),
  response: z.enum(['currentDensity']).default('currentDensity').describe('what is compared: the current density at the iR-free voltage (the kinetic current where the curve allows)'),
  builds: z
    .array(z.number().int().positive())
    .min(2, 'pick at least two builds')
    .max(MAX_SERIES_BUILDS, `at most ${MAX_SERIES_BUILDS} builds`)
    .refine((ids) => new Set(ids).size === ids.length, 'a build is listed twice')
    .optional()
    .describe('builds picked by hand (kept, with what else differs listed); default: the largest group that differs only in the variable'),
  atVoltageIrFree: z.number().gt(0.3, 'must be above 0.3 V').lt(1.2, 'must be below 1.2 V').default(0.85).describe('iR-free voltage the current is read at, V; default 0.85 V'),
  confidence: z.number().gt(0.5).lt(1).default(0.95),
});
export type SeriesRequestBody = z.input<typeof seriesRequestSchema>;
