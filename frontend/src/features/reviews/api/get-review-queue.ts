import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Job, ListJobsQuery, ListResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { sharedQueryKeys } from '@/lib/query-keys';

// The lead's queue: jobs the technicians have submitted, oldest first so nothing waits longest.
export type ReviewQueueQuery = Omit<ListJobsQuery, 'status'>;

export function getReviewQueue(query: ReviewQueueQuery = {}): Promise<ListResponse<Job>> {
  return api.get<ListResponse<Job>>('/jobs', { params: { ...query, status: 'in_review' } });
}

export const getReviewQueueQueryOptions = (query?: ReviewQueueQuery) =>
  queryOptions({
    queryKey: query ? [...sharedQueryKeys.reviews, 'queue', query] : [...sharedQueryKeys.reviews, 'queue'],
    queryFn: () => getReviewQueue(query),
  });

export function useReviewQueue({ query }: { query: ReviewQueueQuery }) {
  return useQuery({ ...getReviewQueueQueryOptions(query), placeholderData: keepPreviousData });
}
