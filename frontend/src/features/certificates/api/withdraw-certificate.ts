import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CertificateDetail, WithdrawCertificateRequest } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getCertificatesQueryOptions } from './get-certificates';

export type WithdrawCertificateInput = { id: number } & WithdrawCertificateRequest;

export function withdrawCertificate({ id, reason }: WithdrawCertificateInput): Promise<CertificateDetail> {
  return api.post<CertificateDetail>(`/certificates/${id}/withdraw`, { reason }, { notify: false });
}

export function useWithdrawCertificate({ onSuccess }: { onSuccess?: (certificate: CertificateDetail) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: withdrawCertificate,
    onSuccess: async (certificate) => {
      await queryClient.invalidateQueries({ queryKey: getCertificatesQueryOptions().queryKey });
      onSuccess?.(certificate);
    },
  });
}
