import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PublicCertificate } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

/** No sign-in: anyone holding a certificate may look its number up. */
export function getPublicCertificate(number: string): Promise<PublicCertificate> {
  return api.get<PublicCertificate>(`/public/certificates/${encodeURIComponent(number)}`, { notify: false, handleUnauthorized: false });
}

export const getPublicCertificateQueryOptions = (number: string) =>
  queryOptions({
    queryKey: ['public-certificate', number],
    queryFn: () => getPublicCertificate(number),
  });

export function usePublicCertificate(number: string) {
  return useQuery({ ...getPublicCertificateQueryOptions(number), enabled: number.trim() !== '' });
}
