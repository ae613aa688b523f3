// Review request schemas: a comment on a build, and a PI's verdict with its reason.
import { z } from 'zod';

export const commentSchema = z.object({ body: z.string().trim().min(1, 'write a comment').max(4000, 'at most 4000 characters') });
export type CommentBody = z.infer<typeof commentSchema>;

export const VERDICTS = ['approved', 'needs-work'] as const;

export const verdictSchema = z.object({
  verdict: z.enum(VERDICTS),
  body: z.string().trim().min(1, 'say why, in a sentence or two').max(4000, 'at most 4000 characters'),
  /** give the same verdict again on purpose (without it, repeating the build's standing verdict is refused as a double click) */
  repeat: z.boolean().optional(),
});
export type VerdictBody = z.infer<typeof verdictSchema>;
