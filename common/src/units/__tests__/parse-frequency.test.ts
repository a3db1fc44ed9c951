// Units and parsing. Expected values are exact decimal arithmetic done by hand
// (common practice, no published source: how technicians write frequencies).
import fc from 'fast-check';
import { formatFrequency, parseFrequency, parseNumber, UnitParseError, MetrologyError } from '../index.js';

function codeOf(fn: () => unknown): string {
  try {
    fn();
  } catch (error) {
    if (error instanceof UnitParseError) return error.code;
    throw error;
  }
  throw new Error('expected a UnitParseError');
}

describe('parseFrequency()', () => {
  test.each([
    ['1735 kHz', undefined, 1_735_000],
    ['1.735 MHz', undefined, 1_735_000],
    ['1735000', undefined, 1_735_000],
    ['7 001,250 kHz', undefined, 7_001_250],
    ['7 001.250 kHz', undefined, 7_001_250],
    ['1735kHz', undefined, 1_735_000],
    ['1735 KHZ', undefined, 1_735_000],
    ['1.735 mhz', undefined, 1_735_000],
    ['  455 hz ', undefined, 455],
    ['1735', 'kHz', 1_735_000],
    ['7,15', 'MHz', 7_150_000],
    ['7\u2009001.250 kHz', undefined, 7_001_250],
    ['1.5e6 Hz', undefined, 1_500_000],
  ] as const)('%s (default %s) is %d Hz', (input, unit, expected) => {
    expect(parseFrequency(input, unit)).toBeCloseTo(expected, 6);
  });

  test('a number is read in the default unit', () => {
    expect(parseFrequency(1750, 'kHz')).toBe(1_750_000);
    expect(parseFrequency(1750)).toBe(1750);
  });

  test.each([
    ['', 'empty_input'],
    ['   ', 'empty_input'],
    ['kHz', 'empty_input'],
    ['-5 kHz', 'negative_frequency'],
    ['0 MHz', 'zero_frequency'],
    ['0', 'zero_frequency'],
    ['NaN', 'not_finite'],
    ['Infinity', 'not_finite'],
    ['12..3', 'bad_number'],
    ['12..3 kHz', 'bad_number'],
    ['1735 GHz', 'unknown_unit'],
    ['1735 furlongs', 'unknown_unit'],
    ['1,735.5 kHz', 'mixed_separators'],
    ['70 01 kHz', 'bad_grouping'],
    ['abc', 'unknown_unit'],
    ['1.2.3', 'bad_number'],
  ])('%j is refused with %s', (input, code) => {
    expect(codeOf(() => parseFrequency(input))).toBe(code);
  });

  test('numbers that are not finite, negative or zero are refused', () => {
    expect(codeOf(() => parseFrequency(Number.NaN))).toBe('not_finite');
    expect(codeOf(() => parseFrequency(Number.POSITIVE_INFINITY))).toBe('not_finite');
    expect(codeOf(() => parseFrequency(-1))).toBe('negative_frequency');
    expect(codeOf(() => parseFrequency(0))).toBe('zero_frequency');
  });

  test('the error is a MetrologyError and names the input', () => {
    try {
      parseFrequency('12..3 kHz');
    } catch (error) {
      expect(error).toBeInstanceOf(MetrologyError);
      expect((error as UnitParseError).message).toContain('12..3 kHz');
      expect((error as UnitParseError).input).toBe('12..3 kHz');
    }
  });

  test('round trip: formatFrequency then parseFrequency returns the value at the printed resolution (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 30_000_000_000 }), fc.constantFrom('Hz', 'kHz', 'MHz' as const), (milliUnits, unit) => {
        const perUnit = { Hz: 1, kHz: 1e3, MHz: 1e6 }[unit];
        const hz = (milliUnits / 1000) * perUnit;
        const back = parseFrequency(formatFrequency(hz, unit, 3));
        return Math.abs(back - hz) <= 1e-12 * hz;
      }),
      { numRuns: 300 },
    );
  });
});

describe('parseNumber()', () => {
  test.each([
    ['12,5', 12.5],
    ['-3', -3],
    ['1 000 000', 1_000_000],
    ['0.000 1', 0.0001],
    ['.5', 0.5],
    ['+7', 7],
  ])('%j is %d', (input, expected) => {
    expect(parseNumber(input)).toBeCloseTo(expected, 12);
  });
  test.each([
    ['', 'empty_input'],
    ['-', 'bad_number'],
    ['1,2,3', 'bad_number'],
    ['12..3', 'bad_number'],
    ['1 23 4', 'bad_grouping'],
    ['inf', 'not_finite'],
  ])('%j is refused with %s', (input, code) => {
    expect(codeOf(() => parseNumber(input))).toBe(code);
  });
  test('non-finite numbers are refused', () => {
    expect(codeOf(() => parseNumber(Number.NaN))).toBe('not_finite');
  });
});

describe('formatFrequency()', () => {
  test.each([
    [7_001_250, 'kHz', 3, '7 001.250 kHz'],
    [1_735_000, 'kHz', 0, '1 735 kHz'],
    [1_735_000, 'MHz', 6, '1.735 000 MHz'],
    [455, 'Hz', 0, '455 Hz'],
    [28_000_000, 'Hz', 1, '28 000 000.0 Hz'],
    [-15_000, 'kHz', 3, '-15.000 kHz'],
    [-0.0001, 'Hz', 2, '0.00 Hz'],
    [1234.56789, 'Hz', 5, '1 234.567 89 Hz'],
  ] as const)('%d Hz in %s with %d decimals is %j', (hz, unit, decimals, expected) => {
    expect(formatFrequency(hz, unit, decimals)).toBe(expected);
  });
  test('bad input is refused', () => {
    expect(codeOf(() => formatFrequency(Number.NaN, 'Hz', 0))).toBe('not_finite');
    expect(codeOf(() => formatFrequency(1, 'Hz', -1))).toBe('bad_number');
    expect(codeOf(() => formatFrequency(1, 'Hz', 1.5))).toBe('bad_number');
    expect(codeOf(() => formatFrequency(1, 'GHz' as never, 1))).toBe('unknown_unit');
  });
});
