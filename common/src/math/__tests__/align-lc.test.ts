// Alignment and padding: closed forms of the LC law f = 1/(2π√(LC)) on a simulated circuit,
// and a fact of the trade.
import fc from 'fast-check';
import { alignLC, frequencyWithPadder, paddingForShift } from '../align-lc.js';
import { errorCode, expectRelative } from './helpers.js';

const resonance = (henry: number, farad: number) => 1 / (2 * Math.PI * Math.sqrt(henry * farad));

describe('alignLC()', () => {
  test('the computed L and parallel-C moves put both ends of a simulated circuit on their marks to 1e-9 (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-6, max: 100e-6, noNaN: true }), // design L, H
        fc.double({ min: 50e-12, max: 500e-12, noNaN: true }), // C at the low end, F
        fc.double({ min: 1.1, max: 4, noNaN: true }), // C_low / C_high
        fc.double({ min: -0.05, max: 0.05, noNaN: true }), // inductance error
        fc.double({ min: -0.1, max: 0.1, noNaN: true }), // stray parallel C error, fraction of C_high
        (inductance, cLow, ratio, lError, cError) => {
          const cHigh = cLow / ratio;
          const targets = { low: resonance(inductance, cLow), high: resonance(inductance, cHigh) };
          // The instrument as found: L and a stray parallel capacitance both off.
          const lNow = inductance * (1 + lError);
          const stray = cError * cHigh;
          const cLowNow = cLow + stray;
          const cHighNow = cHigh + stray;
          const result = alignLC({
            lowMeasured: resonance(lNow, cLowNow),
            lowTarget: targets.low,
            highMeasured: resonance(lNow, cHighNow),
            highTarget: targets.high,
            tuningCapLowPf: cLowNow * 1e12,
          });
          // Apply the moves to the simulated circuit.
          const lAfter = lNow * (1 + result.inductanceChange);
          const added = result.parallelCapChangePf! * 1e-12;
          const lowAfter = resonance(lAfter, cLowNow + added);
          const highAfter = resonance(lAfter, cHighNow + added);
          return (
            Math.abs(lowAfter / targets.low - 1) < 1e-9 &&
            Math.abs(highAfter / targets.high - 1) < 1e-9 &&
            Math.abs(result.parallelCapChangeFraction * cLowNow * 1e12 - result.parallelCapChangePf!) < 1e-9 * Math.abs(result.parallelCapChangePf! || 1)
          );
        },
      ),
      { numRuns: 300 },
    );
  });

  test('the mid-range prediction equals the simulated circuit when the mid point is measured (closed form)', () => {
    const inductance = 10e-6;
    const c = { low: 400e-12, mid: 250e-12, high: 150e-12 };
    const lNow = inductance * 1.02;
    const stray = 8e-12;
    const measured = (farad: number) => resonance(lNow, farad + stray);
    const result = alignLC({
      lowMeasured: measured(c.low),
      lowTarget: resonance(inductance, c.low),
      highMeasured: measured(c.high),
      highTarget: resonance(inductance, c.high),
      midMeasured: measured(c.mid),
      midTarget: resonance(inductance, c.mid),
    });
    // The circuit error is only in L and a parallel C, so the moves restore it exactly: no tracking error left.
    expect(Math.abs(result.predictedMidTrackingHz)).toBeLessThan(1e-6);
    expect(result.parallelCapChangePf).toBeNull();
  });

  test('an instrument already on its marks needs no move and has no tracking error', () => {
    const result = alignLC({ lowMeasured: 1.75e6, lowTarget: 1.75e6, highMeasured: 2e6, highTarget: 2e6 });
    expect(result.inductanceChange).toBeCloseTo(0, 14);
    expect(result.parallelCapChangeFraction).toBeCloseTo(0, 14);
    expect(result.predictedMidTrackingHz).toBeCloseTo(0, 6);
    expect(result.midTargetHz).toBe(1.875e6);
  });

  test('a uniformly low instrument (same ratio at both ends) needs only an inductance change', () => {
    const result = alignLC({ lowMeasured: 1.735e6, lowTarget: 1.75e6, highMeasured: 1.735e6 * (2 / 1.75), highTarget: 2e6 });
    expect(result.parallelCapChangeFraction).toBeCloseTo(0, 12);
    expectRelative(result.inductanceChange, (1.735 / 1.75) ** 2 - 1, 1e-12, 'ΔL/L');
  });

  test('bad input', () => {
    expect(errorCode(() => alignLC({ lowMeasured: 0, lowTarget: 1, highMeasured: 2, highTarget: 2 }))).toBe('bad_frequency');
    expect(errorCode(() => alignLC({ lowMeasured: 2, lowTarget: 1, highMeasured: 1, highTarget: 2 }))).toBe('bad_frequency');
    expect(errorCode(() => alignLC({ lowMeasured: 1, lowTarget: 1, highMeasured: 2, highTarget: 1 }))).toBe('bad_frequency');
  });

  test('a wildly different target ratio still gives a solution with positive capacitances (closed form: 1 + δ > 0, 1 + δρ > 0)', () => {
    const result = alignLC({ lowMeasured: 1e6, lowTarget: 1e6, highMeasured: 2e6, highTarget: 1.0001e6 });
    expect(result.parallelCapChangeFraction).toBeGreaterThan(1000);
    expect(1 + result.inductanceChange).toBeGreaterThan(0);
  });
});

describe('paddingForShift() and frequencyWithPadder()', () => {
  test('27 pF across 74.8 pF moves 7.0 MHz to 6.0 MHz ±0.01 MHz (common practice, no published source)', () => {
    expect(Math.abs(frequencyWithPadder(7e6, 74.8, 27) - 6e6)).toBeLessThanOrEqual(0.01e6);
    expect(Math.abs(paddingForShift(7e6, 6e6, 74.8) - 27)).toBeLessThan(0.1);
  });

  test('the two are inverse (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e5, max: 1e8, noNaN: true }),
        fc.double({ min: 0.5, max: 1.5, noNaN: true }),
        fc.double({ min: 5, max: 1000, noNaN: true }),
        (f1, ratio, capacitance) => {
          const f2 = f1 * ratio;
          const padder = paddingForShift(f1, f2, capacitance);
          return Math.abs(frequencyWithPadder(f1, capacitance, padder) / f2 - 1) < 1e-12;
        },
      ),
    );
  });

  test('bad input', () => {
    expect(errorCode(() => paddingForShift(7e6, 0, 74.8))).toBe('bad_frequency');
    expect(errorCode(() => paddingForShift(7e6, 6e6, 0))).toBe('bad_argument');
    expect(errorCode(() => frequencyWithPadder(7e6, 74.8, -80))).toBe('bad_argument');
  });
});
