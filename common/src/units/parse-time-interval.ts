import { MAX_TIME_INTERVAL_S } from '../types/lab.js';
import { parseNumber } from './parse-number.js';
import { UnitParseError } from './unit-parse-error.js';

/**
 * SI submultiples of the second a time-interval counter shows, as divisors: each is a power of ten held exactly
 * in a double, so dividing by it gives the correctly rounded seconds (12.5 ns → 1.25e-8, where × 1e-9 gives 1.2500000000000001e-8).
 */
const UNITS_PER_SECOND: Readonly<Record<string, number>> = { s: 1, ms: 1e3, us: 1e6, µs: 1e6, μs: 1e6, ns: 1e9, ps: 1e12 };

/**
 * Reads a time interval (a phase reading: a time-interval counter's start-to-stop time against a reference)
 * and returns seconds: a number is seconds; text is a number as {@link parseNumber} reads it, optionally
 * followed by s, ms, µs (or us), ns or ps (`12.5 ns`, `-3.2e-9`, `0,000 000 012 5 s`). Any sign: the
 * interval may lead or lag. At most {@link MAX_TIME_INTERVAL_S} either side of zero.
 *
 * @param input typed text, or a number in seconds
 * @returns seconds, finite
 * @throws {UnitParseError} 'empty_input', 'bad_number', 'not_finite', 'unknown_unit', 'bad_argument' (too large)
 * @example parseTimeInterval('12.5 ns'); // => 1.25e-8
 * @example parseTimeInterval(-3e-9); // => -3e-9
 */
export function parseTimeInterval(input: string | number): number {
  let value: number;
  let divisor = 1;
  if (typeof input === 'number') {
    value = parseNumber(input);
  } else {
    const text = typeof input === 'string' ? input.trim() : '';
    if (text === '') throw new UnitParseError('empty_input', 'no time interval given (the input is empty)', String(input));
    if (/^[+-]?(nan|inf(inity)?)$/i.test(text)) throw new UnitParseError('not_finite', `'${input}' is not a finite time interval`, input);
    const match = /^(.*?)\s*([a-zA-Zµμ]+)$/.exec(text);
    let numberText = text;
    if (match !== null) {
      const [, numberPart = '', unitText = ''] = match;
      const perSecond = UNITS_PER_SECOND[unitText] ?? UNITS_PER_SECOND[unitText.toLowerCase()];
      if (perSecond === undefined) throw new UnitParseError('unknown_unit', `unknown unit '${unitText}' in '${input}' (use s, ms, µs, ns or ps)`, input);
      if (numberPart.trim() === '') throw new UnitParseError('empty_input', `'${input}' has a unit but no number`, input);
      numberText = numberPart;
      divisor = perSecond;
    }
    try {
      value = parseNumber(numberText);
    } catch (error) {
      if (error instanceof UnitParseError) throw new UnitParseError(error.code, `${error.message} (in '${input}')`, input);
      throw error;
    }
  }
  const seconds = value / divisor;
  if (!Number.isFinite(seconds)) throw new UnitParseError('not_finite', `'${String(input)}' is out of range`, input);
  if (Math.abs(seconds) > MAX_TIME_INTERVAL_S) {
    throw new UnitParseError('bad_argument', `a time interval must lie within ±${MAX_TIME_INTERVAL_S} s (got ${seconds} s)`, input);
  }
  return seconds;
}
