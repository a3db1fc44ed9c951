import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { createUser } from '@/testing/data-generators';
import { mockFetch } from '@/testing/fetch-mock';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { UsersTable } from '../users-table';

describe('<UsersTable>', () => {
  it('asks the server for page 1 sorted by name, and shows the rows it returns', async () => {
    signInAs({ id: 1, role: 'admin' });
    const { requests } = mockFetch([
      {
        path: '/api/users',
        body: {
          items: [createUser({ id: 1, name: 'Ada Marsh', role: 'admin' }), createUser({ id: 3, name: 'Tomas Reyes', email: 'tech@kilocycle.test' })],
          total: 2,
        },
      },
    ]);
    renderWithApp(<UsersTable organizations={[]} />, { path: '/admin/users', initialEntry: '/admin/users?page=1&sort=bogus' });

    expect(await screen.findByText('Tomas Reyes')).toBeTruthy();
    // A sort field the API does not know is dropped rather than sent.
    expect(requests[0].url).toBe('/api/users?page=1&pageSize=25&sort=name');
    expect(screen.getByText('tech@kilocycle.test')).toBeTruthy();
    // Nobody can deactivate their own account from here.
    expect(screen.getByRole('button', { name: 'Deactivate Ada Marsh' }).hasAttribute('disabled')).toBe(true);
  });

  it('deactivates a user after confirmation', async () => {
    signInAs({ id: 1, role: 'admin' });
    const tomas = createUser({ id: 3, name: 'Tomas Reyes' });
    const { requests } = mockFetch([
      { path: '/api/users', body: { items: [tomas], total: 1 } },
      { method: 'PATCH', path: '/api/users/3', body: { ...tomas, active: false } },
    ]);
    renderWithApp(<UsersTable organizations={[]} />, { path: '/admin/users' });

    fireEvent.click(await screen.findByRole('button', { name: 'Deactivate Tomas Reyes' }));
    const dialog = screen.getByRole('dialog', { name: 'Deactivate this account?' });
    fireEvent.click(within(dialog).getByRole('button', { name: 'Deactivate' }));

    await waitFor(() => expect(requests.some((r) => r.method === 'PATCH')).toBe(true));
    const patch = requests.find((r) => r.method === 'PATCH');
    expect(patch?.url).toBe('/api/users/3');
    expect(patch?.body).toEqual({ active: false });
    // The list is fetched again after the change.
    await waitFor(() => expect(requests.filter((r) => r.url.startsWith('/api/users?')).length).toBe(2));
  });
});
