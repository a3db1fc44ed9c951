import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { createReading } from '@/testing/lab-generators';
import { mockFetch } from '@/testing/fetch-mock';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { ReadingsTable } from '../readings-table';

describe('<ReadingsTable>', () => {
  it('should group the count, show a six-digit sequence number whole, and show no invented time for an untimed imported row', async () => {
    signInAs({ role: 'technician' });
    const untimed = createReading({ seq: 400_001, t: 0, source: 'import', dial: 1800, frequency: 1_820_749.7 });
    const typed = createReading({ seq: 400_000, t: 95, source: 'manual', dial: 1750, frequency: 1_735_000 });
    mockFetch([{ method: 'GET', path: '/api/runs/7/readings', body: { items: [untimed, typed], total: 400_001, page: 1, pageSize: 50 } }]);
    renderWithApp(<ReadingsTable runId={7} canExclude={false} />, { path: '/runs/7' });

    await waitFor(() => expect(screen.getByTestId('readings-count').textContent).toBe('400 001 in this run'));
    const grid = screen.getByRole('grid', { name: 'Readings' });
    // The grid draws its header row before the data rows: wait for the rows themselves (a loaded machine is slow to).
    await within(grid).findByText('400001');
    const rows = within(grid).getAllByRole('row');
    const untimedRow = rows.find((row) => row.textContent?.includes('400001'));
    const typedRow = rows.find((row) => row.textContent?.includes('400000'));
    expect(untimedRow, 'the six-digit sequence number is printed whole').toBeDefined();
    // The file gave no time: a dash, not the seconds from the run's start to the upload.
    expect(within(untimedRow!).getByTitle('The imported file gave no time').textContent).toBe('—');
    expect(typedRow!.textContent).toContain('1 min 35 s');
  });
});

describe('<ReadingsTable> of a phase run', () => {
  it('should head the value column Time interval (s) and show each value in seconds', async () => {
    signInAs({ role: 'engineer' });
    const reading = createReading({ seq: 12, t: 11, source: 'bridge', dial: null, frequency: -3.5e-9 });
    mockFetch([{ method: 'GET', path: '/api/runs/9/readings', body: { items: [reading], total: 1, page: 1, pageSize: 50 } }]);
    renderWithApp(<ReadingsTable runId={9} showDial={false} dataKind="phase" canExclude={false} />, { path: '/runs/9' });

    const grid = screen.getByRole('grid', { name: 'Readings' });
    await within(grid).findByText('12');
    const headers = within(grid)
      .getAllByRole('columnheader')
      .map((h) => h.textContent);
    expect(headers).toContain('Time interval (s)');
    expect(headers).not.toContain('Frequency');
    expect(within(grid).getByText('-3.500 00×10⁻⁹')).toBeTruthy();
  });
});
