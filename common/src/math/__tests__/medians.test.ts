// The medians found by selection (the MAD screen's two, detectGaps' median interval) against the sorted-array closed form:
// median = x₍₍ₙ₊₁₎/₂₎ for odd n, (x₍ₙ/₂₎ + x₍ₙ/₂₊₁₎)/2 for even n, on hand-worked arrays and on random ones with repeats.
import fc from 'fast-check';
import { detectGaps } from '../detect-gaps.js';
import { madOutliers } from '../mad-outliers.js';
import { medianInPlace } from '../median-in-place.js';

/** The closed form from a full sort (the way the median is defined, independent of the selection). */
function sortedMedian(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const n = sorted.length;
  return n % 2 === 1 ? sorted[(n - 1) / 2]! : (sorted[n / 2 - 1]! + sorted[n / 2]!) / 2;
}

describe('medians of the MAD screen, by hand', () => {
  test('odd n = 5: [7, 1, 4, 9, 3] sorts to [1, 3, 4, 7, 9], median 4; |y − 4| = [3, 3, 0, 5, 1] sorts to [0, 1, 3, 3, 5], MAD 3', () => {
    const values = [7, 1, 4, 9, 3];
    expect(sortedMedian(values)).toBe(4);
    const screen = madOutliers(values);
    expect(screen.median).toBe(4);
    expect(screen.mad).toBe(3);
    expect(screen.threshold).toBeCloseTo(5 * 1.4826 * 3, 12);
  });
  test('even n = 6: [7, 1, 4, 9, 3, 12] sorts to [1, 3, 4, 7, 9, 12], median (4 + 7)/2 = 5.5; deviations [1.5, 1.5, 2.5, 3.5, 4.5, 6.5], MAD (2.5 + 3.5)/2 = 3', () => {
    const values = [7, 1, 4, 9, 3, 12];
    expect(sortedMedian(values)).toBe(5.5);
    const screen = madOutliers(values);
    expect(screen.median).toBe(5.5);
    expect(screen.mad).toBe(3);
  });
  test('the two middle values equal, and the input left as it was', () => {
    const values = Object.freeze([2, 9, 5, 5, 1, 8]);
    expect(madOutliers(values).median).toBe(5);
    expect(values).toEqual([2, 9, 5, 5, 1, 8]);
  });
});

describe('medianInPlace() against the sorted closed form', () => {
  // Lengths past 600 take quickselect's Floyd–Rivest sampling step; small integers make repeats and ties likely.
  test('random arrays of odd and even length, with repeats, up to 2,000 values', () => {
    fc.assert(
      fc.property(
        fc.array(fc.oneof(fc.integer({ min: -20, max: 20 }), fc.double({ min: -1e6, max: 1e6, noNaN: true, noDefaultInfinity: true })), {
          minLength: 1,
          maxLength: 2_000,
        }),
        (values) => {
          // -0 and 0 compare equal but may swap places: compare as numbers, not by sign of zero.
          expect(medianInPlace(new Float64Array(values)) === sortedMedian(values)).toBe(true);
        },
      ),
      { numRuns: 300 },
    );
  });
  test('the MAD screen as a whole: same median, MAD and flagged indices as the sorted closed form', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -1_000, max: 1_000 }), { minLength: 3, maxLength: 1_500 }), (values) => {
        const center = sortedMedian(values);
        const mad = sortedMedian(values.map((v) => Math.abs(v - center)));
        const screen = madOutliers(values);
        expect(screen.median).toBe(center);
        expect(screen.mad).toBe(mad);
        expect(screen.indices).toEqual(mad > 0 ? values.flatMap((v, i) => (Math.abs(v - center) > 5 * 1.4826 * mad ? [i] : [])) : []);
      }),
      { numRuns: 200 },
    );
  });
});

describe('detectGaps(): the median interval, by hand', () => {
  test('odd count of intervals: t = [0, 1, 3, 4, 9, 10] gives intervals [1, 2, 1, 5, 1], sorted [1, 1, 1, 2, 5], median 1', () => {
    expect(detectGaps([0, 1, 3, 4, 9, 10], 1).medianInterval).toBe(1);
  });
  test('even count: t = [0, 2, 3, 7, 8] gives intervals [2, 1, 4, 1], sorted [1, 1, 2, 4], median (1 + 2)/2 = 1.5', () => {
    expect(detectGaps([0, 2, 3, 7, 8], 1).medianInterval).toBe(1.5);
  });
});
