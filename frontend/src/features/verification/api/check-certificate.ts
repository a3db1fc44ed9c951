import { useMutation } from '@tanstack/react-query';
import type { CertificateCheckResult } from '@kilocycle/common/types';
import { postFile } from '@/lib/api-client';

export type CheckCertificateInput = { number: string; file: File };

/** Sends the PDF itself; the server compares its SHA-256 with the stored one and checks its own signature. */
export function checkCertificate({ number, file }: CheckCertificateInput): Promise<CertificateCheckResult> {
  const pdf = file.type === 'application/pdf' ? file : new Blob([file], { type: 'application/pdf' });
  return postFile<CertificateCheckResult>(`/public/certificates/${encodeURIComponent(number)}/check`, pdf, { authenticated: false });
}

export function useCheckCertificate() {
  return useMutation({ mutationFn: checkCertificate });
}
