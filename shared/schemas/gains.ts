// Query schemas of the gains waterfall and the lineage view: which response, along which builds.
import { z } from 'zod';
import { responseFieldDescription } from '../curves/metric-catalogue';

/** the longest chain of builds a gains waterfall takes */
export const MAX_CHAIN = 60;

const responseKey = z.string().trim().min(1).max(64).default('vAtRef').describe(responseFieldDescription());

export const gainsQuery = z.object({
  response: responseKey,
  builds: z
    .string()
    .trim()
    .regex(/^\d+(,\d+)*$/, 'must be build ids separated by commas, e.g. 1,4,6')
    .transform((text) => text.split(',').map(Number))
    .refine((ids) => ids.every((id) => id > 0), 'build ids must be positive')
    .refine((ids) => ids.length <= MAX_CHAIN, `at most ${MAX_CHAIN} builds`)
    .optional()
    .describe('build ids in chain order, baseline first; default: the best path of the lineage'),
});
export type GainsQuery = z.infer<typeof gainsQuery>;

export const lineageQuery = z.object({ response: responseKey });
