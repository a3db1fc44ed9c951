import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { createOrganization, createUser } from '@/testing/data-generators';
import { mockFetch } from '@/testing/fetch-mock';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { CreateUser } from '../create-user';

const lab = createOrganization({ id: 1, name: 'Quarry Lane Frequency Lab', kind: 'lab' });
const northgate = createOrganization({ id: 2, name: 'Northgate Radio Club', kind: 'customer' });
const closed = createOrganization({ id: 3, name: 'Closed Customer', kind: 'customer', active: false });

function openDialog() {
  fireEvent.click(screen.getByRole('button', { name: 'New user' }));
  return screen.getByRole('dialog', { name: 'New user' });
}

function fill(dialog: HTMLElement, label: RegExp, value: string) {
  fireEvent.change(within(dialog).getByLabelText(label), { target: { value } });
}

function choose(dialog: HTMLElement, label: RegExp, option: string) {
  fireEvent.mouseDown(within(dialog).getByRole('combobox', { name: label }));
  fireEvent.click(screen.getByRole('option', { name: option }));
}

describe('<CreateUser>', () => {
  it('shows every message of a refused request inside the dialog', async () => {
    signInAs({ role: 'admin' });
    const { requests } = mockFetch([
      {
        method: 'POST',
        path: '/api/users',
        status: 400,
        body: {
          statusCode: 400,
          message: ['email must be an e-mail address', 'a client must belong to a customer organisation'],
          error: 'Bad Request',
        },
      },
    ]);
    renderWithApp(<CreateUser organizations={[lab, northgate, closed]} />);

    const dialog = openDialog();
    fill(dialog, /^name/i, 'Nia Penrose');
    fill(dialog, /e-mail/i, 'nia@northgate.test');
    choose(dialog, /role/i, 'Client');
    choose(dialog, /organisation/i, 'Northgate Radio Club');
    fill(dialog, /initial password/i, 'twelve-chars-ok');
    fireEvent.click(within(dialog).getByRole('button', { name: 'Create user' }));

    const alert = await within(dialog).findByRole('alert');
    expect(
      within(alert)
        .getAllByRole('listitem')
        .map((li) => li.textContent),
    ).toEqual(['email must be an e-mail address', 'a client must belong to a customer organisation']);
    expect(requests[0].body).toEqual({
      email: 'nia@northgate.test',
      name: 'Nia Penrose',
      role: 'client',
      organizationId: 2,
      password: 'twelve-chars-ok',
    });
    expect(screen.getByRole('dialog', { name: 'New user' })).toBeTruthy();
  });

  it('offers a client only active customer organisations, and lab staff only the lab', () => {
    signInAs({ role: 'admin' });
    renderWithApp(<CreateUser organizations={[lab, northgate, closed]} />);
    const dialog = openDialog();

    fireEvent.mouseDown(within(dialog).getByRole('combobox', { name: /organisation/i }));
    expect(screen.getAllByRole('option').map((o) => o.textContent)).toEqual(['Quarry Lane Frequency Lab']);
    fireEvent.keyDown(screen.getByRole('listbox'), { key: 'Escape' });

    choose(dialog, /role/i, 'Client');
    fireEvent.mouseDown(within(dialog).getByRole('combobox', { name: /organisation/i }));
    expect(screen.getAllByRole('option').map((o) => o.textContent)).toEqual(['Northgate Radio Club']);
  });

  it('refuses a password shorter than the minimum before sending', async () => {
    signInAs({ role: 'admin' });
    const { fetchMock } = mockFetch([]);
    renderWithApp(<CreateUser organizations={[lab]} />);
    const dialog = openDialog();

    fill(dialog, /^name/i, 'Short Password');
    fill(dialog, /e-mail/i, 'short@kilocycle.test');
    choose(dialog, /organisation/i, 'Quarry Lane Frequency Lab');
    fill(dialog, /initial password/i, 'elevenchars');
    fireEvent.click(within(dialog).getByRole('button', { name: 'Create user' }));

    expect(await within(dialog).findByText('At least 12 characters (now 11)')).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('refuses a password over 72 bytes before sending, counting bytes not characters', async () => {
    signInAs({ role: 'admin' });
    const { fetchMock } = mockFetch([]);
    renderWithApp(<CreateUser organizations={[lab]} />);
    const dialog = openDialog();

    fill(dialog, /^name/i, 'Long Password');
    fill(dialog, /e-mail/i, 'long@kilocycle.test');
    choose(dialog, /organisation/i, 'Quarry Lane Frequency Lab');
    // 25 characters of 3 bytes each in UTF-8: 75 bytes.
    fill(dialog, /initial password/i, '周'.repeat(25));
    fireEvent.click(within(dialog).getByRole('button', { name: 'Create user' }));

    expect(await within(dialog).findByText('At most 72 bytes (now 75): longer passwords are not used in full')).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it("shows the server's refusal of a guessable password under the password field, and clears it on a new one", async () => {
    signInAs({ role: 'admin' });
    mockFetch([
      {
        method: 'POST',
        path: '/api/users',
        status: 400,
        body: { statusCode: 400, message: ['password is too easy to guess: This is a commonly used password.'], error: 'Bad Request' },
      },
    ]);
    renderWithApp(<CreateUser organizations={[lab]} />);
    const dialog = openDialog();

    fill(dialog, /^name/i, 'Weak Password');
    fill(dialog, /e-mail/i, 'weak@kilocycle.test');
    choose(dialog, /organisation/i, 'Quarry Lane Frequency Lab');
    fill(dialog, /initial password/i, '123456789012');
    fireEvent.click(within(dialog).getByRole('button', { name: 'Create user' }));

    expect(await within(dialog).findByText('Password is too easy to guess: This is a commonly used password.')).toBeTruthy();
    expect(within(dialog).queryByRole('alert')).toBeNull();
    fill(dialog, /initial password/i, '123456789012x');
    expect(within(dialog).queryByText(/too easy to guess/)).toBeNull();
  });

  it('closes and refreshes the user list after creating the account', async () => {
    signInAs({ role: 'admin' });
    const created = createUser({ name: 'New Technician', role: 'technician' });
    mockFetch([{ method: 'POST', path: '/api/users', status: 201, body: created }]);
    const { queryClient } = renderWithApp(<CreateUser organizations={[lab]} />);
    queryClient.setQueryData(['users', { page: 1 }], { items: [], total: 0 });
    const dialog = openDialog();

    fill(dialog, /^name/i, 'New Technician');
    fill(dialog, /e-mail/i, created.email);
    choose(dialog, /organisation/i, 'Quarry Lane Frequency Lab');
    fill(dialog, /initial password/i, 'a-long-enough-password');
    fireEvent.click(within(dialog).getByRole('button', { name: 'Create user' }));

    await waitFor(() => expect(screen.queryByRole('dialog', { name: 'New user' })).toBeNull());
    expect(queryClient.getQueryState(['users', { page: 1 }])?.isInvalidated).toBe(true);
    expect(screen.getByText('Account created for New Technician.')).toBeTruthy();
  });
});
