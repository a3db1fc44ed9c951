import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListQuery, ListResponse, Organization, OrganizationKind } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

export type OrganizationsQuery = ListQuery & { kind?: OrganizationKind; active?: boolean };

export function getOrganizations(query: OrganizationsQuery = {}): Promise<ListResponse<Organization>> {
  return api.get<ListResponse<Organization>>('/organizations', { params: query });
}

export const getOrganizationsQueryOptions = (query?: OrganizationsQuery) =>
  queryOptions({
    queryKey: query ? ['organizations', query] : ['organizations'],
    queryFn: () => getOrganizations(query),
  });

type UseOrganizationsOptions = { query: OrganizationsQuery; enabled?: boolean };

export function useOrganizations({ query, enabled = true }: UseOrganizationsOptions) {
  return useQuery({ ...getOrganizationsQueryOptions(query), placeholderData: keepPreviousData, enabled });
}
