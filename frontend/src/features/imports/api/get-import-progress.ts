import { queryOptions } from '@tanstack/react-query';
import type { ImportProgress } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

/** The server's side of the progress bar now (after a reload, or events missed); 404 until the upload has reached the server. */
export function getImportProgress(importId: string): Promise<ImportProgress> {
  return api.get<ImportProgress>(`/imports/${encodeURIComponent(importId)}/progress`, { notify: false });
}

export const getImportProgressQueryOptions = (importId: string) =>
  queryOptions({
    queryKey: ['imports', 'progress', importId],
    queryFn: () => getImportProgress(importId),
  });
