import { fitLine } from './fit-line.js';

/**
 * Supply sensitivity (PRODUCT §5.5): least-squares slope of frequency against supply
 * voltage with its standard error ({@link fitLine}).
 *
 * @param volts supply voltage at each reading, V (at least 3, two or more distinct)
 * @param freqs frequency at each reading, Hz
 * @returns Hz per volt, its standard error, number of readings
 * @throws {MetrologyError} as fitLine ('too_few_points', 'length_mismatch', 'not_finite', 'no_spread')
 * @example supplySensitivity([210, 230, 250], [7_000_020, 7_000_000, 6_999_980]).hzPerVolt; // => -1
 */
export function supplySensitivity(volts: ArrayLike<number>, freqs: ArrayLike<number>): { hzPerVolt: number; seHzPerVolt: number; n: number } {
  const line = fitLine(volts, freqs);
  return { hzPerVolt: line.slope, seHzPerVolt: line.seSlope, n: line.n };
}
