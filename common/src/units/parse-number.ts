import { UnitParseError } from './unit-parse-error.js';

// Spaces a technician (or a spreadsheet) may put between digit groups:
// space, no-break space, thin space, narrow no-break space.
const GROUP_SPACES = /[ \u00a0\u2009\u202f]/;

/**
 * Reads a number as a person types it on the bench: `1735`, `1 735.5`, `7 001,250`,
 * `-3`, `1.5e6`. A single comma is read as the decimal mark (European style); digits
 * may be grouped in threes with spaces (regular, no-break or thin). A number input
 * is checked to be finite and returned as is.
 *
 * Not accepted (each gives a {@link UnitParseError} with its own code): empty text
 * ('empty_input'), NaN or Infinity ('not_finite'), repeated or misplaced decimal
 * marks such as `12..3` ('bad_number'), a comma and a point together such as
 * `1,735.5` ('mixed_separators': group with spaces instead), groups that are not
 * threes such as `70 01` ('bad_grouping').
 *
 * @param input text or number
 * @returns the value as a double
 * @throws {UnitParseError} as listed above
 * @example parseNumber('7 001,250'); // => 7001.25
 */
export function parseNumber(input: string | number): number {
  if (typeof input === 'number') {
    if (!Number.isFinite(input)) {
      throw new UnitParseError('not_finite', `number must be finite (got ${input})`, input);
    }
    return input;
  }
  if (typeof input !== 'string') {
    throw new UnitParseError('bad_number', `expected text or a number (got ${typeof input})`, String(input));
  }
  const text = input.trim();
  if (text === '') {
    throw new UnitParseError('empty_input', 'no number given (the input is empty)', input);
  }
  if (/^[+-]?(nan|inf(inity)?)$/i.test(text)) {
    throw new UnitParseError('not_finite', `'${input}' is not a finite number`, input);
  }
  if (text.includes(',') && text.includes('.')) {
    throw new UnitParseError('mixed_separators', `'${input}' mixes a comma and a point: use one decimal mark and group digits with spaces`, input);
  }
  const normalised = text.replace(',', '.');
  // sign, integer part (digits, optionally grouped), optional fraction, optional exponent
  const match = /^([+-]?)([0-9 \u00a0\u2009\u202f]*)(?:\.([0-9 \u00a0\u2009\u202f]*))?(?:[eE]([+-]?[0-9]+))?$/.exec(normalised);
  if (match === null) {
    throw new UnitParseError('bad_number', `'${input}' is not a number`, input);
  }
  const [, sign, integerPart = '', fractionPart = '', exponent] = match;
  const integerDigits = checkGroups(integerPart, 'integer', input);
  const fractionDigits = checkGroups(fractionPart, 'fraction', input);
  if (integerDigits === '' && fractionDigits === '') {
    throw new UnitParseError('bad_number', `'${input}' has no digits`, input);
  }
  const value = Number(`${sign}${integerDigits || '0'}.${fractionDigits || '0'}${exponent === undefined ? '' : `e${exponent}`}`);
  if (!Number.isFinite(value)) {
    throw new UnitParseError('not_finite', `'${input}' is out of range`, input);
  }
  return value;
}

// Checks digit grouping and returns the bare digits. Integer groups: first 1-3 digits,
// then exactly 3; fraction groups: exactly 3, the last 1-3.
function checkGroups(part: string, which: 'integer' | 'fraction', input: string): string {
  if (!GROUP_SPACES.test(part)) return part;
  const groups = part.split(GROUP_SPACES);
  const ok =
    groups.every((group) => group.length >= 1 && group.length <= 3) &&
    (which === 'integer' ? groups.slice(1).every((group) => group.length === 3) : groups.slice(0, -1).every((group) => group.length === 3));
  if (!ok) {
    throw new UnitParseError('bad_grouping', `'${input}' groups its ${which} digits oddly: use groups of three separated by one space`, input);
  }
  return groups.join('');
}
