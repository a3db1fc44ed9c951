import { fireEvent, screen, waitFor } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { createLoginResponse } from '@/testing/data-generators';
import { mockFetch } from '@/testing/fetch-mock';
import { renderWithApp } from '@/testing/test-utils';
import { getSession } from '@/lib/session';
import { SignInForm } from '../sign-in-form';

function fillAndSubmit(email: string, password: string) {
  fireEvent.change(screen.getByLabelText(/e-mail/i), { target: { value: email } });
  fireEvent.change(screen.getByLabelText(/password/i), { target: { value: password } });
  fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
}

describe('<SignInForm>', () => {
  it('shows the server’s message when the credentials are refused', async () => {
    const { requests } = mockFetch([
      {
        method: 'POST',
        path: '/api/auth/login',
        status: 401,
        body: { statusCode: 401, message: 'Wrong e-mail or password', error: 'Unauthorized' },
      },
    ]);
    const onSuccess = vi.fn();
    renderWithApp(<SignInForm onSuccess={onSuccess} />, { path: '/sign-in' });

    fillAndSubmit(' tech@kilocycle.test ', 'not-the-password');

    expect((await screen.findByRole('alert')).textContent).toContain('Wrong e-mail or password');
    expect(requests[0].body).toEqual({ email: 'tech@kilocycle.test', password: 'not-the-password' });
    expect(onSuccess).not.toHaveBeenCalled();
    expect(getSession()).toBeNull();
    // The refusal is shown in the form, not repeated in a snackbar.
    expect(screen.getAllByRole('alert')).toHaveLength(1);
  });

  it('shows the throttling message on 429', async () => {
    mockFetch([
      {
        method: 'POST',
        path: '/api/auth/login',
        status: 429,
        body: { statusCode: 429, message: 'Too many failed sign-in attempts. Try again in a minute.' },
      },
    ]);
    renderWithApp(<SignInForm onSuccess={vi.fn()} />, { path: '/sign-in' });

    fillAndSubmit('tech@kilocycle.test', 'guess-number-eleven');

    expect((await screen.findByRole('alert')).textContent).toContain('Too many failed sign-in attempts. Try again in a minute.');
  });

  it('asks for both fields before sending anything', async () => {
    const { fetchMock } = mockFetch([]);
    renderWithApp(<SignInForm onSuccess={vi.fn()} />, { path: '/sign-in' });

    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByText('Enter your e-mail address')).toBeTruthy();
    expect(screen.getByText('Enter your password')).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('stores the session and reports success', async () => {
    const response = createLoginResponse({ role: 'lead', name: 'Ruth Penhaligon' });
    mockFetch([{ method: 'POST', path: '/api/auth/login', body: response }]);
    const onSuccess = vi.fn();
    renderWithApp(<SignInForm onSuccess={onSuccess} />, { path: '/sign-in' });

    fillAndSubmit('lead@kilocycle.test', 'kilocycle-demo');

    await waitFor(() => expect(onSuccess).toHaveBeenCalledWith(response));
    expect(getSession()).toEqual({ accessToken: response.accessToken, user: response.user });
  });
});
