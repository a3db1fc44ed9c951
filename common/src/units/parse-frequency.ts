import { FREQUENCY_UNIT_HZ, unitMultiplier, type FrequencyUnit } from './frequency-unit.js';
import { parseNumber } from './parse-number.js';
import { UnitParseError } from './unit-parse-error.js';

const UNIT_BY_LOWER_CASE: Readonly<Record<string, FrequencyUnit>> = { hz: 'Hz', khz: 'kHz', mhz: 'MHz' };

/**
 * Reads a frequency as a technician types it and returns hertz:
 * `1735 kHz`, `1.735 MHz`, `1735kHz`, `7 001,250 kHz`, `7 001.250 kHz`, or a bare
 * number (`1735000`, or a number value) which is read in `defaultUnit` (the range's
 * dial unit). Units are case-insensitive, so `mhz` means MHz (millihertz never occurs
 * on a bench dial). Number syntax as in {@link parseNumber}.
 *
 * @param input typed text, or a number in `defaultUnit`
 * @param defaultUnit unit of a bare number; default 'Hz'
 * @returns frequency in Hz, finite and greater than zero
 * @throws {UnitParseError} 'empty_input', 'bad_number', 'not_finite', 'negative_frequency',
 *   'zero_frequency', 'unknown_unit', 'bad_grouping' or 'mixed_separators', naming what was wrong
 * @example parseFrequency('1.735 MHz'); // => 1735000
 * @example parseFrequency('1735', 'kHz'); // => 1735000
 */
export function parseFrequency(input: string | number, defaultUnit: FrequencyUnit = 'Hz'): number {
  const defaultMultiplier = unitMultiplier(defaultUnit);
  let value: number;
  let multiplier = defaultMultiplier;
  if (typeof input === 'number') {
    value = parseNumber(input);
  } else {
    const text = typeof input === 'string' ? input.trim() : '';
    if (text === '') {
      throw new UnitParseError('empty_input', 'no frequency given (the input is empty)', String(input));
    }
    if (/^[+-]?(nan|inf(inity)?)$/i.test(text)) {
      throw new UnitParseError('not_finite', `'${input}' is not a finite frequency`, input);
    }
    const match = /^(.*?)\s*([a-zA-Z\u00b5]+)$/.exec(text);
    let numberText = text;
    if (match !== null) {
      const [, numberPart = '', unitText = ''] = match;
      const unit = UNIT_BY_LOWER_CASE[unitText.toLowerCase()];
      if (unit === undefined) {
        throw new UnitParseError('unknown_unit', `unknown unit '${unitText}' in '${input}' (use Hz, kHz or MHz)`, input);
      }
      if (numberPart.trim() === '') {
        throw new UnitParseError('empty_input', `'${input}' has a unit but no number`, input);
      }
      numberText = numberPart;
      multiplier = FREQUENCY_UNIT_HZ[unit];
    }
    try {
      value = parseNumber(numberText);
    } catch (error) {
      if (error instanceof UnitParseError) {
        throw new UnitParseError(error.code, `${error.message} (in '${input}')`, input);
      }
      throw error;
    }
  }
  if (value < 0 || Object.is(value, -0)) {
    throw new UnitParseError('negative_frequency', `frequency cannot be negative (got '${String(input)}')`, input);
  }
  if (value === 0) {
    throw new UnitParseError('zero_frequency', `frequency must be greater than zero (got '${String(input)}')`, input);
  }
  const hertz = value * multiplier;
  if (!Number.isFinite(hertz)) {
    throw new UnitParseError('not_finite', `'${String(input)}' is out of range`, input);
  }
  return hertz;
}
