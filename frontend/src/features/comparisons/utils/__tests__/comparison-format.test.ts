import { describe, expect, it } from 'vitest';
import type { ComparisonEstimate } from '@kilocycle/common/types';
import { formatEstimate } from '../comparison-format';

// df and the interval play no part in the text; they are there to make a whole estimate.
const estimate = (value: number, se: number): ComparisonEstimate => ({ value, se, df: 10, low: value - 2 * se, high: value + 2 * se });

// A value is given to the last digit of its standard error, itself shown with two significant digits (GUM 7.2.6).
describe('formatEstimate()', () => {
  it('gives the value to the decimals of a two-digit standard error', () => {
    expect(formatEstimate(estimate(12.34567, 0.0234), 'Hz')).toBe('12.346 ± 0.023 Hz');
    expect(formatEstimate(estimate(1_750_012.4, 3.46), 'Hz')).toBe('1 750 012.4 ± 3.5 Hz');
  });

  it('counts the digits after rounding: a standard error of 0.0996 shows as 0.10', () => {
    expect(formatEstimate(estimate(5.4321, 0.0996), 'Hz')).toBe('5.43 ± 0.10 Hz');
  });
});
