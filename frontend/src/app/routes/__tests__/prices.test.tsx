import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { createPriceItem } from '@/testing/billing-generators';
import { mockFetch } from '@/testing/fetch-mock';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import PricesRoute from '../prices';

const range = createPriceItem({ id: 1, code: 'CAL-RANGE', description: 'Calibration of one range', unitPriceMinor: 8500 });
const hour = createPriceItem({
  id: 2,
  code: 'STUDY-HOUR',
  description: 'Stability study, per hour',
  unit: 'per_hour',
  unitPriceMinor: 4999,
  proposeOnQuotes: false,
});

function priceList() {
  return mockFetch([
    { path: '/api/prices/items', body: { items: [range, hour], total: 2, currency: 'EUR' } },
    { method: 'POST', path: '/api/prices/items', status: 201, body: createPriceItem({ id: 3, code: 'TRAVEL' }) },
  ]);
}

describe('the Prices page', () => {
  it.each(['technician', 'engineer'] as const)('keeps the price list read-only for the %s', async (role) => {
    signInAs({ role });
    priceList();
    renderWithApp(<PricesRoute />, { path: '/prices' });

    expect(await screen.findByText('STUDY-HOUR')).toBeTruthy();
    // The unit price as the server gave it (minor units), in the lab's currency.
    expect(screen.getByText('€49.99')).toBeTruthy();
    expect(screen.getByText(/You can read the prices/)).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'New price item' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Edit CAL-RANGE' })).toBeNull();
  });

  it('lets the lead add a price item, its price typed and read exactly', async () => {
    signInAs({ role: 'lead' });
    const { requests } = priceList();
    renderWithApp(<PricesRoute />, { path: '/prices' });

    expect(await screen.findByRole('button', { name: 'Edit CAL-RANGE' })).toBeTruthy();
    expect(screen.queryByText(/You can read the prices/)).toBeNull();
    fireEvent.click(screen.getByRole('button', { name: 'New price item' }));
    const dialog = await screen.findByRole('dialog', { name: 'New price item' });
    fireEvent.change(within(dialog).getByLabelText(/Code/), { target: { value: 'TRAVEL' } });
    fireEvent.change(within(dialog).getByLabelText(/Description/), { target: { value: 'Collection and return of the instrument' } });
    fireEvent.mouseDown(within(dialog).getByRole('combobox', { name: /Unit/ }));
    fireEvent.click(await screen.findByRole('option', { name: 'Per job' }));
    // "1 234,50" with a space for thousands and a decimal comma is 1,234.50 = 123450 cents.
    fireEvent.change(within(dialog).getByLabelText(/Unit price/), { target: { value: '1 234,50' } });
    fireEvent.click(within(dialog).getByRole('button', { name: 'Add to the price list' }));

    await waitFor(() => expect(requests.some((r) => r.method === 'POST')).toBe(true));
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({
      code: 'TRAVEL',
      description: 'Collection and return of the instrument',
      unit: 'per_job',
      unitPriceMinor: 123450,
      proposeOnQuotes: true,
    });
  });

  it('refuses a price of more decimals than the currency has', async () => {
    signInAs({ role: 'admin' });
    const { requests } = priceList();
    renderWithApp(<PricesRoute />, { path: '/prices' });

    // The button waits for the list, which says the lab's currency.
    await screen.findByRole('button', { name: 'Edit CAL-RANGE' });
    fireEvent.click(screen.getByRole('button', { name: 'New price item' }));
    const dialog = await screen.findByRole('dialog', { name: 'New price item' });
    fireEvent.change(within(dialog).getByLabelText(/Code/), { target: { value: 'X' } });
    fireEvent.change(within(dialog).getByLabelText(/Description/), { target: { value: 'Something' } });
    fireEvent.change(within(dialog).getByLabelText(/Unit price/), { target: { value: '85.005' } });
    fireEvent.click(within(dialog).getByRole('button', { name: 'Add to the price list' }));

    expect(await within(dialog).findByText('"85.005" has more than 2 decimals')).toBeTruthy();
    expect(requests.some((r) => r.method === 'POST')).toBe(false);
  });
});
