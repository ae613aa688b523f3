// POST /api/curves/:id/conditions: the uploader settles a condition on which the file and the
// build's record differ ("file" puts the file's value in the build record, "build" keeps it).
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { z } from 'zod';
import type { CurveSummary } from '@shared/api-types';
import { conditionChoiceSchema } from '@shared/schemas/curves';

/** The route's own body schema, with the curve it is about. */
export const chooseConditionInput = conditionChoiceSchema.extend({ curveId: z.number().int().positive() });
export type ChooseConditionInput = z.infer<typeof chooseConditionInput>;

export function chooseCondition({ curveId, ...body }: ChooseConditionInput) {
  return api<{ curve: CurveSummary; build: { id: number; areaCm2: number | null; testConditions: Record<string, unknown> } }>(`/curves/${curveId}/conditions`, { method: 'POST', body });
}

export function useChooseCondition(buildId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: ChooseConditionInput) => chooseCondition(chooseConditionInput.parse(input)),
    onSuccess: (_result, input) => {
      client.invalidateQueries({ queryKey: ['build', buildId] });
      client.invalidateQueries({ queryKey: ['curve', input.curveId] });
      client.invalidateQueries({ queryKey: ['builds'] });
      client.invalidateQueries({ queryKey: ['home'] });
    },
  });
}
