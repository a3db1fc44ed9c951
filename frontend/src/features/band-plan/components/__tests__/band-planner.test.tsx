import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { BandPlanResponse } from '@kilocycle/common/types';
import { mockFetch } from '@/testing/fetch-mock';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { BandPlanner } from '../band-planner';

// A server answer for Region 1, the demo lab's region: two of its bands as the ITU table gives them
// (ITU Radio Regulations, Article 5: 160 m 1810-1850 kHz, 60 m 5351.5-5366.5 kHz secondary).
const regionOne: BandPlanResponse = {
  instrumentId: 5,
  region: 1,
  source: 'ITU Radio Regulations, Article 5 (Table of Frequency Allocations), edition 2020 — values entered from memory, check against the published table',
  nationalNote: 'National allocations differ within the ITU band: check your licence.',
  bands: [
    { name: '160 m', lowHz: 1_810_000, highHz: 1_850_000, status: 'primary', note: 'RR 5.96: more nationally' },
    { name: '60 m', lowHz: 5_351_500, highHz: 5_366_500, status: 'secondary', note: null },
  ],
  rows: [
    {
      rangeId: 11,
      rangeLabel: 'A',
      multiplier: 1,
      outLowHz: 1_750_000,
      outHighHz: 2_000_000,
      bands: [{ name: '160 m', coveredLowHz: 1_810_000, coveredHighHz: 1_850_000, full: true }],
    },
  ],
  wanted: null,
};

describe('<BandPlanner>', () => {
  it('offers the three ITU regions, keeps the choice in the address, and shows the chosen region’s bands with the licence note', async () => {
    signInAs({ role: 'technician' });
    const { requests } = mockFetch([{ path: '/api/instruments/5/band-plan', body: regionOne }]);
    renderWithApp(<BandPlanner instrumentId={5} dialUnits={{ 11: 'kHz' }} />, {
      path: '/instruments/5/band-plan',
      initialEntry: '/instruments/5/band-plan?region=1',
    });

    const table = await screen.findByRole('table', { name: 'Amateur bands of ITU Region 1' });
    expect(new URL(requests[0]!.url, 'http://localhost').searchParams.get('region')).toBe('1');
    // Band, edges, status, note (on a phone the status and note also fold under the band's name).
    const cells = within(table)
      .getAllByRole('row')
      .slice(1)
      .map((row) => [...row.querySelectorAll('td')].map((cell) => cell.textContent));
    expect(cells[0]).toEqual(['160 mprimary · RR 5.96: more nationally', '1 810 – 1 850 kHz', 'primary', 'RR 5.96: more nationally']);
    expect(cells[1]).toEqual(['60 msecondary', '5 351.5 – 5 366.5 kHz', 'secondary', '—']);
    expect(screen.getByText('National allocations differ within the ITU band: check your licence.')).toBeTruthy();
    const note = screen.getByRole('note', { name: 'About the band edges' });
    expect(note.textContent).toMatch(/^Band edges are a reference: what you may transmit, and where, depends on your licence and your local rules\./);
    expect(note.textContent).toContain('Source: ITU Radio Regulations, Article 5');

    fireEvent.mouseDown(screen.getByRole('combobox', { name: 'ITU region' }));
    const options = within(await screen.findByRole('listbox')).getAllByRole('option');
    expect(options.map((o) => o.textContent)).toEqual([
      'Region 1 (Europe, Africa, the Middle East, northern Asia)',
      'Region 2 (the Americas)',
      'Region 3 (Asia and the Pacific)',
    ]);
    fireEvent.click(options[2]!);
    await waitFor(() => expect(requests.some((r) => new URL(r.url, 'http://localhost').searchParams.get('region') === '3')).toBe(true));
  });

  it('shows the server’s refusal in words', async () => {
    signInAs({ role: 'technician' });
    mockFetch([
      {
        path: '/api/instruments/5/band-plan',
        status: 400,
        body: { statusCode: 400, message: ['region must be an ITU region with a band table: 1, 2, 3'], error: 'Bad Request' },
      },
    ]);
    renderWithApp(<BandPlanner instrumentId={5} dialUnits={{}} />, { path: '/instruments/5/band-plan' });
    expect(await screen.findByText(/region must be an ITU region with a band table: 1, 2, 3/)).toBeTruthy();
  });
});
