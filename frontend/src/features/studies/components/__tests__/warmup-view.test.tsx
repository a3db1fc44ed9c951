import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { Reading, WarmupRunAnalysis } from '@kilocycle/common/types';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { warmupChartData, WarmupView } from '../warmup-view';

// 14 s of a warm-up whose fit says "within 5 Hz at 3 min 47 s": the page must say that lies beyond the record.
function analysis(settling: Partial<WarmupRunAnalysis['settling']>): WarmupRunAnalysis {
  const t = [0, 2, 4, 6, 8, 10, 12, 14];
  const fitted = t.map((s) => 7_050_000 - 400 * Math.exp(-s / 50));
  return {
    runId: 9,
    runKind: 'warmup',
    readingCount: 8,
    excludedCount: 0,
    usedCount: 8,
    state: 'ready',
    analysis: 'warmup',
    fit: {
      fInf: 7_050_000,
      amplitude: -400,
      tau: 50,
      linear: null,
      seFInf: 1,
      seAmplitude: 1,
      seTau: 0.5,
      seLinear: null,
      residualSd: 0.2,
      n: 8,
      converged: true,
      fittedPoints: 8,
    },
    summary: { driftFirstHourHz: 400, firstHourCovered: false, settledAtSeconds: 227, driftPer10MinAfterSettlingHz: null },
    settling: {
      withinHz: 5,
      withinSeconds: 227,
      withinExtrapolated: true,
      rateHzPerMin: 1,
      rateSeconds: 494,
      rateExtrapolated: true,
      lastReadingSeconds: 14,
      ...settling,
    },
    drift: { windowSeconds: 600, windows: [] },
    series: { t, frequency: fitted, fitted },
  };
}

describe('<WarmupView> settling times', () => {
  it('says a settling time beyond the last reading is extrapolated, naming how much was recorded', () => {
    signInAs({ role: 'engineer' });
    renderWithApp(<WarmupView analysis={analysis({})} problem={null} latest={[]} skipAnimation />);
    const within = screen.getByTestId('settled-within');
    expect(within.textContent).toContain('3 min 47 s');
    expect(within.textContent).toContain('extrapolated beyond the 14\u00a0s recorded');
    expect(screen.getByTestId('settled-rate').textContent).toContain('extrapolated beyond the 14\u00a0s recorded');
  });

  it('says nothing of the kind once the record reaches the settling time, and "never" when the rule is never met', () => {
    signInAs({ role: 'engineer' });
    renderWithApp(
      <WarmupView
        analysis={analysis({ withinExtrapolated: false, rateSeconds: null, rateExtrapolated: false, lastReadingSeconds: 600 })}
        problem={null}
        latest={[]}
        skipAnimation
      />,
    );
    expect(screen.getByTestId('settled-within').textContent).not.toContain('extrapolated');
    expect(screen.getByTestId('settled-rate').textContent).toContain('never, by this rule');
  });
});

describe('warmupChartData(): the curve drawn is the one the server sent', () => {
  // The server's curve here is deliberately not f∞ + A·e^(−t/τ) of the fit beside it: only a chart that draws
  // what was sent shows these values.
  const sent = [7_049_600, 7_049_700, 7_049_750, 7_049_800, 7_049_850, 7_049_880, 7_049_900, 7_049_910];
  const withSentCurve = (): WarmupRunAnalysis => {
    const base = analysis({});
    return { ...base, series: { t: base.series.t, frequency: sent.map((v) => v + 1), fitted: sent } };
  };
  const live = (seq: number, t: number, frequency: number): Reading => ({
    id: 100 + seq,
    seq,
    t,
    dial: null,
    frequency,
    aux: null,
    source: 'bridge',
    receivedAt: '2026-01-01T00:00:00Z',
    excluded: false,
    excludedReason: null,
    author: null,
  });

  it('draws the server’s fitted values at the analysed times, and none yet for a reading newer than the analysis', () => {
    const chart = warmupChartData(withSentCurve(), [live(9, 16, 7_049_920)], 'frequency');
    expect(chart.fitted).toEqual([...sent, null]);
    expect(chart.points.map((p) => p.y)).toEqual([...sent.map((v) => v + 1), 7_049_920]);
  });

  it('shows residuals from the server’s curve (here 1 Hz each), leaving out the reading it does not cover yet', () => {
    const chart = warmupChartData(withSentCurve(), [live(9, 16, 7_049_920)], 'residual');
    expect(chart.residual).toBe(true);
    expect(chart.points.map((p) => p.y)).toEqual(sent.map(() => 1));
  });
});
