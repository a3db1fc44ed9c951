import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { mockFetch } from '@/testing/fetch-mock';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { checkMapping, ImportReadings } from '../import-readings';

const CSV = ['\ufeffSetting,Counter (kHz),Note', '1750,1749.97,first', '1775,1775.01,', '1800,1799.99,"warm, settled"'].join('\r\n');

async function openWithFile(content: string, name = 'as-found.csv') {
  fireEvent.click(screen.getByRole('button', { name: 'Import CSV' }));
  const dialog = screen.getByRole('dialog', { name: 'Import readings from a CSV or TSV file' });
  const file = new File([content], name, { type: 'text/csv' });
  fireEvent.change(within(dialog).getByLabelText('File to import'), { target: { files: [file] } });
  await within(dialog).findByRole('table', { name: 'Preview of the file' });
  return dialog;
}

describe('<ImportReadings>', () => {
  it('previews the first rows as read in the browser and prefills the columns from the header', async () => {
    signInAs({ role: 'technician' });
    mockFetch([]);
    renderWithApp(<ImportReadings runId={3} needsTime={false} needsDial />);
    const dialog = await openWithFile(CSV);

    const table = within(dialog).getByRole('table', { name: 'Preview of the file' });
    const rows = within(table).getAllByRole('row');
    expect(rows).toHaveLength(4);
    expect(
      within(rows[3]!)
        .getAllByRole('cell')
        .map((c) => c.textContent),
    ).toEqual(['4', '1800', '1799.99', 'warm, settled']);
    expect(within(dialog).getByRole('combobox', { name: /Dial setting/ }).textContent).toBe('Setting');
    expect(within(dialog).getByRole('combobox', { name: /Frequency/ }).textContent).toBe('Counter (kHz)');
    expect(within(dialog).getByRole('combobox', { name: /^Time/ }).textContent).toMatch(/not in the file/);
    // All or nothing unless the user chooses otherwise.
    expect((within(dialog).getByLabelText(/All or nothing/) as HTMLInputElement).checked).toBe(true);
  });

  it('asks for the missing columns before uploading anything', async () => {
    signInAs({ role: 'technician' });
    const { fetchMock } = mockFetch([]);
    renderWithApp(<ImportReadings runId={13} needsTime needsDial={false} />);
    const dialog = await openWithFile('Reading,Comment\n7000123,ok\n', 'warmup.csv');

    fireEvent.click(within(dialog).getByRole('button', { name: 'Import' }));
    expect(await within(dialog).findByText('This run needs the time of each reading')).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('refuses a file that is not .csv or .tsv by its name before reading it', async () => {
    signInAs({ role: 'technician' });
    mockFetch([]);
    renderWithApp(<ImportReadings runId={3} needsTime={false} needsDial />);
    fireEvent.click(screen.getByRole('button', { name: 'Import CSV' }));
    const dialog = screen.getByRole('dialog');
    fireEvent.change(within(dialog).getByLabelText('File to import'), { target: { files: [new File(['x'], 'photo.jpg')] } });
    await waitFor(() => expect(within(dialog).getByText('“photo.jpg” is not a .csv or .tsv file.')).toBeTruthy());
  });
});

describe('checkMapping()', () => {
  it('needs the frequency always, the time for studies and the dial for calibration runs, and no column twice', () => {
    const empty = { time: '', dial: '', frequency: '', unit: '', aux: '' };
    expect(Object.keys(checkMapping(empty, { needsTime: true, needsDial: false }))).toEqual(['frequency', 'time']);
    expect(Object.keys(checkMapping(empty, { needsTime: false, needsDial: true }))).toEqual(['frequency', 'dial']);
    expect(checkMapping({ ...empty, frequency: 'A', dial: 'A' }, { needsTime: false, needsDial: true })).toEqual({
      frequency: '“A” is already the dial setting column',
    });
  });
});
