import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { mockFetch } from '@/testing/fetch-mock';
import { createSessionUser } from '@/testing/data-generators';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { RequireAuth, RequireRole } from '../auth';
import { getSession } from '../session';

describe('<RequireAuth>', () => {
  it('sends a visitor without a session to sign-in, remembering the page', async () => {
    const { router } = renderWithApp(
      <RequireAuth>
        <p>secret</p>
      </RequireAuth>,
      { path: '/admin/users', routes: [{ path: '/sign-in', element: <p>sign-in page</p> }] },
    );

    expect(await screen.findByText('sign-in page')).toBeTruthy();
    expect(router.state.location.search).toBe('?next=%2Fadmin%2Fusers');
    expect(screen.queryByText('secret')).toBeNull();
  });

  it('checks the stored token with the server before showing the page', async () => {
    const user = signInAs({ role: 'engineer' });
    const { requests } = mockFetch([{ path: '/api/auth/me', body: user }]);
    renderWithApp(
      <RequireAuth>
        <p>secret</p>
      </RequireAuth>,
    );

    expect(await screen.findByText('secret')).toBeTruthy();
    expect(requests.map((r) => r.url)).toEqual(['/api/auth/me']);
  });

  it('drops a token the server no longer accepts', async () => {
    signInAs({ role: 'engineer' });
    mockFetch([{ path: '/api/auth/me', status: 401, body: { statusCode: 401, message: 'Account deactivated' } }]);
    renderWithApp(
      <RequireAuth>
        <p>secret</p>
      </RequireAuth>,
      { routes: [{ path: '/sign-in', element: <p>sign-in page</p> }] },
    );

    expect(await screen.findByText('sign-in page')).toBeTruthy();
    expect(getSession()).toBeNull();
    expect(screen.queryByText('secret')).toBeNull();
  });

  it('takes a role changed on the server since sign-in', async () => {
    const stored = signInAs({ role: 'technician', name: 'Old Name' });
    mockFetch([{ path: '/api/auth/me', body: { ...stored, role: 'lead', name: 'New Name' } }]);
    renderWithApp(
      <RequireAuth>
        <p>secret</p>
      </RequireAuth>,
    );

    await screen.findByText('secret');
    expect(getSession()?.user).toEqual(createSessionUser({ ...stored, role: 'lead', name: 'New Name' }));
  });
});

describe('<RequireRole>', () => {
  it('tells a role that may not open the page so, instead of showing it', () => {
    signInAs({ role: 'technician' });
    renderWithApp(
      <RequireRole roles={['admin']}>
        <p>user admin</p>
      </RequireRole>,
    );
    expect(screen.getByRole('heading', { name: 'Not allowed' })).toBeTruthy();
    expect(screen.queryByText('user admin')).toBeNull();
    expect(screen.getByRole('link', { name: 'Back to the overview' }).getAttribute('href')).toBe('/');
  });

  it('shows the page to an allowed role', () => {
    signInAs({ role: 'admin' });
    renderWithApp(
      <RequireRole roles={['admin']}>
        <p>user admin</p>
      </RequireRole>,
    );
    expect(screen.getByText('user admin')).toBeTruthy();
  });
});
