// Warm-up drift (PRODUCT §5.3): closed forms of f(t) = f∞ + A·e^(−t/τ) (+ c·t), recovery from
// an exact exponential plus seeded Gaussian noise within the stated standard errors.
import { driftRateWindows } from '../drift-rate-windows.js';
import { evaluateWarmup, fitWarmup } from '../fit-warmup.js';
import { settlingTime } from '../settling-time.js';
import { warmupSettling } from '../warmup-settling.js';
import { warmupSummary } from '../warmup-summary.js';
import { errorCode, expectRelative, seededGaussian } from './helpers.js';

type Truth = { fInf: number; amplitude: number; tau: number; linear?: number };

function simulate(truth: Truth, count: number, interval: number, noiseHz: number, seed: number, start = 0) {
  const gaussian = seededGaussian(seed);
  const t = Array.from({ length: count }, (_, i) => start + i * interval);
  const f = t.map((s) => truth.fInf + truth.amplitude * Math.exp(-s / truth.tau) + (truth.linear ?? 0) * s + noiseHz * gaussian());
  return { t, f };
}

const truth: Truth = { fInf: 7_000_000, amplitude: -250, tau: 600 };

describe('fitWarmup()', () => {
  test('an exact exponential is recovered to 1e-7 relative', () => {
    const { t, f } = simulate(truth, 400, 10, 0, 1);
    const fit = fitWarmup(Object.freeze(t), Object.freeze(f));
    expectRelative(fit.fInf, truth.fInf, 1e-12, 'f∞');
    expectRelative(fit.amplitude, truth.amplitude, 1e-7, 'A');
    expectRelative(fit.tau, truth.tau, 1e-7, 'τ');
    expect(fit.linear).toBeNull();
    expect(fit.converged).toBe(true);
    expect(fit.n).toBe(400);
  });

  test('exponential + noise: τ, A and f∞ within 3 standard errors (seed 2024)', () => {
    const { t, f } = simulate(truth, 721, 5, 2, 2024);
    const fit = fitWarmup(t, f);
    expect(Math.abs(fit.tau - truth.tau)).toBeLessThan(3 * fit.seTau);
    expect(Math.abs(fit.amplitude - truth.amplitude)).toBeLessThan(3 * fit.seAmplitude);
    expect(Math.abs(fit.fInf - truth.fInf)).toBeLessThan(3 * fit.seFInf);
    expectRelative(fit.residualSd, 2, 0.1, 'residual SD ≈ noise SD');
  });

  test('the stated standard error of τ is honest: about 68 % of 40 noisy runs fall within 1 SE', () => {
    let within = 0;
    const runs = 40;
    for (let seed = 1; seed <= runs; seed++) {
      const { t, f } = simulate(truth, 361, 10, 3, seed);
      const fit = fitWarmup(t, f);
      if (Math.abs(fit.tau - truth.tau) <= fit.seTau) within++;
    }
    // Binomial(40, 0.683): mean 27.3, SD 2.9; accept 4 SD either side.
    expect(within).toBeGreaterThanOrEqual(16);
    expect(within).toBeLessThanOrEqual(39);
  });

  test('with a linear term, c is recovered within 3 standard errors', () => {
    const withDrift: Truth = { ...truth, linear: 0.002 };
    const { t, f } = simulate(withDrift, 1200, 3, 0.5, 99);
    const fit = fitWarmup(t, f, { linearTerm: true });
    expect(Math.abs(fit.linear! - 0.002)).toBeLessThan(3 * fit.seLinear!);
    expect(Math.abs(fit.tau - truth.tau)).toBeLessThan(3 * fit.seTau);
  });

  test('a record starting after power-on still refers A to t = 0', () => {
    const { t, f } = simulate(truth, 300, 10, 0, 1, 120);
    const fit = fitWarmup(t, f);
    expectRelative(fit.amplitude, truth.amplitude, 1e-6, 'A at t = 0');
    expectRelative(fit.tau, truth.tau, 1e-6, 'τ');
  });

  test('100 000 readings go through the binned path and still recover τ within 3 SE', () => {
    const { t, f } = simulate(truth, 100_000, 0.05, 5, 5);
    const fit = fitWarmup(t, f);
    expect(fit.fittedPoints).toBe(2000);
    expect(Math.abs(fit.tau - truth.tau)).toBeLessThan(3 * fit.seTau);
    expectRelative(fit.residualSd, 5, 0.02, 'residual SD on all readings');
  });

  test('data that cannot support the model are refused with a clear code', () => {
    const flat = Array.from({ length: 50 }, (_, i) => i);
    expect(
      errorCode(() =>
        fitWarmup(
          flat,
          flat.map(() => 7e6),
        ),
      ),
    ).toBe('no_curvature');
    expect(
      errorCode(() =>
        fitWarmup(
          flat,
          flat.map((s) => 7e6 + 0.3 * s),
        ),
      ),
    ).toBe('no_curvature');
    const gaussian = seededGaussian(8);
    expect(
      errorCode(() =>
        fitWarmup(
          flat,
          flat.map(() => 7e6 + gaussian()),
        ),
      ),
    ).toBe('no_curvature');
  });

  test('bad input gives typed errors', () => {
    expect(errorCode(() => fitWarmup([1, 2, 3, 4, 5], [1, 2, 3, 4, 5]))).toBe('too_few_points');
    expect(() => fitWarmup([1, 2, 3, 4, 5], [1, 2, 3, 4, 5])).toThrow('fitWarmup requires at least 6 data points');
    expect(errorCode(() => fitWarmup([1, 2, 3, 4, 5, 6], [1, 2, 3, 4, 5, 6], { linearTerm: true }))).toBe('too_few_points');
    expect(errorCode(() => fitWarmup([1, 2, 3, 4, 5, 6], [1, 2, 3]))).toBe('length_mismatch');
    expect(errorCode(() => fitWarmup([1, 2, 3, 5, 4, 6], [1, 2, 3, 4, 5, 6]))).toBe('not_sorted');
    expect(errorCode(() => fitWarmup([1, 2, 3, 4, 5, Number.NaN], [1, 2, 3, 4, 5, 6]))).toBe('not_finite');
    expect(errorCode(() => fitWarmup([1, 1, 1, 1, 1, 1], [1, 2, 3, 4, 5, 6]))).toBe('too_short');
  });
});

describe('evaluateWarmup()', () => {
  test('the model at t (closed form) and bad fits refused', () => {
    expectRelative(evaluateWarmup({ fInf: 7e6, amplitude: -100, tau: 600, linear: 0.01 }, 600), 7e6 - 100 / Math.E + 6, 1e-15, 'f(τ)');
    expect(errorCode(() => evaluateWarmup({ fInf: 7e6, amplitude: -100, tau: 0, linear: null }, 1))).toBe('bad_argument');
    expect(errorCode(() => evaluateWarmup({ fInf: 7e6, amplitude: -100, tau: 600, linear: null }, Number.NaN))).toBe('not_finite');
  });
});

describe('settlingTime()', () => {
  const model = { fInf: 7e6, amplitude: -100, tau: 600, linear: null };
  test('within N Hz: t = τ·ln(|A|/N) (closed form)', () => {
    expectRelative(settlingTime(model, { kind: 'within_hz', hz: 1 })!, 600 * Math.log(100), 1e-14, 'within 1 Hz');
    expect(settlingTime(model, { kind: 'within_hz', hz: 200 })).toBe(0);
  });
  test('rate below R Hz/min: t = τ·ln(60|A|/(τR)) (closed form)', () => {
    // initial rate 100/600 Hz/s = 10 Hz/min; below 1 Hz/min after τ·ln 10
    expectRelative(settlingTime(model, { kind: 'rate_below', hzPerMin: 1 })!, 600 * Math.log(10), 1e-14, 'rate');
  });
  test('with a linear term the rate at the settling time equals the limit; null when the linear term alone exceeds it', () => {
    const withLinear = { ...model, linear: 0.005 }; // 0.3 Hz/min
    const t = settlingTime(withLinear, { kind: 'rate_below', hzPerMin: 1 })!;
    const rate = 60 * ((-withLinear.amplitude / withLinear.tau) * Math.exp(-t / withLinear.tau) + withLinear.linear);
    expectRelative(rate, 1, 1e-12, 'rate at t');
    expect(settlingTime({ ...model, linear: 0.02 }, { kind: 'rate_below', hzPerMin: 1 })).toBeNull();
  });
  test('bad criteria', () => {
    expect(errorCode(() => settlingTime(model, { kind: 'within_hz', hz: 0 }))).toBe('bad_argument');
    expect(errorCode(() => settlingTime(model, { kind: 'later' } as never))).toBe('bad_argument');
  });
});

describe('driftRateWindows()', () => {
  test('a straight line gives its slope in every window (closed form)', () => {
    const t = Array.from({ length: 61 }, (_, i) => i * 10);
    const f = t.map((s) => 7e6 + 0.05 * s); // 3 Hz/min
    const windows = driftRateWindows(t, f, 120);
    expect(windows).toHaveLength(5);
    windows.forEach((w) => expectRelative(w.rateHzPerMin, 3, 1e-9, `window at ${w.tStart}`));
    expect(windows[0]).toMatchObject({ tStart: 0, tEnd: 120, n: 13 });
    expect(driftRateWindows(t, f, 120, { stepSeconds: 60 })).toHaveLength(9);
  });
  test('on an exponential, the window rate approximates the derivative at the window centre', () => {
    const t = Array.from({ length: 3601 }, (_, i) => i);
    const f = t.map((s) => evaluateWarmup({ fInf: 7e6, amplitude: -100, tau: 600, linear: null }, s));
    const first = driftRateWindows(t, f, 60)[0]!;
    expectRelative(first.rateHzPerMin, 10 * Math.exp(-30 / 600), 1e-3, 'rate near t = 30 s');
  });
  test('windows over a gap are left out, not invented', () => {
    const t = [0, 10, 20, 30, 40, 50, 60, 200, 210, 220, 230, 240];
    const windows = driftRateWindows(
      t,
      t.map((s) => s),
      60,
    );
    expect(windows.map((w) => w.tStart)).toEqual([0, 180]);
  });
  test('bad input', () => {
    expect(errorCode(() => driftRateWindows([0, 1, 2], [0, 1, 2], 10))).toBe('too_short');
    expect(errorCode(() => driftRateWindows([0, 1, 2], [0, 1, 2], 0))).toBe('bad_argument');
    expect(errorCode(() => driftRateWindows([0, 1], [0, 1], 1))).toBe('too_few_points');
  });
});

describe('warmupSummary()', () => {
  test('first-hour drift = A(e^(−3600/τ) − 1); settled drift per 10 min from the readings', () => {
    const withDrift: Truth = { ...truth, linear: 0.001 };
    const { t, f } = simulate(withDrift, 721, 10, 0, 1);
    const fit = fitWarmup(t, f, { linearTerm: true });
    const summary = warmupSummary(t, f, fit);
    expectRelative(summary.driftFirstHourHz, truth.amplitude * (Math.exp(-6) - 1) + 3.6, 1e-6, 'first hour');
    expect(summary.firstHourCovered).toBe(true);
    expectRelative(summary.settledAtSeconds!, 5 * 600, 1e-6, 'settled at 5τ');
    // After 5τ the readings drift 0.6 Hz per 10 min from c, plus what is left of the exponential,
    // whose rate is at most 600·|A|/τ·e^(−5) ≈ 1.68 Hz per 10 min at t = 5τ and falls after.
    expect(summary.driftPer10MinAfterSettlingHz!).toBeGreaterThan(0.6);
    expect(summary.driftPer10MinAfterSettlingHz!).toBeLessThan(0.6 + 600 * (250 / 600) * Math.exp(-5));
  });
  test('a short record says its first hour is extrapolated and has no settled drift', () => {
    const { t, f } = simulate(truth, 100, 10, 0, 1);
    const summary = warmupSummary(t, f, fitWarmup(t, f), { kind: 'within_hz', hz: 1 });
    expect(summary.firstHourCovered).toBe(false);
    expect(summary.driftPer10MinAfterSettlingHz).toBeNull();
  });
});

describe('warmupSettling()', () => {
  // Closed forms for A = −100 Hz, τ = 600 s, no linear term: within 1 Hz at τ·ln(100) ≈ 2 763 s;
  // |df/dt| = (|A|/τ)·e^(−t/τ) = 10 Hz/min at t = 0, so below 1 Hz/min from τ·ln(10) ≈ 1 382 s.
  const model = { amplitude: -100, tau: 600, linear: null };
  const criteria = { withinHz: 1, rateHzPerMin: 1 };

  test('a record of 14 s marks both settling times as beyond the last reading', () => {
    const s = warmupSettling([0, 7, 14], model, criteria);
    expectRelative(s.withinSeconds!, 600 * Math.log(100), 1e-14, 'within 1 Hz');
    expectRelative(s.rateSeconds!, 600 * Math.log(10), 1e-14, 'below 1 Hz/min');
    expect(s).toMatchObject({ withinExtrapolated: true, rateExtrapolated: true, lastReadingSeconds: 14, withinHz: 1, rateHzPerMin: 1 });
  });
  test('a record between the two times marks only the later one; readings out of order still give the last time', () => {
    const s = warmupSettling([2000, 0, 1000], model, criteria);
    expect(s).toMatchObject({ rateExtrapolated: false, withinExtrapolated: true, lastReadingSeconds: 2000 });
  });
  test('a record past both times marks neither; a settling time at the last reading itself is inside the record', () => {
    expect(warmupSettling([0, 3000], model, criteria)).toMatchObject({ withinExtrapolated: false, rateExtrapolated: false });
    // Within 100 Hz at t = 0 (|A| = 100): settled from power-on, inside any record.
    expect(warmupSettling([0], model, { withinHz: 100, rateHzPerMin: 10 })).toMatchObject({
      withinSeconds: 0,
      withinExtrapolated: false,
      rateSeconds: 0,
      rateExtrapolated: false,
    });
  });
  test('a rule never met is null and not an extrapolation', () => {
    // A linear drift of 0.02 Hz/s = 1.2 Hz/min never falls below 1 Hz/min.
    const s = warmupSettling([0, 14], { ...model, linear: 0.02 }, criteria);
    expect(s.rateSeconds).toBeNull();
    expect(s.rateExtrapolated).toBe(false);
  });
  test('no readings, a non-finite time or a bad criterion is refused', () => {
    expect(errorCode(() => warmupSettling([], model, criteria))).toBe('too_few_points');
    expect(errorCode(() => warmupSettling([0, Number.NaN], model, criteria))).toBe('not_finite');
    expect(errorCode(() => warmupSettling([0, 1], model, { withinHz: 0, rateHzPerMin: 1 }))).toBe('bad_argument');
  });
});
