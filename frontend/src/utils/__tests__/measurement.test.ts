import { describe, expect, it } from 'vitest';
import { formatBytes, formatCompact, formatCount } from '../measurement';

describe('formatCompact()', () => {
  it('drops trailing zeros and the digit-group spaces between them', () => {
    expect(formatCompact(1)).toBe('1');
    expect(formatCompact(0.09)).toBe('0.09');
    expect(formatCompact(1000)).toBe('1 000');
    expect(formatCompact(12.5)).toBe('12.5');
  });

  it('leaves exponent forms and missing values alone', () => {
    expect(formatCompact(2.5e-9)).toMatch(/^2\.500×10⁻⁹$/);
    expect(formatCompact(null)).toBe('—');
  });
});

describe('formatCount()', () => {
  it('groups digits in threes with a space, as every number of the app', () => {
    expect(formatCount(25_000)).toBe('25 000');
    expect(formatCount(400_001)).toBe('400 001');
    expect(formatCount(999)).toBe('999');
    expect(formatCount(null)).toBe('—');
  });
});

describe('formatBytes()', () => {
  it('says sizes in decimal units', () => {
    expect(formatBytes(812)).toBe('812 B');
    expect(formatBytes(4200)).toBe('4.2 kB');
    expect(formatBytes(18_600_000)).toBe('18.6 MB');
  });
});
