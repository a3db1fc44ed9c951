import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { WarmupRunAnalysis } from '@kilocycle/common/types';
import { renderWithApp, signInAs } from '@/testing/test-utils';
import { WarmupView } from '../warmup-view';

// 14 s of a warm-up whose fit says "within 5 Hz at 3 min 47 s": the page must say that lies beyond the record.
function analysis(settling: Partial<WarmupRunAnalysis['settling']>): WarmupRunAnalysis {
  const t = [0, 2, 4, 6, 8, 10, 12, 14];
  const fitted = t.map((s) => 7_050_000 - 400 * Math.exp(-s / 50));
  return {
    runId: 9, runKind: 'warmup', readingCount: 8, excludedCount: 0, usedCount: 8, state: 'ready', analysis: 'warmup',
    fit: { fInf: 7_050_000, amplitude: -400, tau: 50, linear: null, seFInf: 1, seAmplitude: 1, seTau: 0.5, seLinear: null, residualSd: 0.2, n: 8, converged: true, fittedPoints: 8 },
    summary: { driftFirstHourHz: 400, firstHourCovered: false, settledAtSeconds: 227, driftPer10MinAfterSettlingHz: null },
    settling: { withinHz: 5, withinSeconds: 227, withinExtrapolated: true, rateHzPerMin: 1, rateSeconds: 494, rateExtrapolated: true, lastReadingSeconds: 14, ...settling },
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
    renderWithApp(<WarmupView analysis={analysis({ withinExtrapolated: false, rateSeconds: null, rateExtrapolated: false, lastReadingSeconds: 600 })} problem={null} latest={[]} skipAnimation />);
    expect(screen.getByTestId('settled-within').textContent).not.toContain('extrapolated');
    expect(screen.getByTestId('settled-rate').textContent).toContain('never, by this rule');
  });
});
