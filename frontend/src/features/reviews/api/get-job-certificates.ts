import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Certificate, ListResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

export function getJobCertificates(jobId: number): Promise<ListResponse<Certificate>> {
  return api.get<ListResponse<Certificate>>('/certificates', { params: { jobId, sort: '-revision' } });
}

// Kept under the certificates key, so signing, amending or withdrawing anywhere refreshes it.
export const getJobCertificatesQueryOptions = (jobId: number) =>
  queryOptions({
    queryKey: [...sharedQueryKeys.certificates, 'job', jobId],
    queryFn: () => getJobCertificates(jobId),
  });

export function useJobCertificates(jobId: number, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...getJobCertificatesQueryOptions(jobId), enabled });
}
