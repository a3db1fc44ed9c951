import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import type { Run } from '@kilocycle/common/types';
import { mockFetch } from '@/testing/fetch-mock';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { OpenRunDialog } from '../open-run-dialog';

const opened = { id: 90, kind: 'stability', dataKind: 'phase', status: 'open' } as unknown as Run;

function renderDialog(onOpened = vi.fn()) {
  renderWithApp(<OpenRunDialog jobId={5} role="engineer" ranges={[{ value: '3', label: 'Range A' }]} benches={[]} standards={[]} onOpened={onOpened} />, {
    path: '/jobs/5',
  });
  fireEvent.click(screen.getByRole('button', { name: 'Open run' }));
  return { dialog: screen.getByRole('dialog'), onOpened };
}

function choose(dialog: HTMLElement, label: RegExp, option: string) {
  fireEvent.mouseDown(within(dialog).getByRole('combobox', { name: label }));
  fireEvent.click(screen.getByRole('option', { name: option }));
}

describe('<OpenRunDialog> data kind', () => {
  it('offers frequency or phase data for a stability run and sends the choice as dataKind', async () => {
    signInAs({ role: 'engineer' });
    const { requests } = mockFetch([{ method: 'POST', path: '/api/jobs/5/runs', status: 201, body: opened }]);
    const { dialog, onOpened } = renderDialog();

    // An engineer's first kind is warm-up: no data choice there (only stability runs may hold phase).
    expect(within(dialog).queryByRole('combobox', { name: /^Data/ })).toBeNull();
    choose(dialog, /^Kind/, 'Stability');
    const data = within(dialog).getByRole('combobox', { name: /^Data/ });
    expect(data.textContent).toBe('Frequency (Hz) from a frequency counter');
    choose(dialog, /^Data/, 'Phase (time interval, s) from a time-interval counter');
    fireEvent.click(within(dialog).getByRole('button', { name: 'Open run' }));

    await waitFor(() => expect(onOpened).toHaveBeenCalledWith(opened));
    expect(requests[0]!.body).toMatchObject({ rangeId: 3, kind: 'stability', dataKind: 'phase' });
  });

  it('sends no data kind for the other kinds (the server keeps them frequency)', async () => {
    signInAs({ role: 'engineer' });
    const { requests } = mockFetch([{ method: 'POST', path: '/api/jobs/5/runs', status: 201, body: { ...opened, kind: 'warmup', dataKind: 'frequency' } }]);
    const { dialog, onOpened } = renderDialog();

    fireEvent.click(within(dialog).getByRole('button', { name: 'Open run' }));

    await waitFor(() => expect(onOpened).toHaveBeenCalled());
    expect(requests[0]!.body).toMatchObject({ rangeId: 3, kind: 'warmup' });
    expect(requests[0]!.body).not.toHaveProperty('dataKind');
  });
});
