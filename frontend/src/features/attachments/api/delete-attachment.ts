import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Attachment } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getAttachmentsQueryOptions } from './get-attachments';
import { getAttachmentFileQueryOptions } from './get-attachment-file';

export function deleteAttachment(attachment: Attachment): Promise<void> {
  return api.delete<void>(`/attachments/${attachment.id}`, { notify: false });
}

export function useDeleteAttachment({ onSuccess }: { onSuccess?: () => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteAttachment,
    onSuccess: async (_data, attachment) => {
      queryClient.removeQueries({ queryKey: getAttachmentFileQueryOptions(attachment).queryKey });
      await queryClient.invalidateQueries({
        queryKey: getAttachmentsQueryOptions(attachment.owner, (attachment.owner === 'instrument' ? attachment.instrumentId : attachment.jobId) ?? 0).queryKey,
      });
      onSuccess?.();
    },
  });
}
