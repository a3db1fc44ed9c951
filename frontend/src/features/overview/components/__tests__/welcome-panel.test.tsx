import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { Organization } from '@kilocycle/common/types';
import { mockFetch } from '@/testing/fetch-mock';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { WelcomePanel } from '../welcome-panel';

const organization = (id: number, name: string): Organization => ({
  id,
  name,
  kind: id === 1 ? 'lab' : 'customer',
  contactEmail: null,
  active: true,
  createdAt: '2026-01-05T09:00:00.000Z',
});

describe('<WelcomePanel>', () => {
  it('greets the person with their role, organisation (by name) and what that role does', async () => {
    const { requests } = mockFetch([{ path: '/api/organizations/1', body: organization(1, 'Fenwick Frequency Workshop') }]);
    signInAs({ name: 'Tomas Reyes', email: 'tech@kilocycle.test', role: 'technician', organizationId: 1 });
    renderWithApp(<WelcomePanel />);

    expect(screen.getByRole('heading', { level: 1 }).textContent).toMatch(/, Tomas Reyes$/);
    expect(screen.getByText('Technician')).toBeTruthy();
    expect(await screen.findByText('Fenwick Frequency Workshop')).toBeTruthy();
    expect(screen.queryByText('#1')).toBeNull();
    expect(requests.map((r) => r.method + ' ' + new URL(r.url, 'http://localhost').pathname)).toEqual(['GET /api/organizations/1']);
    expect(screen.getByText(/capture dial and counter readings/)).toBeTruthy();
    // Lab staff handle the equipment, so they get the hazardous-voltage caution.
    expect(screen.getByText(/hazardous voltages/)).toBeTruthy();
  });

  it('falls back to the organisation number when its record cannot be read', async () => {
    mockFetch([{ path: '/api/organizations/7', status: 404, body: { statusCode: 404, message: 'Organisation 7 not found' } }]);
    signInAs({ role: 'engineer', organizationId: 7 });
    renderWithApp(<WelcomePanel />);
    expect(await screen.findByText('#7')).toBeTruthy();
  });

  it('links an administrator to the admin pages', () => {
    mockFetch([{ path: '/api/organizations/1', body: organization(1, 'Fenwick Frequency Workshop') }]);
    signInAs({ role: 'admin', organizationId: 1 });
    renderWithApp(<WelcomePanel />);
    expect(screen.getByRole('link', { name: 'Users' }).getAttribute('href')).toBe('/admin/users');
    expect(screen.getByRole('link', { name: 'Organisations' }).getAttribute('href')).toBe('/admin/organisations');
  });

  it('shows a client no admin links and no bench caution', () => {
    mockFetch([{ path: '/api/organizations/2', body: organization(2, 'Northgate Radio Club') }]);
    signInAs({ role: 'client', organizationId: 2 });
    renderWithApp(<WelcomePanel />);
    expect(screen.getAllByRole('link').map((link) => link.textContent)).toEqual(['Jobs', 'Instruments', 'Certificates', 'Quotes', 'Invoices']);
    expect(screen.getByText(/certificates issued to you/)).toBeTruthy();
    expect(screen.queryByText(/hazardous voltages/)).toBeNull();
  });
});
