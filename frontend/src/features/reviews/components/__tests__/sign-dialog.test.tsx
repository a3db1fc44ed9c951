import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { SIGNING_MEANING, type CertificateDetail } from '@kilocycle/common/types';
import { getSession } from '@/lib/session';
import { mockFetch } from '@/testing/fetch-mock';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { SignDialog } from '../sign-dialog';

function renderDialog(onSigned = vi.fn(), onClose = vi.fn()) {
  renderWithApp(
    <SignDialog
      open
      jobId={7}
      jobNumber="J2026-0007"
      customer="Northgate Radio Club"
      instrument="Harwick Radio SG-4 signal generator, serial N-1041"
      onClose={onClose}
      onSigned={onSigned}
    />,
  );
  return { dialog: screen.getByRole('dialog', { name: 'Sign and issue the certificate' }), onSigned, onClose };
}

const signButton = (dialog: HTMLElement) => within(dialog).getByRole('button', { name: 'Sign and issue' });

describe('<SignDialog>', () => {
  it('states the meaning of the signature and who signs', () => {
    signInAs({ role: 'lead', name: 'Lena Brandt' });
    const { dialog } = renderDialog();
    expect(within(dialog).getByTestId('signing-meaning').textContent).toBe('Reviewed and approved for issue');
    expect(within(dialog).getByText(/Signed by Lena Brandt, calibration lead/)).toBeTruthy();
  });

  it('asks for the password before sending anything', async () => {
    signInAs({ role: 'lead' });
    const { fetchMock } = mockFetch([]);
    const { dialog } = renderDialog();
    fireEvent.click(signButton(dialog));
    expect(await within(dialog).findByText('Enter your password to sign')).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('shows the server’s refusal, keeps the dialog open and the session alive when the password is refused', async () => {
    signInAs({ role: 'lead' }, 'lead-token');
    const { requests } = mockFetch([
      {
        method: 'POST',
        path: '/api/jobs/7/sign',
        status: 401,
        body: { statusCode: 401, message: 'Password is not right: the job was not signed', error: 'Unauthorized' },
      },
    ]);
    const { dialog, onSigned, onClose } = renderDialog();
    fireEvent.change(within(dialog).getByLabelText(/your password/i), { target: { value: 'not-my-password' } });
    fireEvent.click(signButton(dialog));

    const alert = await within(dialog).findByRole('alert');
    expect(alert.textContent).toBe('Password is not right: the job was not signed');
    expect(screen.getByRole('dialog', { name: 'Sign and issue the certificate' })).toBeTruthy();
    expect(getSession()?.accessToken).toBe('lead-token');
    expect(onSigned).not.toHaveBeenCalled();
    expect(onClose).not.toHaveBeenCalled();
    expect(requests[0]?.body).toEqual({ password: 'not-my-password', meaning: SIGNING_MEANING });
    expect(requests[0]?.headers.get('Authorization')).toBe('Bearer lead-token');
  });

  it('shows a 403 refusal the same way', async () => {
    signInAs({ role: 'lead' });
    mockFetch([
      {
        method: 'POST',
        path: '/api/jobs/7/sign',
        status: 403,
        body: { statusCode: 403, message: 'You captured runs of this job yourself: another lead must sign it', error: 'Forbidden' },
      },
    ]);
    const { dialog } = renderDialog();
    fireEvent.change(within(dialog).getByLabelText(/your password/i), { target: { value: 'right-password' } });
    fireEvent.click(signButton(dialog));
    expect((await within(dialog).findByRole('alert')).textContent).toMatch(/another lead must sign it/);
  });

  it('hands the issued certificate on when signing succeeds', async () => {
    signInAs({ role: 'lead' });
    const certificate = { id: 3, number: 'QL-2026-0003', revision: 1, status: 'issued' } as CertificateDetail;
    mockFetch([{ method: 'POST', path: '/api/jobs/7/sign', body: certificate }]);
    const { dialog, onSigned } = renderDialog();
    fireEvent.change(within(dialog).getByLabelText(/your password/i), { target: { value: 'right-password' } });
    fireEvent.click(signButton(dialog));
    await waitFor(() => expect(onSigned).toHaveBeenCalledWith(certificate));
  });
});
