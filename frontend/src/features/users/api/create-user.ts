import { useMutation, useQueryClient } from '@tanstack/react-query';
import { FIELD_LIMITS, utf8Length } from '@kilocycle/common/rules';
import { MAX_PASSWORD_BYTES, MIN_PASSWORD_LENGTH, ROLES, type CreateUserRequest, type User } from '@kilocycle/common/types';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { looksLikeEmail } from '@/utils/validation';
import { getUsersQueryOptions } from './get-users';

const { user: LIMITS } = FIELD_LIMITS;

/** The new-user form: checked before sending; the server checks again and its messages are shown as they come. */
export const createUserSchema = z.object({
  name: z.string().trim().min(1, 'Enter the person’s name').max(LIMITS.name.max, `At most ${LIMITS.name.max} characters`),
  email: z.string().trim().max(LIMITS.email.max, `At most ${LIMITS.email.max} characters`).refine(looksLikeEmail, 'Enter a valid e-mail address'),
  role: z.enum(ROLES),
  organizationId: z
    .string()
    .refine((id) => id !== '', 'Choose an organisation')
    .transform(Number),
  password: z.string().superRefine((password, context) => {
    if (password.length < MIN_PASSWORD_LENGTH)
      context.addIssue({ code: 'custom', message: `At least ${MIN_PASSWORD_LENGTH} characters (now ${password.length})` });
    // The same byte rule as the server's (bcrypt uses only the first 72 bytes); guessability is judged there.
    else if (utf8Length(password) > MAX_PASSWORD_BYTES)
      context.addIssue({
        code: 'custom',
        message: `At most ${MAX_PASSWORD_BYTES} bytes (now ${utf8Length(password)}): longer passwords are not used in full`,
      });
  }),
}) satisfies z.ZodType<CreateUserRequest, unknown>;

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
