import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MailMessageView } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

export function getMailMessage(id: number): Promise<MailMessageView> {
  return api.get<MailMessageView>(`/mail/${id}`);
}

export const getMailMessageQueryOptions = (id: number) =>
  queryOptions({
    queryKey: ['mail', 'message', id],
    queryFn: () => getMailMessage(id),
    // A captured message never changes.
    staleTime: Infinity,
  });

export function useMailMessage(id: number) {
  return useQuery({ ...getMailMessageQueryOptions(id), enabled: Number.isInteger(id) && id > 0 });
}
