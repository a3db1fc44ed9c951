import { useMutation, useQueryClient } from '@tanstack/react-query';
import { FIELD_LIMITS } from '@kilocycle/common/rules';
import type { Bench, CreateBenchRequest } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { optionalId, optionalText, requiredText } from '@/utils/form-schema';
import { getBenchesQueryOptions } from './get-benches';

/** The new-bench form; the server checks again. */
export const createBenchSchema = z.object({
  name: requiredText(FIELD_LIMITS.bench.name.max, 'Give the bench a name'),
  location: optionalText(FIELD_LIMITS.bench.location.max),
  defaultStandardId: optionalId,
}) satisfies z.ZodType<CreateBenchRequest, unknown>;

export function createBench(body: CreateBenchRequest): Promise<Bench> {
  return api.post<Bench>('/benches', body, { notify: false });
}

export function useCreateBench({ onSuccess }: { onSuccess?: (bench: Bench) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createBench,
    onSuccess: async (bench) => {
      await queryClient.invalidateQueries({ queryKey: getBenchesQueryOptions().queryKey });
      onSuccess?.(bench);
    },
  });
}
