// The settle rule of counter-assisted capture: N consecutive readings within a band (common practice at the
// bench, no published source); mean and sample SD (GUM 4.2.2) checked by hand and against jstat.
import jstat from 'jstat';
import { counterSettled } from '../counter-settled.js';
import { errorCode, expectRelative } from './helpers.js';

describe('counterSettled()', () => {
  test('settled when the last N readings span no more than the tolerance: by hand, mean 7 000 012 Hz, s = 1 Hz', () => {
    // Last three: 12, 13, 11 Hz above 7 MHz. Spread 13 − 11 = 2 ≤ 2. Mean 12. s² = (0² + 1² + 1²) / 2 = 1.
    const state = counterSettled([7_000_100, 7_000_012, 7_000_013, 7_000_011], 3, 2);
    expect(state).toEqual({ settled: true, window: 3, spreadHz: 2, mean: 7_000_012, sd: 1 });
  });

  test('not settled when the spread is just over the tolerance (limits included, nothing beyond)', () => {
    const state = counterSettled([7_000_012, 7_000_013, 7_000_011], 3, 1.9);
    expect(state.settled).toBe(false);
    expect(state.spreadHz).toBe(2);
  });

  test('an early reading outside the band does not count once N later ones agree; a late one does', () => {
    expect(counterSettled([1_800_050, 1_800_000, 1_800_001, 1_800_000, 1_800_001, 1_800_000], 5, 1).settled).toBe(true);
    expect(counterSettled([1_800_000, 1_800_001, 1_800_000, 1_800_001, 1_800_050], 5, 1).settled).toBe(false);
  });

  test('while fewer than N readings have arrived it is not settled, and reports what it has: [5, 7] → spread 2, mean 6, s = √2', () => {
    const state = counterSettled([5, 7], 3, 10);
    expect(state.settled).toBe(false);
    expect(state.window).toBe(2);
    expect(state.spreadHz).toBe(2);
    expect(state.mean).toBe(6);
    expectRelative(state.sd!, Math.SQRT2, 1e-15, 's of [5, 7]');
    expect(counterSettled([], 3, 10)).toEqual({ settled: false, window: 0, spreadHz: null, mean: null, sd: null });
    expect(counterSettled([9], 3, 10)).toEqual({ settled: false, window: 1, spreadHz: 0, mean: 9, sd: null });
  });

  test('mean and SD of the window agree with jstat at MHz magnitudes with sub-hertz spread', () => {
    const readings = [3_579_545.31, 3_579_545.12, 3_579_545.27, 3_579_545.19, 3_579_545.22, 3_579_545.25];
    const window = readings.slice(-5);
    const state = counterSettled(readings, 5, 0.5);
    expect(state.settled).toBe(true);
    expectRelative(state.mean!, jstat.mean(window), 1e-15, 'mean');
    expectRelative(state.sd!, jstat.stdev(window, true), 1e-6, 'sample SD');
  });

  test('refuses N below 2 or not whole, a negative tolerance and non-finite readings', () => {
    expect(errorCode(() => counterSettled([1, 2], 1, 1))).toBe('bad_argument');
    expect(errorCode(() => counterSettled([1, 2], 2.5, 1))).toBe('bad_argument');
    expect(errorCode(() => counterSettled([1, 2], 2, -1))).toBe('bad_argument');
    expect(errorCode(() => counterSettled([1, Number.NaN], 2, 1))).toBe('not_finite');
  });
});
