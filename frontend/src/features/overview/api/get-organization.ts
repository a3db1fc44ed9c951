import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Organization } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

/** One organisation by id; anyone may read their own (a client only theirs, a 404 for any other). */
export function getOrganization(id: number): Promise<Organization> {
  // Quiet on failure: the one page that reads it falls back to the number.
  return api.get<Organization>(`/organizations/${id}`, { notify: false });
}

// Under ['organizations'], so an edit (which invalidates that key) refreshes it too.
export const getOrganizationQueryOptions = (id: number) =>
  queryOptions({
    queryKey: ['organizations', id],
    queryFn: () => getOrganization(id),
  });

export function useOrganization({ id, enabled = true }: { id: number; enabled?: boolean }) {
  return useQuery({ ...getOrganizationQueryOptions(id), enabled });
}
