import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListQuery, ListResponse, Role, User } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';

// The user list's filters on top of the common paging, sorting and search parameters.
export type UsersQuery = ListQuery & { role?: Role; organizationId?: number; active?: boolean };

export function getUsers(query: UsersQuery = {}): Promise<ListResponse<User>> {
  return api.get<ListResponse<User>>('/users', { params: query });
}

export const getUsersQueryOptions = (query?: UsersQuery) =>
  queryOptions({
    queryKey: query ? ['users', query] : ['users'],
    queryFn: () => getUsers(query),
  });

type UseUsersOptions = { query: UsersQuery };

export function useUsers({ query }: UseUsersOptions) {
  // Keep the current page on screen while the next one loads, so the grid does not flash empty.
  return useQuery({ ...getUsersQueryOptions(query), placeholderData: keepPreviousData });
}
