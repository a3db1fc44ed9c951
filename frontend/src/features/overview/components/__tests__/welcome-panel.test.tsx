import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { WelcomePanel } from '../welcome-panel';

describe('<WelcomePanel>', () => {
  it('greets the person with their role, organisation and what that role does', () => {
    signInAs({ name: 'Tomas Reyes', email: 'tech@kilocycle.test', role: 'technician', organizationId: 1 });
    renderWithApp(<WelcomePanel />);

    expect(screen.getByRole('heading', { level: 1 }).textContent).toMatch(/, Tomas Reyes$/);
    expect(screen.getByText('Technician')).toBeTruthy();
    expect(screen.getByText('#1')).toBeTruthy();
    expect(screen.getByText(/capture dial and counter readings/)).toBeTruthy();
    // Lab staff handle the equipment, so they get the hazardous-voltage caution.
    expect(screen.getByText(/hazardous voltages/)).toBeTruthy();
  });

  it('links an administrator to the admin pages', () => {
    signInAs({ role: 'admin' });
    renderWithApp(<WelcomePanel />);
    expect(screen.getByRole('link', { name: 'Users' }).getAttribute('href')).toBe('/admin/users');
    expect(screen.getByRole('link', { name: 'Organisations' }).getAttribute('href')).toBe('/admin/organisations');
  });

  it('shows a client no admin links and no bench caution', () => {
    signInAs({ role: 'client', organizationId: 2 });
    renderWithApp(<WelcomePanel />);
    expect(screen.getAllByRole('link').map((link) => link.textContent)).toEqual(['Jobs', 'Instruments', 'Certificates']);
    expect(screen.getByText(/certificates issued to you/)).toBeTruthy();
    expect(screen.queryByText(/hazardous voltages/)).toBeNull();
  });
});
