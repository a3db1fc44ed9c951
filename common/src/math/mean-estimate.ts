import { mean, sampleStandardDeviation } from 'simple-statistics';
import { MetrologyError } from './metrology-error.js';
import type { Estimate } from './welch-from-estimates.js';

/**
 * The mean of a sample as an estimate with its standard error and degrees of freedom:
 * x̄, s(x̄) = s/√n, ν = n − 1 (JCGM 100:2008, 4.2.3 Eq. 5 and G.3.3; s is the sample standard
 * deviation with n − 1, from simple-statistics' sampleStandardDeviation).
 *
 * @param values the sample (at least two values)
 * @returns { value: x̄, se: s/√n, df: n − 1 }
 * @throws {MetrologyError} 'too_few_points' under two values
 * @example meanEstimate([1, 2, 3, 4]); // => { value: 2.5, se: 0.6454972…, df: 3 } (s = √(5/3), s/√4)
 */
export function meanEstimate(values: readonly number[]): Estimate {
  if (values.length < 2) throw new MetrologyError('too_few_points', `meanEstimate requires at least 2 data points (got ${values.length})`);
  return { value: mean(values as number[]), se: sampleStandardDeviation(values as number[]) / Math.sqrt(values.length), df: values.length - 1 };
}
