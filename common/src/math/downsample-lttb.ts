import { assertFiniteArray, assertSameLength } from './guards.js';
import { MetrologyError } from './metrology-error.js';

/**
 * Largest-Triangle-Three-Buckets downsampling for charts (Steinarsson 2013, "Downsampling
 * Time Series for Visual Representation", MSc thesis, University of Iceland, §4.2): keeps
 * the first and last points and, from each of threshold − 2 equal buckets, the point
 * forming the largest triangle with the point kept before it and the mean of the next
 * bucket. O(n). Input shorter than or equal to the threshold comes back as copies.
 *
 * @param x abscissae (e.g. seconds), ascending
 * @param y ordinates
 * @param threshold number of points wanted, ≥ 3
 * @returns the kept points
 * @throws {MetrologyError} 'length_mismatch', 'not_finite', 'bad_argument' (threshold not an integer ≥ 3)
 * @example downsampleLttb([0, 1, 2, 3, 4], [0, 5, 0, 1, 0], 3); // => { x: [0, 1, 4], y: [0, 5, 0] }
 */
export function downsampleLttb(x: ArrayLike<number>, y: ArrayLike<number>, threshold: number): { x: number[]; y: number[] } {
  const fn = 'downsampleLttb';
  assertSameLength(fn, x, y);
  if (!Number.isInteger(threshold) || threshold < 3) {
    throw new MetrologyError('bad_argument', `${fn} requires an integer threshold of 3 or more (got ${threshold})`);
  }
  assertFiniteArray(fn, 'x', x);
  assertFiniteArray(fn, 'y', y);
  const n = x.length;
  if (n <= threshold) return { x: Array.from(x), y: Array.from(y) };

  const outX: number[] = [x[0]!];
  const outY: number[] = [y[0]!];
  const bucketSize = (n - 2) / (threshold - 2);
  let kept = 0;
  for (let bucket = 0; bucket < threshold - 2; bucket++) {
    // Mean of the next bucket (the last point for the final bucket).
    const nextStart = Math.floor((bucket + 1) * bucketSize) + 1;
    const nextEnd = Math.min(Math.floor((bucket + 2) * bucketSize) + 1, n);
    let meanX = 0;
    let meanY = 0;
    for (let i = nextStart; i < nextEnd; i++) {
      meanX += x[i]!;
      meanY += y[i]!;
    }
    const nextCount = nextEnd - nextStart;
    if (nextCount > 0) {
      meanX /= nextCount;
      meanY /= nextCount;
    } else {
      meanX = x[n - 1]!;
      meanY = y[n - 1]!;
    }
    const start = Math.floor(bucket * bucketSize) + 1;
    const end = Math.floor((bucket + 1) * bucketSize) + 1;
    const ax = x[kept]!;
    const ay = y[kept]!;
    let bestArea = -1;
    let bestIndex = start;
    for (let i = start; i < end; i++) {
      const area = Math.abs((ax - meanX) * (y[i]! - ay) - (ax - x[i]!) * (meanY - ay));
      if (area > bestArea) {
        bestArea = area;
        bestIndex = i;
      }
    }
    outX.push(x[bestIndex]!);
    outY.push(y[bestIndex]!);
    kept = bestIndex;
  }
  outX.push(x[n - 1]!);
  outY.push(y[n - 1]!);
  return { x: outX, y: outY };
}
