import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { createBillingLine, createQuote, createTotals } from '@/testing/billing-generators';
import { mockFetch } from '@/testing/fetch-mock';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { QuotePanel } from '../quote-panel';

const draft = createQuote({ id: 7, number: 'Q-000007', jobId: 11 });

// The line the lead adds: 1.5 hours of study at 49.99 with 20 % tax. Worked by hand: net 1.5 × 49.99 = 74.985 →
// 74.99; tax 20 % of 74.99 = 14.998 → 15.00; total 89.99. With the first line (net 170.00, tax 34.00), the quote
// is net 244.99, tax 49.00, total 293.99. The page must show these as the server sends them.
const hourLine = createBillingLine({
  position: 2,
  priceItemId: null,
  code: null,
  description: 'Warm-up study',
  unit: 'per_hour',
  quantityMilli: 1500,
  unitPriceMinor: 4999,
  netMinor: 7499,
  taxMinor: 1500,
  grossMinor: 8999,
});
const priced = createQuote({
  ...draft,
  lines: [...draft.lines, hourLine],
  totals: createTotals({ netMinor: 24499, taxMinor: 4900, grossMinor: 29399, byRate: [{ rateBasisPoints: 2000, netMinor: 24499, taxMinor: 4900 }] }),
});

function routes(patchAnswer: { status?: number; body: unknown } = { body: priced }) {
  return mockFetch([
    { path: '/api/quotes', body: { items: [draft], total: 1 } },
    { path: '/api/prices/items', body: { items: [], total: 0, currency: 'EUR' } },
    { method: 'PATCH', path: '/api/quotes/7', ...patchAnswer },
  ]);
}

async function addLine(quantity: string, unitPrice: string) {
  fireEvent.click(await screen.findByRole('button', { name: 'Add a line' }));
  const dialog = await screen.findByRole('dialog', { name: 'Add a line' });
  fireEvent.change(within(dialog).getByLabelText(/Description/), { target: { value: 'Warm-up study' } });
  fireEvent.mouseDown(within(dialog).getByRole('combobox', { name: /Unit/ }));
  fireEvent.click(await screen.findByRole('option', { name: 'Per hour of study' }));
  fireEvent.change(within(dialog).getByLabelText(/Quantity/), { target: { value: quantity } });
  fireEvent.change(within(dialog).getByLabelText(/Unit price/), { target: { value: unitPrice } });
  fireEvent.click(within(dialog).getByRole('button', { name: 'Add the line' }));
  return dialog;
}

describe('<QuotePanel>', () => {
  it('reads a typed quantity and price exactly and sends the whole list in thousandths and minor units', async () => {
    signInAs({ role: 'lead' });
    const { requests } = routes();
    renderWithApp(<QuotePanel jobId={11} />);

    expect(await screen.findByRole('table', { name: 'Lines of quote Q-000007' })).toBeTruthy();
    expect(requests[0]?.url).toBe('/api/quotes?jobId=11&sort=-createdAt&pageSize=50');
    // A decimal comma and a price as typed at the bench: "1,5" hours at "49.99".
    await addLine('1,5', '49.99');

    await waitFor(() => expect(requests.some((r) => r.method === 'PATCH')).toBe(true));
    const patch = requests.find((r) => r.method === 'PATCH');
    expect(patch?.body).toEqual({
      lines: [
        { priceItemId: 1, code: 'CAL-RANGE', description: 'Calibration of one range', unit: 'per_range', quantityMilli: 2000, unitPriceMinor: 8500 },
        { priceItemId: null, code: null, description: 'Warm-up study', unit: 'per_hour', quantityMilli: 1500, unitPriceMinor: 4999 },
      ],
    });
  });

  it('shows the line and the totals as the server computed them', async () => {
    signInAs({ role: 'lead' });
    mockFetch([{ path: '/api/quotes', body: { items: [priced], total: 1 } }]);
    renderWithApp(<QuotePanel jobId={11} />);

    const lines = await screen.findByRole('table', { name: 'Lines of quote Q-000007' });
    const row = within(lines).getByText('Warm-up study').closest('tr');
    expect(row).toBeTruthy();
    expect(within(row as HTMLElement).getByText('1.5 h')).toBeTruthy();
    expect(within(row as HTMLElement).getByText('€49.99')).toBeTruthy();
    expect(within(row as HTMLElement).getByText('€74.99')).toBeTruthy();
    expect(within(row as HTMLElement).getByText('€15.00')).toBeTruthy();
    expect(within(row as HTMLElement).getAllByText('€89.99').length).toBeGreaterThan(0);
    const totals = screen.getByRole('table', { name: 'Totals' });
    expect(within(totals).getByText('€244.99')).toBeTruthy();
    expect(within(totals).getByText('Tax at 20 %')).toBeTruthy();
    expect(within(totals).getByText('€49.00')).toBeTruthy();
    expect(within(totals).getByText('€293.99')).toBeTruthy();
  });

  it('refuses a price with a third decimal or in words before anything is sent', async () => {
    signInAs({ role: 'admin' });
    const { requests } = routes();
    renderWithApp(<QuotePanel jobId={11} />);

    const dialog = await addLine('1.5', '49.999');
    expect(await within(dialog).findByText('"49.999" has more than 2 decimals')).toBeTruthy();
    fireEvent.change(within(dialog).getByLabelText(/Unit price/), { target: { value: 'fifty' } });
    expect(await within(dialog).findByText('"fifty" is not an amount of money')).toBeTruthy();
    fireEvent.change(within(dialog).getByLabelText(/Quantity/), { target: { value: '1.2345' } });
    fireEvent.click(within(dialog).getByRole('button', { name: 'Add the line' }));
    expect(await within(dialog).findByText('"1.2345" has more than 3 decimals')).toBeTruthy();
    expect(requests.some((r) => r.method === 'PATCH')).toBe(false);
  });

  it('shows the server’s refusal inside the line dialog', async () => {
    signInAs({ role: 'lead' });
    routes({ status: 409, body: { statusCode: 409, message: 'quote Q-000007 was sent; it can no longer change', error: 'Conflict' } });
    renderWithApp(<QuotePanel jobId={11} />);

    const dialog = await addLine('2', '10');
    expect(await within(dialog).findByText('quote Q-000007 was sent; it can no longer change')).toBeTruthy();
  });

  it('shows a technician the draft but no way to change or send it', async () => {
    signInAs({ role: 'technician' });
    mockFetch([{ path: '/api/quotes', body: { items: [draft], total: 1 } }]);
    renderWithApp(<QuotePanel jobId={11} />);

    expect(await screen.findByRole('table', { name: 'Lines of quote Q-000007' })).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Add a line' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Send to the customer' })).toBeNull();
    expect(screen.queryByRole('button', { name: /Change line/ })).toBeNull();
  });
});
