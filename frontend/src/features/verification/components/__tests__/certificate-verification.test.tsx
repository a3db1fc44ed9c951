import { fireEvent, screen, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import type { CertificateCheckResult, PublicCertificate } from '@kilocycle/common/types';
import { mockFetch } from '@/testing/fetch-mock';
import { renderWithApp } from '@/testing/test-utils';
import { CertificateVerification } from '../certificate-verification';

const HASH = 'c7513c6d5a007481a84c359b493fc135bc5e91a0c1fa6e8711ef8324974de1c5';

const issued: PublicCertificate = {
  number: 'QL-2026-0001',
  revision: 1,
  status: 'issued',
  instrument: 'Harwick Radio VFO-3 variable frequency oscillator, serial N-0952',
  customer: 'Northgate Radio Club',
  issuedAt: '2026-11-25T11:20:00.000Z',
  sha256: HASH,
  revisions: [{ revision: 1, status: 'issued', issuedAt: '2026-11-25T11:20:00.000Z', sha256: HASH }],
};

function setup(check: CertificateCheckResult) {
  const mock = mockFetch([
    { path: '/api/public/certificates/QL-2026-0001', body: issued },
    { method: 'POST', path: '/api/public/certificates/QL-2026-0001/check', body: check },
  ]);
  renderWithApp(<CertificateVerification number="QL-2026-0001" onOtherNumber={vi.fn()} />);
  return mock;
}

async function upload(name: string) {
  const input = await screen.findByLabelText('Certificate PDF to check');
  const file = new File([new Uint8Array([0x25, 0x50, 0x44, 0x46])], name, { type: 'application/pdf' });
  fireEvent.change(input, { target: { files: [file] } });
}

describe('<CertificateVerification>', () => {
  it('shows the certificate’s status, instrument, customer and issue date, and no measurement data', async () => {
    setup({ match: true, sha256: HASH });
    const status = await screen.findByTestId('certificate-status');
    expect(status.textContent).toMatch(/^Valid: certificate QL-2026-0001, revision 1/);
    expect(screen.getByText('Northgate Radio Club')).toBeTruthy();
    expect(screen.getByText('Harwick Radio VFO-3 variable frequency oscillator, serial N-0952')).toBeTruthy();
    expect(screen.getByText('2026-11-25')).toBeTruthy();
    expect(screen.queryByText(/Hz/)).toBeNull();
  });

  it('says plainly that a matching file is the issued one', async () => {
    const { requests } = setup({ match: true, revision: 1, status: 'issued', sha256: HASH, signatureValid: true });
    await upload('QL-2026-0001-rev1.pdf');
    const result = await screen.findByTestId('check-result');
    expect(within(result).getByText('The file matches revision 1 of certificate QL-2026-0001')).toBeTruthy();
    expect(result.textContent).toMatch(/byte for byte the PDF the laboratory issued, and the laboratory’s signature of it is valid/);
    expect(requests[1]?.method).toBe('POST');
    expect(requests[1]?.headers.get('Content-Type')).toBe('application/pdf');
    // The public page sends no token, signed in or not.
    expect(requests[1]?.headers.get('Authorization')).toBeNull();
  });

  it('refuses a file that differs from every issued revision', async () => {
    setup({ match: false, sha256: '0'.repeat(64) });
    await upload('altered.pdf');
    const result = await screen.findByTestId('check-result');
    expect(within(result).getByText('Not the issued certificate')).toBeTruthy();
    expect(result.textContent).toMatch(/“altered.pdf” does not match any issued revision of certificate QL-2026-0001/);
    expect(result.textContent).toMatch(/Do not rely on it/);
    // The banner at the top no longer says "Valid" once the file in hand has failed the check.
    const status = screen.getByTestId('certificate-status');
    expect(status.textContent).not.toMatch(/Valid/);
    expect(status.textContent).toMatch(/^Your file is not the issued certificate QL-2026-0001/);
    expect(status.className).toMatch(/Error/);
  });

  it('keeps the banner valid, naming the file, when the file is the current revision', async () => {
    setup({ match: true, revision: 1, status: 'issued', sha256: HASH, signatureValid: true });
    await upload('QL-2026-0001-rev1.pdf');
    await screen.findByTestId('check-result');
    const status = screen.getByTestId('certificate-status');
    expect(status.textContent).toMatch(/^Valid: your file is certificate QL-2026-0001, revision 1/);
    expect(status.className).toMatch(/Success/);
  });

  it('warns at the top when the file is a superseded revision', async () => {
    setup({ match: true, revision: 1, status: 'superseded', sha256: HASH, signatureValid: true });
    await upload('QL-2026-0001-rev1.pdf');
    await screen.findByTestId('check-result');
    const status = screen.getByTestId('certificate-status');
    expect(status.textContent).toMatch(/^Superseded: your file is certificate QL-2026-0001, revision 1A later revision replaces this one/);
    expect(status.className).toMatch(/Warning/);
  });

  it('says at the top when the file matches but its signature does not verify', async () => {
    setup({ match: true, revision: 1, status: 'issued', sha256: HASH, signatureValid: false });
    await upload('QL-2026-0001-rev1.pdf');
    await screen.findByTestId('check-result');
    const status = screen.getByTestId('certificate-status');
    expect(status.textContent).toMatch(/its signature did not verify/);
    expect(status.className).toMatch(/Error/);
  });

  it('says when there is no certificate of that number', async () => {
    mockFetch([{ path: '/api/public/certificates/QL-2026-0001', status: 404, body: { statusCode: 404, message: 'No certificate numbered QL-2026-0001' } }]);
    renderWithApp(<CertificateVerification number="QL-2026-0001" onOtherNumber={vi.fn()} />);
    expect(await screen.findByText('No certificate numbered QL-2026-0001')).toBeTruthy();
  });
});
