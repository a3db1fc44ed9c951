import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { Payment } from '@kilocycle/common/types';
import { createInvoice } from '@/testing/billing-generators';
import { mockFetch } from '@/testing/fetch-mock';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { InvoicePanel } from '../invoice-panel';

const invoice = createInvoice({
  id: 5,
  number: 'INV-000005',
  status: 'part_paid',
  paidMinor: 10000,
  balanceMinor: 10400,
  overdue: true,
  dueDate: '2025-03-24',
});
const payment: Payment = {
  id: 9,
  invoiceId: 5,
  invoiceNumber: 'INV-000005',
  organizationId: 2,
  status: 'succeeded',
  amountMinor: 10000,
  refundedMinor: 0,
  currency: 'EUR',
  providerSessionId: 'cs_test_1',
  providerPaymentId: 'pi_test_1',
  failureMessage: null,
  createdAt: '2025-03-12T10:00:00.000Z',
  updatedAt: '2025-03-12T10:00:00.000Z',
};

function routes() {
  return mockFetch([
    { path: '/api/invoices', body: { items: [invoice], total: 1 } },
    { path: '/api/payments', body: { items: [payment], total: 1 } },
    { method: 'POST', path: '/api/payments/9/refund', status: 201, body: { ...payment, status: 'part_refunded', refundedMinor: 2550 } },
    { method: 'POST', path: '/api/invoices/5/credit-notes', status: 201, body: { id: 1, number: 'CN-000001' } },
  ]);
}

describe('<InvoicePanel>', () => {
  it('shows the state, due date and the server’s paid and balance figures', async () => {
    signInAs({ role: 'technician' });
    routes();
    renderWithApp(<InvoicePanel jobId={11} jobIssued />);

    expect(await screen.findByText('Part paid')).toBeTruthy();
    expect(screen.getByText('Overdue')).toBeTruthy();
    expect(screen.getByText('2025-03-24')).toBeTruthy();
    expect(screen.getByText('€104.00')).toBeTruthy(); // balance as sent, 10400 cents
    // Reading is not billing: no credit note and no refund for a technician.
    expect(screen.queryByRole('button', { name: 'Raise credit note' })).toBeNull();
    expect(await screen.findByRole('table', { name: 'Payments of invoice INV-000005' })).toBeTruthy();
    expect(screen.queryByRole('button', { name: /Refund/ })).toBeNull();
  });

  it('refunds part of a card payment with a reason, the amount read exactly', async () => {
    signInAs({ role: 'lead' });
    const { requests } = routes();
    renderWithApp(<InvoicePanel jobId={11} jobIssued />);

    fireEvent.click(await screen.findByRole('button', { name: 'Refund the payment of €100.00' }));
    const dialog = await screen.findByRole('dialog', { name: 'Refund to the card' });
    const amount = within(dialog).getByLabelText(/Amount/) as HTMLInputElement;
    expect(amount.value).toBe('100.00');
    fireEvent.change(amount, { target: { value: '25,50' } });
    fireEvent.change(within(dialog).getByLabelText(/Reason/), { target: { value: 'One range was not calibrated' } });
    fireEvent.click(within(dialog).getByRole('button', { name: 'Refund' }));

    await waitFor(() => expect(requests.some((r) => r.url === '/api/payments/9/refund')).toBe(true));
    expect(requests.find((r) => r.url === '/api/payments/9/refund')?.body).toEqual({ amountMinor: 2550, reason: 'One range was not calibrated' });
  });

  it('raises a credit note and refuses more than the invoice’s total before sending', async () => {
    signInAs({ role: 'admin' });
    const { requests } = routes();
    renderWithApp(<InvoicePanel jobId={11} jobIssued />);

    fireEvent.click(await screen.findByRole('button', { name: 'Raise credit note' }));
    const dialog = await screen.findByRole('dialog', { name: 'Credit note against invoice INV-000005' });
    fireEvent.change(within(dialog).getByLabelText(/Amount/), { target: { value: '204.01' } });
    fireEvent.change(within(dialog).getByLabelText(/Reason/), { target: { value: 'Goodwill' } });
    fireEvent.click(within(dialog).getByRole('button', { name: 'Raise credit note' }));
    expect(await within(dialog).findByText('At most €204.00')).toBeTruthy();

    fireEvent.change(within(dialog).getByLabelText(/Amount/), { target: { value: '12' } });
    fireEvent.click(within(dialog).getByRole('button', { name: 'Raise credit note' }));
    await waitFor(() => expect(requests.some((r) => r.url === '/api/invoices/5/credit-notes')).toBe(true));
    expect(requests.find((r) => r.url === '/api/invoices/5/credit-notes')?.body).toEqual({ amountMinor: 1200, reason: 'Goodwill' });
  });
});
