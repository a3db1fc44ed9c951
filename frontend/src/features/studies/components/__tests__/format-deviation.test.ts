import { describe, expect, it } from 'vitest';
import { formatDeviation } from '../stability-view';

describe('formatDeviation()', () => {
  it('writes a deviation in three significant digits times a power of ten', () => {
    expect(formatDeviation(8.0213e-9)).toBe('8.02×10⁻⁹');
    expect(formatDeviation(2.34e-10)).toBe('2.34×10⁻¹⁰');
    expect(formatDeviation(5e-12, 1)).toBe('5×10⁻¹²');
  });

  it('carries a mantissa that rounds up to ten into the exponent', () => {
    // 9.9996 × 10⁻¹⁰ to three digits is 1.00 × 10⁻⁹.
    expect(formatDeviation(9.9996e-10)).toBe('1.00×10⁻⁹');
  });

  it('says when there is nothing to print', () => {
    expect(formatDeviation(null)).toBe('—');
    expect(formatDeviation(0)).toBe('0');
  });
});
