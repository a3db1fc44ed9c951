import { fireEvent, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { CalibrationRunAnalysis } from '@kilocycle/common/types';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { CorrectionTable } from '../correction-table';

// Three settings measured on a kHz dial from 1 750 to 2 000 of a range whose dial runs 1 700 to 2 050.
const points = [
  { dial: 1750, nominal: 1_750_000, measured: 1_735_000 },
  { dial: 1875, nominal: 1_875_000, measured: 1_861_000 },
  { dial: 2000, nominal: 2_000_000, measured: 1_990_000 },
];
const analysis = {
  analysis: 'calibration',
  range: {
    id: 1,
    label: 'Band 1',
    dialUnit: 'kHz',
    dialMin: 1700,
    dialMax: 2050,
    freqMinHz: 1_700_000,
    freqMaxHz: 2_050_000,
    tolerance: { kind: 'percent', value: 0.5 },
  },
  points,
  corrections: points.map((p) => ({ dial: p.dial, nominal: p.nominal, measured: p.measured, correctionHz: p.nominal - p.measured })),
} as unknown as CalibrationRunAnalysis;

function ask(text: string) {
  fireEvent.change(screen.getByLabelText('Dial for frequency'), { target: { value: text } });
  return screen.getByLabelText('Dial for frequency').closest('.MuiFormControl-root')?.textContent ?? '';
}

describe('<CorrectionTable> dial for a wanted frequency', () => {
  it('interpolates inside the measured settings without a mark', () => {
    signInAs({ role: 'technician' });
    renderWithApp(<CorrectionTable analysis={analysis} />);
    const said = ask('1798 kHz');
    expect(said).toContain('Set the dial to 1 812.50 kHz');
    expect(said).not.toContain('extrapolated');
  });

  it('marks a setting beyond the measured ones as extrapolated, naming the settings measured', () => {
    signInAs({ role: 'technician' });
    renderWithApp(<CorrectionTable analysis={analysis} />);
    // 2000 + (2 000 000 − 1 990 000)·125/129 000 = 2009.69 (the end segment's line carried on).
    const said = ask('2000 kHz');
    expect(said).toContain('Set the dial to 2 009.69 kHz');
    expect(said).toContain('extrapolated beyond the settings measured (dial 1 750 to 2 000 kHz)');
  });

  it('refuses, in words, a frequency the dial cannot reach by that line', () => {
    signInAs({ role: 'technician' });
    renderWithApp(<CorrectionTable analysis={analysis} />);
    const said = ask('2100 kHz');
    expect(said).toContain('lies beyond this range’s dial (1 700 to 2 050 kHz)');
    expect(said).not.toContain('dialForFrequency');
  });
});
