import { useMutation, useQueryClient } from '@tanstack/react-query';
import { FIELD_LIMITS } from '@kilocycle/common/rules';
import type { Run, UpdateRunRequest } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { optionalId, optionalNumber, optionalText } from '@/utils/form-schema';
import { getRunQueryOptions } from './get-run';
import { getRunsQueryOptions } from './get-runs';

export type UpdateRunInput = { id: number; changes: UpdateRunRequest };

const { overrideReason: OVERRIDE, correctionReason: REASON, supplyVoltage: VOLTS } = FIELD_LIMITS.run;

type CorrectRunRules = {
  /** As-found and as-left runs keep a standard. */
  needsStandard: boolean;
  /** Whether this standard needs the written override (a lead choosing a lapsed one). */
  asksOverride: (standardId: number | null) => boolean;
};

/**
 * "Correct run details": only what differs from the run is sent, with the reason for the correction
 * (and the override reason when a lapsed standard is chosen).
 */
export function correctRunSchema(run: Run, { needsStandard, asksOverride }: CorrectRunRules) {
  return z
    .object({
      standardId: optionalId,
      supplyVoltage: optionalNumber({ ...VOLTS, message: 'The supply voltage is a number of volts', decimalComma: true }),
      configuration: optionalText(FIELD_LIMITS.notes.max),
      notes: optionalText(FIELD_LIMITS.notes.max),
      reason: z.string().trim().max(REASON.max, `At most ${REASON.max} characters`),
      overrideReason: z.string().trim().max(OVERRIDE.max, `At most ${OVERRIDE.max} characters`),
    })
    .transform(({ reason, overrideReason, ...draft }, context): UpdateRunRequest => {
      const changes: UpdateRunRequest = {};
      for (const field of ['standardId', 'supplyVoltage', 'configuration', 'notes'] as const)
        if (draft[field] !== run[field]) Object.assign(changes, { [field]: draft[field] });
      const problem = (path: string, message: string) => context.addIssue({ code: 'custom', path: [path], message });
      if (Object.keys(changes).length === 0) problem('root', 'Nothing is changed yet');
      else if (needsStandard && changes.standardId === null) problem('standardId', 'An as-found or as-left run needs a reference standard');
      if (reason.length < REASON.min) problem('reason', 'Say why the details are corrected');
      const override = 'standardId' in changes && asksOverride(draft.standardId);
      if (override && overrideReason.length < OVERRIDE.min)
        problem('overrideReason', `Write why the lapsed standard is used (at least ${OVERRIDE.min} characters)`);
      return { ...changes, reason, ...(override ? { standardOverrideReason: overrideReason } : {}) };
    });
}

export function updateRun({ id, changes }: UpdateRunInput): Promise<Run> {
  return api.patch<Run>(`/runs/${id}`, changes);
}

export function useUpdateRun({ onSuccess }: { onSuccess?: (run: Run) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateRun,
    onSuccess: async (run) => {
      queryClient.setQueryData(getRunQueryOptions(run.id).queryKey, run);
      await queryClient.invalidateQueries({ queryKey: getRunsQueryOptions().queryKey });
      onSuccess?.(run);
    },
  });
}
