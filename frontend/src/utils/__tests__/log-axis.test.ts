import { describe, expect, it } from 'vitest';
import { formatAxisNumber, logTicks } from '../log-axis';

describe('formatAxisNumber()', () => {
  it('prints a τ with float noise as the value it stands for', () => {
    // 0.1 s read back from time stamps: 0.09999999999990905 is 0.1 less a few parts in 10¹³.
    expect(formatAxisNumber(0.09999999999990905)).toBe('0.1');
    expect(formatAxisNumber(0.30000000000000004)).toBe('0.3');
  });

  it('keeps three significant digits and every whole-number digit (octaves of 0.1 s)', () => {
    expect(formatAxisNumber(1.6)).toBe('1.6');
    expect(formatAxisNumber(12.8)).toBe('12.8');
    expect(formatAxisNumber(0.8)).toBe('0.8');
    expect(formatAxisNumber(204.8)).toBe('205');
    expect(formatAxisNumber(1024)).toBe('1 024');
    expect(formatAxisNumber(0.0125)).toBe('0.012 5');
  });

  it('writes very small deviations as a power of ten, without trailing zeros', () => {
    expect(formatAxisNumber(1e-11)).toBe('1×10⁻¹¹');
    expect(formatAxisNumber(2e-11)).toBe('2×10⁻¹¹');
    expect(formatAxisNumber(2.5e-9)).toBe('2.5×10⁻⁹');
    expect(formatAxisNumber(3.14159e-12)).toBe('3.14×10⁻¹²');
    expect(formatAxisNumber(9.9999999999e-10)).toBe('1×10⁻⁹');
  });

  it('says when there is nothing to print', () => {
    expect(formatAxisNumber(null)).toBe('—');
    expect(formatAxisNumber(Number.NaN)).toBe('—');
    expect(formatAxisNumber(0)).toBe('0');
  });
});

describe('logTicks()', () => {
  it('puts 1, 2 and 5 of each decade while there is room', () => {
    expect(logTicks(0.1, 3.2)).toEqual([0.1, 0.2, 0.5, 1, 2]);
    expect(logTicks(1e-12, 5e-11)).toEqual([1e-12, 2e-12, 5e-12, 1e-11, 2e-11, 5e-11]);
  });

  it('falls back to decades, then to every second decade, when 1-2-5 would crowd the axis', () => {
    expect(logTicks(0.1, 409.6)).toEqual([0.1, 1, 10, 100]);
    expect(logTicks(0.1, 409.6, 3)).toEqual([0.1, 10]);
    expect(logTicks(1, 1e8, 5)).toEqual([1, 100, 1e4, 1e6, 1e8]);
  });

  it('leaves a span inside one decade, or a bad span, to the chart', () => {
    expect(logTicks(3, 8)).toEqual([]);
    expect(logTicks(0, 10)).toEqual([]);
    expect(logTicks(10, 1)).toEqual([]);
  });
});
