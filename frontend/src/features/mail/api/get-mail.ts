import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListMailQuery, ListResponse, MailMessageSummary } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

export function getMail(query: ListMailQuery = {}): Promise<ListResponse<MailMessageSummary>> {
  return api.get<ListResponse<MailMessageSummary>>('/mail', { params: query });
}

export const getMailQueryOptions = (query?: ListMailQuery) =>
  queryOptions({
    queryKey: query ? ['mail', 'list', query] : ['mail'],
    queryFn: () => getMail(query),
  });

export function useMail({ query }: { query: ListMailQuery }) {
  return useQuery({ ...getMailQueryOptions(query), placeholderData: keepPreviousData });
}
