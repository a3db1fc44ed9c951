import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { io } from 'socket.io-client';
import { LIVE_EVENTS, NAMESPACES, type LiveImportProgressEvent } from '@kilocycle/common/events';
import { getSession } from '@/lib/session';
import { getImportProgressQueryOptions } from '../api/get-import-progress';

/**
 * An import's progress as the server pushes it over the live socket (`/live`, the user's own room, from whichever
 * node runs the import): each event replaces the query's data. While `active`, the socket is open; on each
 * (re)connection the state is fetched once, for whatever was pushed before the socket was there. No polling.
 */
export function useImportProgress(importId: string | null, active: boolean) {
  const queryClient = useQueryClient();
  const query = useQuery({ ...getImportProgressQueryOptions(importId ?? ''), enabled: false, retry: false });

  useEffect(() => {
    if (!active || importId === null) return;
    const token = getSession()?.accessToken;
    if (!token) return;
    const options = getImportProgressQueryOptions(importId);
    const socket = io(NAMESPACES.live, { auth: { token }, reconnectionDelayMax: 5000 });
    socket.on('connect', () => {
      void queryClient.fetchQuery({ ...options, retry: false, staleTime: 0 }).catch(() => undefined);
    });
    socket.on(LIVE_EVENTS.importProgress, async (event: LiveImportProgressEvent) => {
      if (event.importId !== importId) return;
      // A fetch still on its way holds an older state: it must not overwrite this one (nor an older event a newer one).
      await queryClient.cancelQueries({ queryKey: options.queryKey });
      queryClient.setQueryData(options.queryKey, (current) => (current && current.updatedAt > event.updatedAt ? current : event));
    });
    return () => {
      socket.disconnect();
    };
  }, [importId, active, queryClient]);

  return query;
}
