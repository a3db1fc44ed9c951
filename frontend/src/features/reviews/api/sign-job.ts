import { useMutation, useQueryClient } from '@tanstack/react-query';
import { FIELD_LIMITS } from '@kilocycle/common/rules';
import { SIGNING_MEANING, type CertificateDetail } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';
import { getReviewQueryOptions } from './get-review';
import { invalidateJobEverywhere } from './invalidate-job';

export type SignJobInput = { jobId: number; password: string };

/** The signing form: the lead's password typed again (not trimmed: it is sent as typed). */
export const signJobSchema = z.object({
  password: z.string().min(1, 'Enter your password to sign').max(FIELD_LIMITS.review.password.max, `At most ${FIELD_LIMITS.review.password.max} characters`),
});

/**
 * Signs with the lead's password typed again. A refused password must not end the session, so neither 401
 * nor 403 is treated as an expired sign-in here: the dialog shows the server's message and stays open.
 */
export function signJob({ jobId, password }: SignJobInput): Promise<CertificateDetail> {
  return api.post<CertificateDetail>(`/jobs/${jobId}/sign`, { password, meaning: SIGNING_MEANING }, { notify: false, handleUnauthorized: false });
}

export function useSignJob({ onSuccess }: { onSuccess?: (certificate: CertificateDetail) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signJob,
    onSuccess: async (certificate, { jobId }) => {
      await invalidateJobEverywhere(queryClient, jobId);
      // The certificate lists (another feature's cache) start with the same key.
      await queryClient.invalidateQueries({ queryKey: sharedQueryKeys.certificates });
      onSuccess?.(certificate);
    },
    // A refused signature is recorded in the job's history: show it.
    onError: (_error, { jobId }) => void queryClient.invalidateQueries({ queryKey: getReviewQueryOptions(jobId).queryKey }),
  });
}
