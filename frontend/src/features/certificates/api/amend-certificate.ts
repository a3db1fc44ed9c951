import { useMutation, useQueryClient } from '@tanstack/react-query';
import { FIELD_LIMITS } from '@kilocycle/common/rules';
import type { AmendCertificateRequest, CertificateDetail } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';
import { getCertificatesQueryOptions } from './get-certificates';

const { reason: REASON } = FIELD_LIMITS.certificate;

/** The written reason an amendment or a withdrawal carries (kept with the certificate and in the audit log). */
export const certificateReasonSchema = z.object({
  reason: z.string().trim().min(REASON.min, 'Give the reason in a few words').max(REASON.max, `At most ${REASON.max} characters`),
});

export type AmendCertificateInput = { id: number } & AmendCertificateRequest;

/** Reopens an issued certificate: the next signing issues revision N+1, and this one becomes superseded then. */
export function amendCertificate({ id, ...body }: AmendCertificateInput): Promise<CertificateDetail> {
  return api.post<CertificateDetail>(`/certificates/${id}/amend`, body, { notify: false });
}

export function useAmendCertificate({ onSuccess }: { onSuccess?: (certificate: CertificateDetail) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: amendCertificate,
    onSuccess: async (certificate) => {
      await queryClient.invalidateQueries({ queryKey: getCertificatesQueryOptions().queryKey });
      // The job went back to work or to review: any cached job or review is out of date.
      await queryClient.invalidateQueries({ queryKey: sharedQueryKeys.jobs });
      await queryClient.invalidateQueries({ queryKey: sharedQueryKeys.reviews });
      onSuccess?.(certificate);
    },
  });
}
