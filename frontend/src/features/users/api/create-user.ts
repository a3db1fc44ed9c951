import { useMutation, useQueryClient } from '@tanstack/react-query';
import { utf8Length } from '@kilocycle/common/rules';
import { MAX_PASSWORD_BYTES, MIN_PASSWORD_LENGTH, type CreateUserRequest, type User } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { looksLikeEmail } from '@/utils/validation';
import { getUsersQueryOptions } from './get-users';

export type CreateUserErrors = Partial<Record<keyof CreateUserRequest, string>>;

/** Checks before sending; the server checks again and its messages are shown as they come. */
export function validateCreateUser(input: CreateUserRequest): CreateUserErrors {
  const errors: CreateUserErrors = {};
  if (!looksLikeEmail(input.email)) errors.email = 'Enter a valid e-mail address';
  if (!input.name.trim()) errors.name = 'Enter the person’s name';
  if (!input.organizationId) errors.organizationId = 'Choose an organisation';
  if (input.password.length < MIN_PASSWORD_LENGTH)
    errors.password = `At least ${MIN_PASSWORD_LENGTH} characters (now ${input.password.length})`;
  // The same byte rule as the server's (bcrypt uses only the first 72 bytes); guessability is judged there.
  else if (utf8Length(input.password) > MAX_PASSWORD_BYTES)
    errors.password = `At most ${MAX_PASSWORD_BYTES} bytes (now ${utf8Length(input.password)}): longer passwords are not used in full`;
  return errors;
}

export function createUser(body: CreateUserRequest): Promise<User> {
  return api.post<User>('/users', body, { notify: false });
}

type UseCreateUserOptions = { onSuccess?: (user: User) => void };

export function useCreateUser({ onSuccess }: UseCreateUserOptions = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createUser,
    onSuccess: async (user) => {
      await queryClient.invalidateQueries({ queryKey: getUsersQueryOptions().queryKey });
      onSuccess?.(user);
    },
  });
}
