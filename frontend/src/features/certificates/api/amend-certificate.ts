import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AmendCertificateRequest, CertificateDetail } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';
import { getCertificatesQueryOptions } from './get-certificates';

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
