import { render, screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { CalibrationPoint } from '@kilocycle/common/math';
import type { CalibrationRunAnalysis } from '@kilocycle/common/types';
import { FitSummary } from '../fit-summary';

// A dial that reads about 4 kHz high across 1750–2000 kHz, with a scale error that puts the line's
// value at 0 Hz at +6 700 Hz: error(f) = 6 700 Hz − 0.005 706 666… × f, so at 1 875 kHz it is exactly −4 000 Hz.
const INTERCEPT = 6700;
const SLOPE = (-4000 - INTERCEPT) / 1_875_000;
const point = (dialKhz: number): CalibrationPoint => {
  const nominal = dialKhz * 1000;
  const errorHz = INTERCEPT + SLOPE * nominal;
  return {
    dial: dialKhz,
    nominal,
    measured: nominal + errorHz,
    n: 1,
    sd: null,
    errorHz,
    errorPpm: (errorHz / nominal) * 1e6,
    errorPercent: (errorHz / nominal) * 100,
    toleranceHz: null,
    residualBestFit: 0,
    residualEndPoint: 0,
    studentised: 0,
    outlier: false,
  };
};

const analysis: CalibrationRunAnalysis = {
  state: 'ready',
  analysis: 'calibration',
  runId: 12,
  runKind: 'as_found',
  readingCount: 3,
  excludedCount: 0,
  usedCount: 3,
  range: {
    id: 1,
    label: 'A',
    dialUnit: 'kHz',
    dialMin: 1750,
    dialMax: 2000,
    freqMinHz: 1_750_000,
    freqMaxHz: 2_000_000,
    tolerance: { kind: 'percent', percent: 0.5 },
  },
  points: [point(1750), point(1875), point(2000)],
  fit: { offsetHz: INTERCEPT, slope: SLOPE, seOffset: 12.5, seSlope: 6e-6, residualSd: 0, r2: 1, n: 3 },
  tracking: { bestFit: { maxAbsHz: 0, rmsHz: 0 }, endPoint: { maxAbsHz: 0, rmsHz: 0 } },
  corrections: [],
  outliers: [],
  alignment: null,
  alignmentNote: null,
};

const figure = (label: string) => {
  const term = screen.getByText(label, { selector: 'dt' });
  return term.nextElementSibling as HTMLElement;
};

describe('<FitSummary>', () => {
  it('leads with the error at the centre of the measured span, and names the 0 Hz value for what it is', () => {
    render(<FitSummary analysis={analysis} />);
    const mid = figure('Error at mid-span');
    expect(mid.textContent).toMatch(/^[\u2212-]4 000\.0 Hz/);
    expect(within(mid).getByText(/1 875/)).toBeTruthy();
    expect(figure('Intercept at 0 Hz').textContent).toMatch(/^\+6 700\.0 Hz/);
    // No bare "Offset" that reads as if the dial were 6.7 kHz high when every error is about −4 kHz.
    expect(screen.queryByText('Offset', { selector: 'dt' })).toBeNull();
  });

  it('shows neither before there is a line', () => {
    render(<FitSummary analysis={{ ...analysis, fit: null, tracking: null, points: [point(1750)] }} />);
    expect(screen.queryByText('Error at mid-span')).toBeNull();
    expect(screen.queryByText('Intercept at 0 Hz')).toBeNull();
    expect(figure('Line').textContent).toMatch(/^not fitted yet\s*needs readings at three or more settings$/);
    // A definition list holds only term/description groups (the accessibility check refused a paragraph in it).
    const list = screen.getByTestId('fit-summary').querySelector('dl')!;
    for (const group of Array.from(list.children)) {
      expect(Array.from(group.children).map((child) => child.tagName)).toEqual(['DT', 'DD']);
    }
  });
});
