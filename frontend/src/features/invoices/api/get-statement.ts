import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Statement } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

/** A customer's open, paid, overdue and credit totals and the running balance (a client: its own organisation only). */
export function getStatement(organizationId: number): Promise<Statement> {
  return api.get<Statement>(`/organizations/${organizationId}/statement`, { notify: false });
}

export const getStatementQueryOptions = (organizationId: number) =>
  queryOptions({
    queryKey: [...sharedQueryKeys.invoices, 'statement', organizationId],
    queryFn: () => getStatement(organizationId),
  });

export function useStatement({ organizationId, enabled = true }: { organizationId: number; enabled?: boolean }) {
  return useQuery({ ...getStatementQueryOptions(organizationId), enabled: enabled && Number.isInteger(organizationId) && organizationId > 0 });
}
