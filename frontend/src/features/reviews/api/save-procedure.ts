import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateProcedureRequest, Procedure, UpdateProcedureRequest } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';
import { proceduresQueryKey } from './get-procedures';

export type SaveProcedureInput = { id: null; changes: CreateProcedureRequest } | { id: number; changes: UpdateProcedureRequest };

export function saveProcedure(input: SaveProcedureInput): Promise<Procedure> {
  return input.id === null
    ? api.post<Procedure>('/procedures', input.changes, { notify: false })
    : api.patch<Procedure>(`/procedures/${input.id}`, input.changes, { notify: false });
}

export function useSaveProcedure({ onSuccess }: { onSuccess?: (procedure: Procedure) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveProcedure,
    onSuccess: async (procedure) => {
      // Every procedure list, and every result computed from a procedure's defaults.
      await queryClient.invalidateQueries({ queryKey: proceduresQueryKey });
      await queryClient.invalidateQueries({ queryKey: sharedQueryKeys.reviews });
      onSuccess?.(procedure);
    },
  });
}
