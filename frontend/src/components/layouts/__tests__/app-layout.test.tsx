import { fireEvent, screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { RequireAuth } from '@/lib/auth';
import { getSession } from '@/lib/session';
import { mockFetch } from '@/testing/fetch-mock';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { AppLayout } from '../app-layout';

describe('<AppLayout>', () => {
  it('shows an administrator the admin pages as links in the main navigation', () => {
    signInAs({ role: 'admin', name: 'Ada Quarry' });
    renderWithApp(<AppLayout>page</AppLayout>);

    const nav = screen.getByRole('navigation', { name: 'Main' });
    const links = within(nav)
      .getAllByRole('link')
      .map((link) => link.textContent);
    expect(links).toEqual([
      'Overview',
      'Jobs',
      'Instruments',
      'Standards',
      'Benches',
      'Certificates',
      'Invoices',
      'Prices',
      'Outbox',
      'Users',
      'Organisations',
    ]);
    expect(within(nav).getByRole('link', { name: 'Users' }).getAttribute('href')).toBe('/admin/users');
    // A list holds only list items (axe's "list" rule): one item per link.
    expect(within(nav).getAllByRole('listitem')).toHaveLength(links.length);
    expect(within(nav).getByRole('list').querySelectorAll(':scope > :not(li)')).toHaveLength(0);
    expect(screen.getByText('Kilocycle')).toBeTruthy();
    expect(screen.getByText('Ada Quarry')).toBeTruthy();
    expect(screen.getByText('Administrator')).toBeTruthy();
  });

  it('shows a client only the overview, its jobs and instruments, its certificates, quotes and invoices', () => {
    signInAs({ role: 'client', name: 'Nia Northgate' });
    renderWithApp(<AppLayout>page</AppLayout>);

    const nav = screen.getByRole('navigation', { name: 'Main' });
    expect(
      within(nav)
        .getAllByRole('link')
        .map((link) => link.textContent),
    ).toEqual(['Overview', 'Jobs', 'Instruments', 'Certificates', 'Quotes', 'Invoices']);
    expect(within(nav).getByRole('link', { name: 'Invoices' }).getAttribute('href')).toBe('/portal/invoices');
    expect(within(nav).queryByRole('link', { name: 'Users' })).toBeNull();
    expect(within(nav).queryByRole('link', { name: 'Prices' })).toBeNull();
  });

  it('signs out on the server and forgets the session', async () => {
    const user = signInAs({ role: 'engineer' });
    const { requests } = mockFetch([
      { path: '/api/auth/me', body: user },
      { method: 'POST', path: '/api/auth/logout', status: 204 },
    ]);
    const { router } = renderWithApp(
      <RequireAuth>
        <AppLayout>page</AppLayout>
      </RequireAuth>,
      { routes: [{ path: '/sign-in', element: <p>sign-in page</p> }] },
    );

    fireEvent.click(await screen.findByRole('button', { name: 'Sign out' }));

    expect(await screen.findByText('sign-in page')).toBeTruthy();
    expect(router.state.location.pathname).toBe('/sign-in');
    // Signing out on purpose does not ask to come back to the same page.
    expect(router.state.location.search).toBe('');
    expect(requests.map((r) => `${r.method} ${r.url}`)).toEqual(['GET /api/auth/me', 'POST /api/auth/logout']);
    expect(requests[1].headers.get('Authorization')).toBe('Bearer test-token');
    expect(getSession()).toBeNull();
  });
});
