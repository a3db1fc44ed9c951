import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LoginRequest, LoginResponse } from '@kilocycle/common/types';
import { api } from '@/lib/api-client';
import { getMeQueryOptions } from '@/lib/auth';
import { setSession } from '@/lib/session';

export function login(body: LoginRequest): Promise<LoginResponse> {
  // The form shows the server's message itself, and a 401 here means wrong credentials, not an old session.
  return api.post<LoginResponse>('/auth/login', body, { notify: false, handleUnauthorized: false });
}

export function validateLogin({ email, password }: LoginRequest) {
  const errors: Partial<Record<keyof LoginRequest, string>> = {};
  if (!email.trim()) errors.email = 'Enter your e-mail address';
  if (!password) errors.password = 'Enter your password';
  return errors;
}

type UseLoginOptions = { onSuccess?: (response: LoginResponse) => void };

export function useLogin({ onSuccess }: UseLoginOptions = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: login,
    onSuccess: (response) => {
      queryClient.clear();
      // The server has just vouched for this token, so the start-up check need not ask again.
      queryClient.setQueryData(getMeQueryOptions(response.accessToken).queryKey, response.user);
      setSession({ accessToken: response.accessToken, user: response.user });
      onSuccess?.(response);
    },
  });
}
