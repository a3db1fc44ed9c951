import { parseTimeInterval, UnitParseError } from '../index.js';

// SI submultiples of the second (the SI Brochure's prefixes: milli 10⁻³, micro 10⁻⁶, nano 10⁻⁹, pico 10⁻¹²).
describe('parseTimeInterval', () => {
  it('should read a number as seconds, of either sign', () => {
    expect(parseTimeInterval(1.25e-8)).toBe(1.25e-8);
    expect(parseTimeInterval(-3e-9)).toBe(-3e-9);
    expect(parseTimeInterval('0')).toBe(0);
  });

  it('should read the SI submultiples of the second', () => {
    // Exactly the double nearest the decimal value, as a counter's display means it.
    expect(parseTimeInterval('12.5 ns')).toBe(1.25e-8);
    expect(parseTimeInterval('3 ms')).toBe(0.003);
    expect(parseTimeInterval('-7 µs')).toBe(-0.000007);
    expect(parseTimeInterval('7us')).toBe(0.000007);
    expect(parseTimeInterval('250 ps')).toBe(2.5e-10);
    expect(parseTimeInterval('1,5 s')).toBe(1.5);
  });

  it('should refuse an unknown unit, an empty input, a non-finite value and one too large, naming each', () => {
    expect(() => parseTimeInterval('12 Hz')).toThrow("unknown unit 'Hz' in '12 Hz' (use s, ms, µs, ns or ps)");
    expect(() => parseTimeInterval('  ')).toThrow('no time interval given');
    expect(() => parseTimeInterval('NaN')).toThrow(UnitParseError);
    expect(() => parseTimeInterval(Number.POSITIVE_INFINITY)).toThrow(UnitParseError);
    expect(() => parseTimeInterval('20000 s')).toThrow('a time interval must lie within ±10000 s (got 20000 s)');
  });
});
