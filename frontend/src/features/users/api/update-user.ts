import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdateUserRequest, User } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getUsersQueryOptions } from './get-users';

export type UpdateUserInput = { id: number; changes: UpdateUserRequest };

export function updateUser({ id, changes }: UpdateUserInput): Promise<User> {
  return api.patch<User>(`/users/${id}`, changes);
}

type UseUpdateUserOptions = { onSuccess?: (user: User) => void };

export function useUpdateUser({ onSuccess }: UseUpdateUserOptions = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateUser,
    onSuccess: async (user) => {
      await queryClient.invalidateQueries({ queryKey: getUsersQueryOptions().queryKey });
      onSuccess?.(user);
    },
  });
}
