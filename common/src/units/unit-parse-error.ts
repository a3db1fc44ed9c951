import { MetrologyError, type MetrologyErrorCode } from '../math/metrology-error.js';

/**
 * Thrown by {@link parseFrequency} and {@link parseNumber} when typed input cannot be
 * read. `code` says what was wrong; `input` keeps the text as typed.
 *
 * @example
 * try { parseFrequency('12..3 kHz'); } catch (e) { (e as UnitParseError).code; } // => 'bad_number'
 */
export class UnitParseError extends MetrologyError {
  /** The input exactly as given. */
  readonly input: string;

  constructor(code: MetrologyErrorCode, message: string, input: string | number) {
    super(code, message);
    this.name = 'UnitParseError';
    this.input = String(input);
  }
}
