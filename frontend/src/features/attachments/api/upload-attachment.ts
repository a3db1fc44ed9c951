import { useMutation, useQueryClient } from '@tanstack/react-query';
import { FIELD_LIMITS } from '@kilocycle/common/rules';
import type { Attachment, AttachmentOwner } from '@kilocycle/common/types';
import { z } from 'zod';
import { toApiError, uploadWithProgress, type UploadProgress } from '@/lib/api-client';
import { attachmentsPath, getAttachmentsQueryOptions } from './get-attachments';

export type UploadAttachmentInput = {
  owner: AttachmentOwner;
  ownerId: number;
  file: File;
  caption: string;
  onUploadProgress?: (progress: UploadProgress) => void;
};

const { caption: CAPTION } = FIELD_LIMITS.attachment;

/** The upload form: a chosen file and an optional caption. */
export const uploadAttachmentSchema = z.object({
  file: z.custom<File | null>().refine((file): file is File => file instanceof File, 'Choose the file to attach'),
  caption: z.string().trim().max(CAPTION.max, `At most ${CAPTION.max} characters`),
});

const LIMIT_PREFIX: Record<number, string> = { 413: 'Too large:', 415: 'Not a kind of file the lab keeps:' };

/** Multipart: field `file`, optional `caption`. The server finds the type from the bytes, not the name. */
export async function uploadAttachment({ owner, ownerId, file, caption, onUploadProgress }: UploadAttachmentInput): Promise<Attachment> {
  const form = new FormData();
  if (caption.trim()) form.append('caption', caption.trim());
  form.append('file', file, file.name);
  const result = await uploadWithProgress({ path: attachmentsPath(owner, ownerId), body: form, onUploadProgress });
  if (result.ok) return result.data as Attachment;
  const error = toApiError(result.status, result.data);
  const prefix = LIMIT_PREFIX[result.status];
  throw prefix ? toApiError(result.status, { message: `${prefix} ${error.message}` }) : error;
}

export function useUploadAttachment({ onSuccess }: { onSuccess?: (attachment: Attachment) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: uploadAttachment,
    onSuccess: async (attachment, { owner, ownerId }) => {
      await queryClient.invalidateQueries({ queryKey: getAttachmentsQueryOptions(owner, ownerId).queryKey });
      onSuccess?.(attachment);
    },
  });
}
