import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateJobRequest, Job } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getJobsQueryOptions } from './get-jobs';

export type CreateJobErrors = Partial<Record<keyof CreateJobRequest, string>>;

export function validateCreateJob(input: CreateJobRequest): CreateJobErrors {
  const errors: CreateJobErrors = {};
  if (!input.instrumentId) errors.instrumentId = 'Choose the instrument received';
  if (!/^\d{4}-\d{2}-\d{2}$/.test(input.receivedDate)) errors.receivedDate = 'Enter the date it came in';
  const t = input.ambientTempC;
  if (t !== null && t !== undefined && (!Number.isFinite(t) || t < -40 || t > 80)) errors.ambientTempC = 'A temperature from -40 to 80 °C';
  const h = input.humidityPct;
  if (h !== null && h !== undefined && (!Number.isFinite(h) || h < 0 || h > 100)) errors.humidityPct = 'A relative humidity from 0 to 100 %';
  return errors;
}

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
