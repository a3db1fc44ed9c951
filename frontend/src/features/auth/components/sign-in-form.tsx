import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Stack from '@mui/material/Stack';
import TextField from '@mui/material/TextField';
import { useState, type FormEvent } from 'react';
import type { LoginRequest, LoginResponse } from '@kilocycle/common/types';
import { ApiError } from '@/lib/api-client';
import { useLogin, validateLogin } from '../api/login';

type SignInFormProps = { onSuccess: (response: LoginResponse) => void };

function describeError(error: unknown) {
  if (error instanceof ApiError) return error.message;
  return 'Signing in failed. Try again.';
}

export function SignInForm({ onSuccess }: SignInFormProps) {
  const [values, setValues] = useState<LoginRequest>({ email: '', password: '' });
  const [fieldErrors, setFieldErrors] = useState<Partial<Record<keyof LoginRequest, string>>>({});
  const login = useLogin({ onSuccess });

  const handleSubmit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const errors = validateLogin(values);
    setFieldErrors(errors);
    if (Object.keys(errors).length > 0) return;
    login.mutate({ email: values.email.trim(), password: values.password });
  };

  const change = (field: keyof LoginRequest) => (event: { target: { value: string } }) => {
    setValues((current) => ({ ...current, [field]: event.target.value }));
    if (fieldErrors[field]) setFieldErrors((current) => ({ ...current, [field]: undefined }));
  };

  return (
    <Box component="form" noValidate onSubmit={handleSubmit} aria-label="Sign in">
      <Stack spacing={2}>
        {login.isError && (
          <Alert severity={login.error instanceof ApiError && login.error.status === 429 ? 'warning' : 'error'} role="alert">
            {describeError(login.error)}
          </Alert>
        )}
        <TextField
          label="E-mail"
          type="email"
          name="email"
          autoComplete="username"
          autoFocus
          required
          value={values.email}
          onChange={change('email')}
          error={Boolean(fieldErrors.email)}
          helperText={fieldErrors.email}
        />
        <TextField
          label="Password"
          type="password"
          name="password"
          autoComplete="current-password"
          required
          value={values.password}
          onChange={change('password')}
          error={Boolean(fieldErrors.password)}
          helperText={fieldErrors.password}
        />
        <Button type="submit" variant="contained" size="large" disabled={login.isPending}>
          {login.isPending ? 'Signing in…' : 'Sign in'}
        </Button>
      </Stack>
    </Box>
  );
}
