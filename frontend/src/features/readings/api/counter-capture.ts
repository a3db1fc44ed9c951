import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import type { CaptureState, CounterCapture, StartCaptureRequest } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

/** GET /api/runs/:id/capture: the setting waiting for the counter, the next dial mark and the procedure's rule. */
export function getCaptureState(runId: number): Promise<CaptureState> {
  return api.get<CaptureState>(`/runs/${runId}/capture`);
}

export const getCaptureStateQueryOptions = (runId: number) =>
  queryOptions({ queryKey: [...sharedQueryKeys.runs, runId, 'capture'], queryFn: () => getCaptureState(runId) });

export function useCaptureState({ runId, enabled = true }: { runId: number; enabled?: boolean }) {
  return useQuery({ ...getCaptureStateQueryOptions(runId), enabled });
}

/** POST: the dial is typed, the counter fills the reading (refused with a 409 naming why when no bridge is live). */
export function startCapture({ runId, body }: { runId: number; body: StartCaptureRequest }): Promise<CounterCapture> {
  return api.post<CounterCapture>(`/runs/${runId}/capture`, body, { notify: false });
}

/** DELETE: Esc abandons the waiting setting; nothing is stored for it. */
export function abandonCapture({ runId }: { runId: number }): Promise<CounterCapture> {
  return api.delete<CounterCapture>(`/runs/${runId}/capture`, { notify: false });
}

export function useStartCapture() {
  return useMutation({ mutationFn: startCapture });
}

export function useAbandonCapture() {
  return useMutation({ mutationFn: abandonCapture });
}
