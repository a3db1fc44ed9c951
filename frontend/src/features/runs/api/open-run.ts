import { useMutation, useQueryClient } from '@tanstack/react-query';
import { FIELD_LIMITS, PHASE_RUN_KINDS } from '@kilocycle/common/rules';
import { CALIBRATION_RUN_KINDS, RUN_DATA_KINDS, RUN_KINDS, type CreateRunRequest, type Run } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { optionalId, optionalNumber, optionalText, requiredId } from '@/utils/form-schema';
import { getRunsQueryOptions } from './get-runs';

const { overrideReason: REASON, supplyVoltage: VOLTS } = FIELD_LIMITS.run;

/**
 * The open-run form. As-found and as-left runs need a standard; when `asksReason` says so for the chosen
 * standard (a lead using a lapsed one), the written reason the server wants with it is required and sent.
 * The data kind (frequency or phase) is sent for the kinds that may hold phase (stability), and left to the
 * server's default (frequency) for the others.
 */
export function openRunSchema(asksReason: (standardId: number | null) => boolean) {
  return z
    .object({
      rangeId: requiredId('Choose the range'),
      kind: z.enum(RUN_KINDS),
      dataKind: z.enum(RUN_DATA_KINDS),
      benchId: optionalId,
      standardId: optionalId,
      supplyVoltage: optionalNumber({ ...VOLTS, message: 'The supply voltage is a number of volts', decimalComma: true }),
      configuration: optionalText(FIELD_LIMITS.notes.max),
      notes: optionalText(FIELD_LIMITS.notes.max),
      overrideReason: z.string().trim().max(REASON.max, `At most ${REASON.max} characters`),
    })
    .superRefine((run, context) => {
      if (CALIBRATION_RUN_KINDS.includes(run.kind) && run.standardId === null)
        context.addIssue({
          code: 'custom',
          path: ['standardId'],
          message: 'Choose the reference standard: as-found and as-left results are stated against it',
        });
      if (asksReason(run.standardId) && run.overrideReason.length < REASON.min)
        context.addIssue({ code: 'custom', path: ['overrideReason'], message: `Write why the lapsed standard is used (at least ${REASON.min} characters)` });
    })
    .transform(({ overrideReason, dataKind, ...body }): CreateRunRequest => ({
      ...body,
      ...(PHASE_RUN_KINDS.includes(body.kind) ? { dataKind } : {}),
      ...(asksReason(body.standardId) ? { standardOverrideReason: overrideReason } : {}),
    }));
}

export type OpenRunInput = { jobId: number; body: CreateRunRequest };

/** Opens a run on one of the job's instrument's ranges; 409 when the standard has lapsed (the reason says why). */
export function openRun({ jobId, body }: OpenRunInput): Promise<Run> {
  return api.post<Run>(`/jobs/${jobId}/runs`, body, { notify: false });
}

export function useOpenRun({ onSuccess }: { onSuccess?: (run: Run) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: openRun,
    onSuccess: async (run) => {
      await queryClient.invalidateQueries({ queryKey: getRunsQueryOptions().queryKey });
      onSuccess?.(run);
    },
  });
}
