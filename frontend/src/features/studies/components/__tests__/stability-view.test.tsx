import { fireEvent, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { StabilityRunAnalysis } from '@kilocycle/common/types';
import { saveBlob, saveText } from '@/lib/file-transfer';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { deviationCsv } from '../../utils/deviation-csv';
import { DEFAULT_STABILITY_OPTIONS, StabilityView } from '../stability-view';

// A hand-written answer: SP 1065 Table 31's printed digits at τ = 1 and 10 s (fixtures/stability), with made-up
// terms, edf and intervals (the page only shows what the server sends), and one τ too short to name a noise type.
vi.mock('@/lib/file-transfer', () => ({ saveText: vi.fn(), saveBlob: vi.fn(), downloadFile: vi.fn() }));
afterEach(() => vi.clearAllMocks());

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
      conversion: 'Fractional frequency y = (f − f_ref)/f_ref against the mean of the readings; phase x summed from y·τ0 for MDEV and TDEV.',
      confidence: 0.95,
      factors: { spacing: 'octaves', list: [1, 10] },
      segment: {
        choice: 'longest',
        count: 1000,
        leftOut: 0,
        fromSeconds: 0,
        toSeconds: 999,
        gapCount: 0,
        filled: 0,
        statement: 'every included reading: 1000, 0 s to 999 s, no gaps',
      },
      drift: {
        method: 'linear_frequency',
        perSecond: 2.5e-12,
        standardError: 4e-13,
        points: 1000,
        fromSeconds: 0,
        toSeconds: 999,
        spansGap: false,
        removed,
        phaseEstimates: null,
      },
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
      '10,10,TDEV,0.3563623,971,120,0.3,0.4,too short to identify,,white_fm,"frequency data (Hz), as recorded (drift kept), longest continuous segment"',
    );
  });
});

/** A phase run: time intervals in seconds, one gap filled in phase, the drift's phase estimates beside the line. */
function phaseAnalysis(): StabilityRunAnalysis {
  const base = analysis();
  return {
    ...base,
    referenceHz: null,
    gaps: { gaps: [{ index: 400, tStart: 400, tEnd: 413, missing: 12 }], irregular: false, medianInterval: 1 },
    series: { t: [0, 1, 2], frequency: [1.2e-9, 1.3e-9, 1.1e-9] },
    toolkit: {
      ...base.toolkit,
      dataKind: 'phase',
      conversion: 'Phase data x as measured; fractional frequency y = Δx/τ0 for ADEV, HDEV and TOTDEV (SP 1065 §4).',
      segment: {
        ...base.toolkit.segment,
        choice: 'fill',
        count: 1012,
        filled: 12,
        gapCount: 1,
        statement: 'every reading, 1 gap filled in phase: 1,012 points',
      },
      drift: { ...base.toolkit.drift!, phaseEstimates: { threePoint: { perSecond: 1.2e-12 }, bisection: { perSecond: 1.4e-12 } } },
    },
  };
}

describe('<StabilityView> of phase data', () => {
  it('says the data were phase and how they were converted, and shows the points filled', () => {
    signInAs({ role: 'engineer' });
    renderWithApp(<StabilityView analysis={phaseAnalysis()} problem={null} skipAnimation options={{ ...DEFAULT_STABILITY_OPTIONS, gaps: 'fill' }} />);
    expect(screen.getByTestId('conversion').textContent).toBe(
      'Phase data x as measured; fractional frequency y = Δx/τ0 for ADEV, HDEV and TOTDEV (SP 1065 §4).',
    );
    expect(screen.getByTestId('chart-data').textContent).toContain('Computed from phase data (time interval, s)');
    expect(screen.getByTestId('table-data').textContent).toContain('phase data (time interval, s)');
    expect(screen.getByTestId('table-data').textContent).toContain('Phase data x as measured');
    expect(screen.getByTestId('filled').textContent).toBe('12 points filled by straight lines in phase.');
    // No reference frequency for phase data.
    expect(screen.getByTestId('reference').textContent).toContain('not needed');
    expect(screen.getByRole('img', { name: 'Time interval (s) against time, 3 points' })).toBeTruthy();
  });

  it('offers "Fill gaps (phase data only)" for a phase run only, and not "As if continuous" across its gaps', () => {
    signInAs({ role: 'engineer' });
    const onOptionsChange = vi.fn();
    const { unmount } = renderWithApp(
      <StabilityView analysis={analysis()} problem={null} skipAnimation options={DEFAULT_STABILITY_OPTIONS} onOptionsChange={onOptionsChange} />,
    );
    expect(screen.queryByRole('button', { name: 'Fill gaps (phase data only)' })).toBeNull();
    expect(screen.getByTestId('chart-data').textContent).toContain('Computed from frequency data (Hz)');
    unmount();

    renderWithApp(
      <StabilityView analysis={phaseAnalysis()} problem={null} skipAnimation options={DEFAULT_STABILITY_OPTIONS} onOptionsChange={onOptionsChange} />,
    );
    const gaps = screen.getByRole('group', { name: 'Gaps: Longest segment / As if continuous / Fill gaps (phase data only)' });
    expect((within(gaps).getByRole('button', { name: 'As if continuous' }) as HTMLButtonElement).disabled).toBe(true);
    fireEvent.click(within(gaps).getByRole('button', { name: 'Fill gaps (phase data only)' }));
    expect(onOptionsChange).toHaveBeenLastCalledWith({ factors: 'octaves', drift: 'kept', gaps: 'fill' });
  });

  it("shows the drift's three-point and bisection estimates beside the least-squares line and its standard error", () => {
    signInAs({ role: 'engineer' });
    renderWithApp(<StabilityView analysis={phaseAnalysis()} problem={null} skipAnimation />);
    expect(screen.getByTestId('drift').textContent).toContain('2.50×10⁻¹² /s');
    expect(screen.getByTestId('drift').textContent).toContain('standard error 4.00×10⁻¹³ /s');
    expect(screen.getByTestId('drift-three-point').textContent).toContain('1.20×10⁻¹² /s');
    expect(screen.getByTestId('drift-bisection').textContent).toContain('1.40×10⁻¹² /s');
    expect(screen.getByText('Drift, three-point')).toBeTruthy();
    expect(screen.getByText('Drift, bisection')).toBeTruthy();
  });
});

describe('<StabilityView> charts', () => {
  it('draws TDEV, in seconds, on a chart of its own with its intervals', () => {
    signInAs({ role: 'engineer' });
    renderWithApp(<StabilityView analysis={analysis()} problem={null} skipAnimation />);
    const tdev = screen.getByTestId('tdev-chart');
    expect(tdev.getAttribute('aria-label')).toBe('Time deviation as recorded at 2 averaging times, in seconds');
    expect(within(tdev).getByTestId('tdev-confidence-bars')).toBeTruthy();
    // The dimensionless chart does not carry it.
    expect(within(screen.getByTestId('adev-chart')).queryByTestId('tdev-confidence-bars')).toBeNull();
  });

  it('saves a chart as SVG with every point, its terms, edf and 95 % interval written into the file', () => {
    signInAs({ role: 'engineer' });
    renderWithApp(<StabilityView analysis={analysis()} problem={null} skipAnimation fileTitle="run-12" />);
    fireEvent.click(screen.getByRole('button', { name: 'Save SVG: Deviations as recorded' }));
    expect(saveText).toHaveBeenCalledOnce();
    const [text, name, type] = vi.mocked(saveText).mock.calls[0]!;
    expect(name).toBe('run-12-deviations.svg');
    expect(type).toBe('image/svg+xml;charset=utf-8');
    const file = new DOMParser().parseFromString(text, 'image/svg+xml');
    expect(file.querySelector('parsererror')).toBeNull();
    expect(file.querySelector('title')!.textContent).toBe('Deviations as recorded');
    const desc = file.querySelector('desc')!.textContent!;
    expect(desc).toContain('Computed from frequency data (Hz), as recorded (drift kept), longest continuous segment.');
    expect(desc).toContain('ADEV at τ = 1 s (m = 1): 0.2922319; 95 % interval 0.28 to 0.31; 999 terms; edf 664.5; noise white_fm');
    expect(desc).toContain('HDEV at τ = 10 s (m = 10): 0.09581083; 95 % interval 0.08 to 0.11; 971 terms; edf 110; noise too short to identify');
    // ADEV and HDEV are ticked: two points each, in the metadata for a program to read.
    const points = Array.from(file.querySelectorAll('*'))
      .filter((e) => e.namespaceURI === 'urn:kilocycle:stability-chart' && e.localName === 'point')
      .map((p) => ['deviation', 'tau_s', 'terms', 'edf', 'ci95_low', 'ci95_high'].map((a) => p.getAttribute(a)).join(' '));
    expect(points).toEqual(['ADEV 1 999 664.5 0.28 0.31', 'ADEV 10 981 140.2 0.08 0.1', 'HDEV 1 998 600 0.28 0.31', 'HDEV 10 971 110 0.08 0.11']);
    // The plot itself, as drawn, with its interval bars.
    expect(file.querySelector('[data-testid="adev-confidence-bars"]')).not.toBeNull();
    expect(saveBlob).not.toHaveBeenCalled();
  });
});
