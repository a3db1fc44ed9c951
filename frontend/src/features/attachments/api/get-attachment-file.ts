import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Attachment } from '@kilocycle/common/types';
import { fetchFile } from '@/lib/api-client';

/** The bytes of an attachment, fetched with the session's token (the file URL is behind sign-in). */
export function getAttachmentFile(attachment: Pick<Attachment, 'url'>): Promise<Blob> {
  return fetchFile(attachment.url).then((file) => file.blob);
}

// Stored files never change: fetched once per page visit.
export const getAttachmentFileQueryOptions = (attachment: Pick<Attachment, 'id' | 'url'>) =>
  queryOptions({
    queryKey: ['attachments', 'file', attachment.id],
    queryFn: () => getAttachmentFile(attachment),
    staleTime: Infinity,
    gcTime: 5 * 60_000,
  });

export function useAttachmentFile(attachment: Pick<Attachment, 'id' | 'url'>, enabled: boolean) {
  return useQuery({ ...getAttachmentFileQueryOptions(attachment), enabled });
}
