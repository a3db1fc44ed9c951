import { assertFiniteArray, assertPositive, assertSameLength } from './guards.js';
import { MetrologyError } from './metrology-error.js';

/** Drift rate over one time window. */
export type DriftWindow = { tStart: number; tEnd: number; rateHzPerMin: number; n: number };

/**
 * Drift rate over sliding windows: in each window [tStart, tStart + W] the
 * least-squares slope of frequency against time (Sxy/Sxx about the window means),
 * times 60 to give Hz/min. Windows start at the first reading and advance by
 * `stepSeconds` (default W, i.e. back to back); only whole windows inside the record
 * are reported, and a window holding fewer than 3 readings (a gap) is left out of
 * the list rather than given a made-up rate. O(n·W/step).
 *
 * @param t seconds (ascending)
 * @param f frequency, Hz
 * @param windowSeconds window length W, s
 * @param opts stepSeconds: how far each window moves on (default W)
 * @returns one entry per window with at least 3 readings
 * @throws {MetrologyError} 'too_few_points' (under 3 readings), 'length_mismatch', 'not_finite',
 *   'not_sorted', 'bad_argument' (W or step ≤ 0), 'too_short' (record shorter than one window)
 * @example driftRateWindows([0, 60, 120, 180], [0, 1, 2, 3], 120); // => [{ tStart: 0, tEnd: 120, rateHzPerMin: 1, n: 3 }]
 */
export function driftRateWindows(t: ArrayLike<number>, f: ArrayLike<number>, windowSeconds: number, opts: { stepSeconds?: number } = {}): DriftWindow[] {
  const fn = 'driftRateWindows';
  assertSameLength(fn, t, f);
  if (t.length < 3) throw new MetrologyError('too_few_points', `${fn} requires at least 3 data points`);
  assertFiniteArray(fn, 't', t);
  assertFiniteArray(fn, 'f', f);
  assertPositive(fn, 'the window length', windowSeconds);
  const step = opts.stepSeconds ?? windowSeconds;
  assertPositive(fn, 'the window step', step);
  const n = t.length;
  for (let i = 1; i < n; i++) {
    if (t[i]! < t[i - 1]!) throw new MetrologyError('not_sorted', `${fn} requires times in ascending order (index ${i})`);
  }
  const tFirst = t[0]!;
  const tLast = t[n - 1]!;
  // A tiny allowance so a record of exactly k windows reports all k.
  const slack = 1e-9 * Math.max(windowSeconds, Math.abs(tLast));
  if (tLast - tFirst + slack < windowSeconds) {
    throw new MetrologyError('too_short', `${fn} requires a record at least one window (${windowSeconds} s) long`);
  }
  const windows: DriftWindow[] = [];
  let startIndex = 0;
  for (let k = 0; ; k++) {
    const tStart = tFirst + k * step;
    const tEnd = tStart + windowSeconds;
    if (tEnd > tLast + slack) break;
    while (startIndex < n && t[startIndex]! < tStart - slack) startIndex++;
    let endIndex = startIndex;
    while (endIndex < n && t[endIndex]! <= tEnd + slack) endIndex++;
    const count = endIndex - startIndex;
    if (count < 3) continue;
    let meanT = 0;
    let meanF = 0;
    for (let i = startIndex; i < endIndex; i++) {
      meanT += t[i]!;
      meanF += f[i]!;
    }
    meanT /= count;
    meanF /= count;
    let sxx = 0;
    let sxy = 0;
    for (let i = startIndex; i < endIndex; i++) {
      const dt = t[i]! - meanT;
      sxx += dt * dt;
      sxy += dt * (f[i]! - meanF);
    }
    if (!(sxx > 0)) continue;
    windows.push({ tStart, tEnd, rateHzPerMin: (sxy / sxx) * 60, n: count });
  }
  return windows;
}
