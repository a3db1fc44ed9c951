import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useRef, useState } from 'react';
import { io } from 'socket.io-client';
import {
  LIVE_EVENTS,
  liveReadings,
  NAMESPACES,
  type JoinReply,
  type LiveBridgeEvent,
  type LiveCaptureEvent,
  type LiveExclusionEvent,
  type LiveReadingsEvent,
  type RunBridgeChange,
} from '@kilocycle/common/events';
import type { Reading } from '@kilocycle/common/types';
import { getSession } from '@/lib/session';
import { runAnalysisQueryKey, runDetailQueryKey } from '@/lib/query-keys';
import { getLatestReadingsQueryOptions, mergeReadings } from '../api/get-latest-readings';
import { refreshReadingLists } from '../api/get-readings';

export type LiveState = 'connecting' | 'live' | 'offline' | 'refused';
/**
 * `state` is this page's own feed (its socket), not the bench: `bridge` is the latest bridge online/offline
 * event the server pushed for the run (null until one arrives: the run's own `bridge` field holds until then).
 */
export type LiveStatus = { state: LiveState; message: string | null; lastArrivalAt: number | null; bridge: RunBridgeChange | null };

type UseLiveReadingsOptions = {
  enabled?: boolean;
  /** Called with each batch the server stored, after the cache has it. */
  onReadings?: (readings: Reading[]) => void;
  /** Called with each change of a counter-assisted setting (progress, settled, ended). */
  onCapture?: (event: LiveCaptureEvent) => void;
};

/**
 * Follows a run live over socket.io (`/live`, signed in with the session's token): stored readings are merged
 * into the run's latest-readings query, so pages read them from React Query like any other server data; an
 * exclusion marks the reading there and refreshes the run's reading lists and analysis. Listens to every event
 * the server emits on `/live` (LIVE_EVENTS: readings, excluded, bridge, capture).
 */
export function useLiveReadings(runId: number, { enabled = true, onReadings, onCapture }: UseLiveReadingsOptions = {}): LiveStatus {
  const queryClient = useQueryClient();
  const [status, setStatus] = useState<LiveStatus>({ state: 'connecting', message: null, lastArrivalAt: null, bridge: null });
  const callback = useRef(onReadings);
  const captureCallback = useRef(onCapture);
  useEffect(() => {
    callback.current = onReadings;
    captureCallback.current = onCapture;
  }, [onReadings, onCapture]);

  useEffect(() => {
    if (!enabled) return;
    const token = getSession()?.accessToken;
    if (!token) {
      setStatus({ state: 'refused', message: 'Sign in again to follow the run live.', lastArrivalAt: null, bridge: null });
      return;
    }
    const key = getLatestReadingsQueryOptions(runId).queryKey;
    const socket = io(NAMESPACES.live, { auth: { token }, reconnectionDelayMax: 5000 });
    let joinedBefore = false;

    socket.on('connect', () => {
      setStatus((s) => ({ ...s, state: 'connecting', message: 'Joining the run…' }));
      socket.emit(LIVE_EVENTS.join, { runId }, (reply: JoinReply) => {
        if (reply.ok) {
          setStatus((s) => ({ ...s, state: 'live', message: null }));
          // After a reconnection, whatever arrived while away is fetched once (the run too: its bridge may have changed).
          if (joinedBefore) {
            void queryClient.invalidateQueries({ queryKey: key });
            void queryClient.invalidateQueries({ queryKey: runDetailQueryKey(runId) });
          }
          joinedBefore = true;
        } else {
          setStatus((s) => ({ ...s, state: 'refused', message: reply.error }));
        }
      });
    });
    socket.on('disconnect', (reason) => {
      // The server closes a socket whose session ended (sign-out, password or role change, deactivation)
      // or expired; socket.io does not reconnect then, so the page must not say it will.
      if (reason === 'io server disconnect') {
        setStatus((s) => ({ ...s, state: 'refused', message: 'The live feed was closed because your session ended. Sign in again to follow the run live.' }));
        return;
      }
      setStatus((s) => ({ ...s, state: 'offline', message: reason === 'io client disconnect' ? null : 'Connection lost; reconnecting…' }));
    });
    socket.on('connect_error', (error: Error) => {
      setStatus((s) => ({ ...s, state: 'offline', message: `Cannot reach the live feed: ${error.message}` }));
    });
    socket.on(LIVE_EVENTS.readings, (event: LiveReadingsEvent) => {
      if (event.runId !== runId || event.seq.length === 0) return;
      // The batch comes as columns, its author once beside them.
      const readings: Reading[] = liveReadings(event);
      queryClient.setQueryData<Reading[]>(key, (current) => mergeReadings(current, readings));
      setStatus((s) => ({ ...s, lastArrivalAt: Date.now() }));
      callback.current?.(readings);
    });

    // A reading excluded here or on another screen: the latest readings mark it at once, and the reading
    // tables, the run's counts and its analysis (the fit without it) are fetched again.
    socket.on(LIVE_EVENTS.excluded, (event: LiveExclusionEvent) => {
      if (event.runId !== runId) return;
      queryClient.setQueryData<Reading[]>(key, (current) => current?.map((r) => (r.id === event.reading.id ? event.reading : r)));
      void refreshReadingLists(queryClient, runId);
      void queryClient.invalidateQueries({ queryKey: runDetailQueryKey(runId) });
      void queryClient.invalidateQueries({ queryKey: runAnalysisQueryKey(runId) });
    });
    socket.on(LIVE_EVENTS.bridge, (event: LiveBridgeEvent) => {
      if (event.runId !== runId) return;
      setStatus((s) => ({ ...s, bridge: { connected: event.connected, since: event.since } }));
    });
    socket.on(LIVE_EVENTS.capture, (event: LiveCaptureEvent) => {
      if (event.runId === runId) captureCallback.current?.(event);
    });

    return () => {
      socket.emit(LIVE_EVENTS.leave, { runId });
      socket.disconnect();
    };
  }, [runId, enabled, queryClient]);

  return status;
}
