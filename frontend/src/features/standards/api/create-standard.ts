import { useMutation, useQueryClient } from '@tanstack/react-query';
import { FIELD_LIMITS } from '@kilocycle/common/rules';
import { STANDARD_KINDS, type CreateStandardRequest, type ReferenceStandard } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { isoDate, requiredText, typedNumber } from '@/utils/form-schema';
import { getStandardsQueryOptions } from '@/lib/get-standards';

const { standard: LIMITS } = FIELD_LIMITS;
const within =
  ({ min, max }: { min: number; max: number }, message: string) =>
  (n: number) =>
    n < min || n > max ? message : null;

/** The reference-standard form (new and edit; `active` is only sent by the edit). */
export const standardSchema = z.object({
  name: requiredText(LIMITS.name.max, 'Give it the name the bench knows it by'),
  kind: z.enum(STANDARD_KINDS),
  makeModel: requiredText(LIMITS.makeModel.max, 'Enter make and model'),
  serial: requiredText(LIMITS.text.max, 'Enter the serial number'),
  certificateNumber: requiredText(LIMITS.text.max, 'Enter the number of its own certificate'),
  dueDate: isoDate('Enter the date its calibration is due'),
  timebaseAccuracyPpm: typedNumber(within(LIMITS.timebaseAccuracyPpm, '0 to 1000 ppm')),
  resolutionHz: typedNumber((n) => (n < LIMITS.resolutionHz.min ? 'Above 0 Hz' : n > LIMITS.resolutionHz.max ? `At most ${LIMITS.resolutionHz.max} Hz` : null)),
  calibrationUPpm: typedNumber(within(LIMITS.calibrationUPpm, '0 to 1000 ppm')),
  calibrationK: typedNumber(within(LIMITS.calibrationK, '1 to 10')),
  active: z.boolean(),
}) satisfies z.ZodType<CreateStandardRequest & { active: boolean }, unknown>;

export function createStandard(body: CreateStandardRequest): Promise<ReferenceStandard> {
  return api.post<ReferenceStandard>('/standards', body, { notify: false });
}

export function useCreateStandard({ onSuccess }: { onSuccess?: (standard: ReferenceStandard) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createStandard,
    onSuccess: async (standard) => {
      await queryClient.invalidateQueries({ queryKey: getStandardsQueryOptions().queryKey });
      onSuccess?.(standard);
    },
  });
}
