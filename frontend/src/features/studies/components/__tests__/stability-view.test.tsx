import { fireEvent, screen, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import type { StabilityRunAnalysis } from '@kilocycle/common/types';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { deviationCsv } from '../../utils/deviation-csv';
import { DEFAULT_STABILITY_OPTIONS, StabilityView } from '../stability-view';

// A hand-written answer: SP 1065 Table 31's printed digits at τ = 1 and 10 s (fixtures/stability), with made-up
// terms, edf and intervals (the page only shows what the server sends), and one τ too short to name a noise type.
const point = (deviation: number, terms: number, edf: number, ciLow: number, ciHigh: number) => ({ deviation, terms, edf, ciLow, ciHigh });
function analysis(removed = false): StabilityRunAnalysis {
  return {
    runId: 12,
    runKind: 'stability',
    readingCount: 1000,
    excludedCount: 0,
    usedCount: 1000,
    state: 'ready',
    analysis: 'stability',
    tau0: 1,
    referenceHz: 10e6,
    adev: [],
    mdev: [],
    gaps: { gaps: [], irregular: false, medianInterval: 1 },
    series: { t: [0, 1], frequency: [10e6, 10e6] },
    toolkit: {
      dataKind: 'frequency',
      confidence: 0.95,
      factors: { spacing: 'octaves', list: [1, 10] },
      segment: {
        choice: 'longest',
        count: 1000,
        leftOut: 0,
        fromSeconds: 0,
        toSeconds: 999,
        gapCount: 0,
        statement: 'every included reading: 1000, 0 s to 999 s, no gaps',
      },
      drift: { method: 'linear_frequency', perSecond: 2.5e-12, standardError: 4e-13, points: 1000, fromSeconds: 0, toSeconds: 999, spansGap: false, removed },
      deviations: [
        {
          m: 1,
          tau: 1,
          noise: { status: 'identified', noise: 'white_fm', method: 'lag1_acf', alternatives: [] },
          edfNoise: 'white_fm',
          edfNoiseFrom: 'identified',
          adev: point(0.2922319, 999, 664.5, 0.28, 0.31),
          mdev: point(0.2922319, 999, 700, 0.28, 0.31),
          hdev: point(0.2943883, 998, 600, 0.28, 0.31),
          tdev: point(0.1687202, 999, 700, 0.16, 0.18),
          totdev: point(0.2922319, 998, 998, 0.28, 0.31),
        },
        {
          m: 10,
          tau: 10,
          noise: { status: 'too_short', message: 'only 3 points' },
          edfNoise: 'white_fm',
          edfNoiseFrom: 'shorter_tau',
          adev: point(0.09159953, 981, 140.2, 0.08, 0.1),
          mdev: point(0.06172376, 971, 120, 0.05, 0.07),
          hdev: point(0.09581083, 971, 110, 0.08, 0.11),
          tdev: point(0.3563623, 971, 120, 0.3, 0.4),
          totdev: null,
        },
      ],
      outliers: { k: 5, screened: 1000, median: 0, threshold: 1e-6, flaggedCount: 1, flagged: [{ readingId: 77, seq: 51, t: 50, frequency: 10_000_050 }] },
    },
  };
}

describe('<StabilityView> deviations table', () => {
  it('shows each deviation at each τ with its interval, terms and edf, and the noise named (or too short to identify)', () => {
    signInAs({ role: 'engineer' });
    renderWithApp(<StabilityView analysis={analysis()} problem={null} skipAnimation />);
    const table = screen.getByRole('table', { name: 'Deviations table' });
    const headers = within(table)
      .getAllByRole('columnheader')
      .map((h) => h.textContent);
    // The test window is phone-sized: the noise type column folds into the τ cell's second line.
    expect(headers).toEqual(['τ (s)', 'ADEV', 'MDEV', 'HDEV', 'TDEV (s)', 'TOTDEV']);
    expect(within(table).getAllByRole('row')[2]!.textContent).toContain('Too short to identify');
    expect(screen.getByTestId('hdev-10').textContent).toBe('9.58×10⁻²8.00×10⁻² to 1.10×10⁻¹971 terms · edf 110.0');
    expect(screen.getByTestId('adev-1').textContent).toContain('999 terms · edf 664.5');
    expect(screen.getByTestId('totdev-10').textContent).toBe('—');
    expect(within(table).getAllByText('White FM').length).toBeGreaterThan(0);
    expect(within(table).getAllByText('Too short to identify').length).toBeGreaterThan(0);
    expect(within(table).getByText('edf for White FM, named at a shorter τ')).toBeTruthy();
    expect(within(table).getByText('by lag-1 autocorrelation')).toBeTruthy();
  });

  it('says which data the chart and the table show, and the drift with its standard error', () => {
    signInAs({ role: 'engineer' });
    const { unmount } = renderWithApp(<StabilityView analysis={analysis(false)} problem={null} skipAnimation />);
    expect(screen.getByRole('heading', { name: 'Deviations as recorded' })).toBeTruthy();
    expect(screen.getByTestId('table-data').textContent).toContain('as recorded (drift kept)');
    expect(screen.getByTestId('drift').textContent).toContain('2.50×10⁻¹² /s');
    expect(screen.getByTestId('drift').textContent).toContain('standard error 4.00×10⁻¹³ /s');
    unmount();
    renderWithApp(<StabilityView analysis={analysis(true)} problem={null} skipAnimation />);
    expect(screen.getByRole('heading', { name: 'Deviations with the drift removed' })).toBeTruthy();
    expect(screen.getByTestId('chart-data').textContent).toContain('linear frequency drift removed');
    expect(screen.getByTestId('table-data').textContent).toContain('linear frequency drift removed');
  });

  it('asks for decades, the drift removed and the gap choice through onOptionsChange', () => {
    signInAs({ role: 'engineer' });
    const onOptionsChange = vi.fn();
    renderWithApp(<StabilityView analysis={analysis()} problem={null} skipAnimation options={DEFAULT_STABILITY_OPTIONS} onOptionsChange={onOptionsChange} />);
    const factors = screen.getByRole('group', { name: 'Averaging times: Octaves / Decades' });
    expect(within(factors).getByRole('button', { name: 'Octaves' }).getAttribute('aria-pressed')).toBe('true');
    fireEvent.click(within(factors).getByRole('button', { name: 'Decades' }));
    expect(onOptionsChange).toHaveBeenLastCalledWith({ factors: 'decades', drift: 'kept', gaps: 'longest' });
    fireEvent.click(screen.getByRole('switch', { name: 'Analyse with drift removed' }));
    expect(onOptionsChange).toHaveBeenLastCalledWith({ factors: 'octaves', drift: 'removed', gaps: 'longest' });
    fireEvent.click(screen.getByRole('button', { name: 'As if continuous' }));
    expect(onOptionsChange).toHaveBeenLastCalledWith({ factors: 'octaves', drift: 'kept', gaps: 'continuous' });
  });

  it('lists the MAD-flagged readings with an Exclude… action', () => {
    signInAs({ role: 'engineer' });
    const onExclude = vi.fn();
    renderWithApp(<StabilityView analysis={analysis()} problem={null} skipAnimation onExclude={onExclude} />);
    fireEvent.click(screen.getByRole('button', { name: 'Exclude… reading 51' }));
    expect(onExclude).toHaveBeenCalledWith({ readingId: 77, seq: 51, t: 50, frequency: 10_000_050 });
  });

  it('exports every point of the table as CSV with terms, edf and interval', () => {
    const lines = deviationCsv(analysis().toolkit).trim().split('\n');
    expect(lines[0]).toBe('tau_s,m,deviation,value,terms,edf,ci95_low,ci95_high,noise,noise_method,edf_noise,data');
    // 5 deviations at τ = 1 s and 4 at 10 s (no total deviation there).
    expect(lines).toHaveLength(1 + 9);
    expect(lines[9]).toBe(
      '10,10,TDEV,0.3563623,971,120,0.3,0.4,too short to identify,,white_fm,"frequency readings, as recorded (drift kept), longest continuous segment"',
    );
  });
});
