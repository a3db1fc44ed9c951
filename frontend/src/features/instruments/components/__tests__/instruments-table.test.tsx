import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { createInstrument, createRange } from '@/testing/lab-generators';
import { mockFetch } from '@/testing/fetch-mock';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { InstrumentsTable } from '../instruments-table';

function isoInDays(days: number) {
  const d = new Date();
  d.setDate(d.getDate() + days);
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
}

describe('<InstrumentsTable>', () => {
  it('should ask the server for the first page sorted by make and flag the due dates', async () => {
    signInAs({ role: 'technician' });
    const { requests } = mockFetch([
      {
        path: '/api/instruments',
        body: {
          items: [
            createInstrument({ id: 1, model: 'SG-4 signal generator', serial: 'N-1041', nextDueDate: isoInDays(20) }),
            createInstrument({ id: 2, model: 'VFO-3 oscillator', serial: 'N-0952', nextDueDate: isoInDays(-10) }),
            createInstrument({
              id: 3,
              make: 'Marlow & Reade',
              model: 'CR-7 receiver',
              serial: 'CR7-5520',
              nextDueDate: isoInDays(200),
              ranges: [createRange({ freqMinHz: 2_055_000, freqMaxHz: 10_455_000 }), createRange({ freqMinHz: 4_455_000, freqMaxHz: 4_600_000 })],
            }),
          ],
          total: 3,
        },
      },
    ]);
    renderWithApp(<InstrumentsTable owners={[{ value: '2', label: 'Northgate Radio Club' }]} />, {
      path: '/instruments',
      initialEntry: '/instruments?sort=bogus',
    });

    const grid = await screen.findByRole('grid', { name: 'Instruments' });
    await within(grid).findByText('N-0952');
    // A sort field the API does not know falls back to the default.
    expect(requests[0]!.url).toBe('/api/instruments?page=1&pageSize=25&sort=make');
    expect(within(grid).getByText('Due in 20 d')).toBeTruthy();
    expect(within(grid).getByText('Overdue 10 d')).toBeTruthy();
    expect(within(grid).getByText('2 · 2.055 MHz – 10.455 MHz')).toBeTruthy();
    expect(within(grid).getByRole('link', { name: 'CR-7 receiver' }).getAttribute('href')).toBe('/instruments/3');
  });

  it('should filter by owner and by due date on the server', async () => {
    signInAs({ role: 'lead' });
    const { requests } = mockFetch([{ path: '/api/instruments', body: { items: [], total: 0 } }]);
    renderWithApp(<InstrumentsTable owners={[{ value: '2', label: 'Northgate Radio Club' }]} />, { path: '/instruments' });
    await screen.findByText('No instruments match these filters.');

    fireEvent.mouseDown(screen.getByRole('combobox', { name: 'Owner' }));
    fireEvent.click(screen.getByRole('option', { name: 'Northgate Radio Club' }));
    await waitFor(() => expect(requests.at(-1)!.url).toBe('/api/instruments?page=1&pageSize=25&sort=make&organizationId=2'));

    fireEvent.mouseDown(screen.getByRole('combobox', { name: 'Due' }));
    fireEvent.click(screen.getByRole('option', { name: 'Overdue' }));
    await waitFor(() => expect(requests.at(-1)!.url).toBe('/api/instruments?page=1&pageSize=25&sort=make&organizationId=2&overdue=true'));
  });
});
