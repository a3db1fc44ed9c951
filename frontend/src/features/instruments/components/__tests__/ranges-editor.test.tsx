import { fireEvent, screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { createInstrument, createRange } from '@/testing/lab-generators';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { RangesEditor } from '../ranges-editor';

const instrument = createInstrument({
  ranges: [
    createRange({ position: 1, label: 'A  1750–2000 kHz' }),
    createRange({ position: 2, label: 'B  3500–4000 kHz', dialMin: 3500, dialMax: 4000, freqMinHz: 3_500_000, freqMaxHz: 4_000_000 }),
  ],
});

describe('<RangesEditor>', () => {
  it('gives each range compact Edit and Remove icon buttons, named for the range, under a named column', () => {
    signInAs({ role: 'technician' });
    renderWithApp(<RangesEditor instrument={instrument} canEdit />);
    const table = screen.getByRole('table', { name: 'Ranges' });
    // No empty header: the actions column is named for screen readers.
    expect(within(table).getByRole('columnheader', { name: 'Actions' })).toBeTruthy();
    const edit = within(table).getByRole('button', { name: 'Edit range B 3500–4000 kHz' });
    const remove = within(table).getByRole('button', { name: 'Remove range B 3500–4000 kHz' });
    // Icons, not words: the column stays narrow enough to show at 1440 px.
    expect(edit.textContent).toBe('');
    expect(remove.textContent).toBe('');
    expect(edit.querySelector('svg')).not.toBeNull();

    fireEvent.click(remove);
    expect(screen.getByRole('dialog', { name: 'Remove this range?' }).textContent).toContain('B  3500–4000 kHz');
  });

  it('shows no actions column to someone who may only read', () => {
    signInAs({ role: 'client' });
    renderWithApp(<RangesEditor instrument={instrument} canEdit={false} />);
    expect(screen.queryByRole('columnheader', { name: 'Actions' })).toBeNull();
    expect(screen.queryByRole('button', { name: /Edit range/ })).toBeNull();
  });
});
