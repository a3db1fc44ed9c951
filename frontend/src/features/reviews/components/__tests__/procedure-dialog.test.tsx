import { fireEvent, screen, waitFor } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { mockFetch } from '@/testing/fetch-mock';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { parseDialMarks } from '../../api/save-procedure';
import { ProcedureDialog } from '../procedure-dialog';

describe('<ProcedureDialog>: counter-assisted capture settings', () => {
  it('should refuse N below 2 without sending, then send the settle rule and the dial marks in order', async () => {
    signInAs({ role: 'lead' });
    const { requests } = mockFetch([{ method: 'POST', path: '/api/procedures', status: 201, body: { id: 3, name: 'Bench method B' } }]);
    renderWithApp(<ProcedureDialog procedure={null} canEdit onClose={vi.fn()} />);
    fireEvent.change(screen.getByLabelText(/^Name/), { target: { value: 'Bench method B' } });
    fireEvent.change(screen.getByLabelText(/^Method/), { target: { value: 'Dial against counter at each mark.' } });
    // Defaults shown: N = 5, 5 Hz, 30 s.
    expect((screen.getByLabelText('Readings that must agree (N)') as HTMLInputElement).value).toBe('5');
    fireEvent.change(screen.getByLabelText('Readings that must agree (N)'), { target: { value: '1' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save procedure' }));
    expect(await screen.findByText(/Readings that must agree: a whole number from 2 to 50/)).toBeTruthy();
    expect(requests).toHaveLength(0);

    fireEvent.change(screen.getByLabelText('Readings that must agree (N)'), { target: { value: '4' } });
    fireEvent.change(screen.getByLabelText('Settle band (Hz)'), { target: { value: '2.5' } });
    fireEvent.change(screen.getByLabelText('Dial marks, in order'), { target: { value: '1750, 1800 1850.5' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save procedure' }));
    await waitFor(() => expect(requests).toHaveLength(1));
    expect(requests[0]!.body).toMatchObject({ captureSettleCount: 4, captureToleranceHz: 2.5, captureTimeoutS: 30, dialMarks: [1750, 1800, 1850.5] });
  }, 20_000);

  it('should read dial marks separated by commas, semicolons or spaces, and refuse text', () => {
    expect(parseDialMarks('')).toEqual([]);
    expect(parseDialMarks('3500; 4000,5000  6000')).toEqual([3500, 4000, 5000, 6000]);
    expect(parseDialMarks('3500, abc')).toBeNull();
  });
});
