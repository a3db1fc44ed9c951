import { screen, waitFor } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { createInvoice } from '@/testing/billing-generators';
import { mockFetch, type MockRoute } from '@/testing/fetch-mock';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { PaymentReturn } from '../payment-return';

const unpaid = createInvoice({ id: 5, number: 'INV-000005', status: 'issued', balanceMinor: 20400 });
const paid = createInvoice({ ...unpaid, status: 'paid', paidMinor: 20400, balanceMinor: 0 });
const certificate = (jobId: number) => <span>the certificate of job {jobId}</span>;

function renderReturn(query: string) {
  return renderWithApp(<PaymentReturn invoiceId={5} certificate={certificate} />, {
    path: '/portal/invoices/:invoiceId',
    initialEntry: `/portal/invoices/5${query}`,
  });
}

describe('<PaymentReturn>', () => {
  it('waits for the payment to be confirmed, then thanks the client and shows the certificate', async () => {
    signInAs({ role: 'client', organizationId: 2 });
    // The webhook lands a moment after the redirect: the first answer is still unpaid, the next ones paid.
    const invoiceRoute: MockRoute = { path: '/api/invoices/5', body: unpaid };
    const { requests } = mockFetch([invoiceRoute, { path: '/api/payments', body: { items: [], total: 0 } }]);
    renderReturn('?payment=done');

    expect(await screen.findByText('Confirming your payment with the card service…')).toBeTruthy();
    expect(screen.queryByText('Payment received — thank you.')).toBeNull();
    invoiceRoute.body = paid;

    expect(await screen.findByText('Payment received — thank you.', {}, { timeout: 4000 })).toBeTruthy();
    expect(screen.getByText('the certificate of job 11')).toBeTruthy();
    expect(screen.queryByRole('button', { name: /Pay by card/ })).toBeNull();
    const polls = requests.filter((r) => r.url === '/api/invoices/5').length;
    expect(polls).toBeGreaterThanOrEqual(2);
    // Once paid, the page stops asking.
    await new Promise((resolve) => setTimeout(resolve, 1500));
    expect(requests.filter((r) => r.url === '/api/invoices/5').length).toBeLessThanOrEqual(polls + 1);
  });

  it('says the payment was cancelled and offers the card again', async () => {
    signInAs({ role: 'client', organizationId: 2 });
    const { requests } = mockFetch([
      { path: '/api/invoices/5', body: unpaid },
      { path: '/api/payments', body: { items: [], total: 0 } },
    ]);
    renderReturn('?payment=cancelled');

    expect(await screen.findByText(/The payment was cancelled: nothing was charged/)).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Pay by card (invoice INV-000005)' })).toBeTruthy();
    expect(screen.queryByText('Payment received — thank you.')).toBeNull();
    // No polling without a payment to wait for.
    await new Promise((resolve) => setTimeout(resolve, 1200));
    await waitFor(() => expect(requests.filter((r) => r.url === '/api/invoices/5').length).toBe(1));
  });
});
