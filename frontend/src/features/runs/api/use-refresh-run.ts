import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useEffect, useRef } from 'react';
import { getRunAnalysisQueryOptions } from './get-run-analysis';
import { getRunQueryOptions } from './get-run';

/** Fetches the run and its analysis again now (after a reading was stored or excluded). */
export function useRefreshRun(runId: number) {
  const queryClient = useQueryClient();
  return useCallback(
    () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: getRunQueryOptions(runId).queryKey }),
        queryClient.invalidateQueries({ queryKey: getRunAnalysisQueryOptions(runId).queryKey }),
      ]),
    [queryClient, runId],
  );
}

/**
 * For live runs: asks for the run and its analysis again at most once per `intervalMs`, and never
 * while a request is still on its way, so a stream of readings cannot queue up analyses.
 */
export function useThrottledRefreshRun(runId: number, intervalMs = 500, alsoRefresh?: () => Promise<unknown>) {
  const refreshRun = useRefreshRun(runId);
  const refresh = useCallback(() => Promise.all([refreshRun(), alsoRefresh?.()]), [refreshRun, alsoRefresh]);
  const latest = useRef(refresh);
  useEffect(() => {
    latest.current = refresh;
  }, [refresh]);
  const state = useRef({ busy: false, pending: false, last: 0, timer: null as ReturnType<typeof setTimeout> | null });

  useEffect(() => {
    const current = state.current;
    return () => {
      if (current.timer) clearTimeout(current.timer);
      current.timer = null;
    };
  }, []);

  return useCallback(() => {
    const s = state.current;
    const fire = async () => {
      s.timer = null;
      s.busy = true;
      s.pending = false;
      s.last = Date.now();
      try {
        await latest.current();
      } finally {
        s.busy = false;
      }
      if (s.pending) schedule();
    };
    function schedule() {
      if (s.busy) {
        s.pending = true;
        return;
      }
      if (s.timer) return;
      s.timer = setTimeout(() => void fire(), Math.max(0, s.last + intervalMs - Date.now()));
    }
    schedule();
  }, [intervalMs]);
}
