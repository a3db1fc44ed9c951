import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Certificate, ListCertificatesQuery, ListResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

/** The server scopes the list: a client gets its own organisation's certificates only. */
export function getCertificates(query: ListCertificatesQuery = {}): Promise<ListResponse<Certificate>> {
  return api.get<ListResponse<Certificate>>('/certificates', { params: query });
}

export const getCertificatesQueryOptions = (query?: ListCertificatesQuery) =>
  queryOptions({
    queryKey: query ? [...sharedQueryKeys.certificates, 'list', query] : sharedQueryKeys.certificates,
    queryFn: () => getCertificates(query),
  });

export function useCertificates({ query }: { query: ListCertificatesQuery }) {
  return useQuery({ ...getCertificatesQueryOptions(query), placeholderData: keepPreviousData });
}
