import { useMutation } from '@tanstack/react-query';
import type { ComparisonResult, ComputeComparisonRequest } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

/** Computes a comparison of the chosen runs now; nothing is saved. */
export function computeComparison(body: ComputeComparisonRequest): Promise<ComparisonResult> {
  return api.post<ComparisonResult>('/comparisons/compute', body, { notify: false });
}

export function useComputeComparison() {
  return useMutation({ mutationFn: computeComparison });
}
