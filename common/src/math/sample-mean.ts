import { mean } from 'simple-statistics';
import { MetrologyError } from './metrology-error.js';

/**
 * Arithmetic mean x̄ = Σxᵢ / n of a sample (JCGM 100:2008, 4.2.1, Eq. 3), by simple-statistics'
 * `mean` (compensated summation, so a million readings near 7 MHz keep their last digits). Takes
 * typed arrays as well as plain ones.
 *
 * @param values the sample (at least one value)
 * @returns x̄
 * @throws {MetrologyError} 'too_few_points' for an empty sample
 * @example sampleMean([7_000_010, 7_000_012, 7_000_014]); // => 7000012
 */
export function sampleMean(values: ArrayLike<number>): number {
  if (values.length === 0) throw new MetrologyError('too_few_points', 'sampleMean requires at least 1 data point');
  return mean(values as number[]);
}
