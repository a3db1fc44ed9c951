import { useMutation, useQueryClient } from '@tanstack/react-query';
import { FIELD_LIMITS } from '@kilocycle/common/rules';
import type { CreateJobRequest, Job } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { optionalId, optionalNumber, optionalText } from '@/utils/form-schema';
import { getJobsQueryOptions } from './get-jobs';

const { job: LIMITS } = FIELD_LIMITS;

/** The picked instrument (the picker's option) or none yet. */
export type InstrumentChoice = { value: string | number; label: string } | null;

/** Bench conditions at reception; the same bounds as the server's, in the words the forms show. */
export const ambientTempSchema = optionalNumber({ ...LIMITS.ambientTempC, message: 'A temperature from -40 to 80 °C', decimalComma: true });
export const humiditySchema = optionalNumber({ ...LIMITS.humidityPct, message: 'A relative humidity from 0 to 100 %', decimalComma: true });

/** Reception details and bench conditions: the fields the new-job and the job's edit forms share. */
export const jobDetailsFields = {
  receivedDate: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Enter the date it came in'),
  conditionReceived: optionalText(FIELD_LIMITS.notes.max),
  technicianId: optionalId,
  ambientTempC: ambientTempSchema,
  humidityPct: humiditySchema,
  notes: optionalText(FIELD_LIMITS.notes.max),
};

/** The new-job form: checked before sending; the server checks again and its messages are shown as they come. */
export const createJobSchema = z
  .object({
    instrument: z.custom<InstrumentChoice>().refine((choice) => choice !== null, 'Choose the instrument received'),
    ...jobDetailsFields,
  })
  .transform(({ instrument, ...rest }): CreateJobRequest => ({ instrumentId: Number(instrument?.value), ...rest }));

export function createJob(body: CreateJobRequest): Promise<Job> {
  return api.post<Job>('/jobs', body, { notify: false });
}

export function useCreateJob({ onSuccess }: { onSuccess?: (job: Job) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createJob,
    onSuccess: async (job) => {
      await queryClient.invalidateQueries({ queryKey: getJobsQueryOptions().queryKey });
      onSuccess?.(job);
    },
  });
}
