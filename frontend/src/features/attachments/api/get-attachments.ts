import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Attachment, AttachmentOwner, ListResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

const base = (owner: AttachmentOwner, ownerId: number) => `/${owner === 'instrument' ? 'instruments' : 'jobs'}/${ownerId}/attachments`;

export function getAttachments(owner: AttachmentOwner, ownerId: number): Promise<ListResponse<Attachment>> {
  return api.get<ListResponse<Attachment>>(base(owner, ownerId));
}

export const getAttachmentsQueryOptions = (owner: AttachmentOwner, ownerId: number) =>
  queryOptions({
    queryKey: ['attachments', owner, ownerId],
    queryFn: () => getAttachments(owner, ownerId),
  });

export function useAttachments(owner: AttachmentOwner, ownerId: number) {
  return useQuery(getAttachmentsQueryOptions(owner, ownerId));
}

export const attachmentsPath = base;
