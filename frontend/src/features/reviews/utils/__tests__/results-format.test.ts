import { describe, expect, it } from 'vitest';
import { formatUncertainty } from '../results-format';

// GUM 7.2.6: an expanded uncertainty is stated with at most two significant digits; ties round half away from zero
// (common practice, no published source for the tie rule).
describe('formatUncertainty()', () => {
  it('shows two significant digits whatever the size', () => {
    expect(formatUncertainty(0.01234)).toBe('0.012 Hz');
    expect(formatUncertainty(1.25)).toBe('1.3 Hz');
    expect(formatUncertainty(83.4)).toBe('83 Hz');
    expect(formatUncertainty(1234)).toBe('1 200 Hz');
  });

  it('counts the digits after rounding: 0.0996 is 0.10, not 0.100', () => {
    expect(formatUncertainty(0.0996)).toBe('0.10 Hz');
    expect(formatUncertainty(9.96)).toBe('10 Hz');
  });
});
