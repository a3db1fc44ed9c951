/**
 * Machine-readable reason for a {@link MetrologyError}. Callers switch on it
 * (for example to map it to an HTTP 422 with a field name); the message is for people.
 */
export type MetrologyErrorCode =
  | 'too_few_points'
  | 'length_mismatch'
  | 'not_finite'
  | 'bad_frequency'
  | 'bad_dial'
  | 'bad_argument'
  | 'no_spread'
  | 'not_sorted'
  | 'not_monotonic'
  | 'outside_table'
  | 'outside_span'
  | 'no_convergence'
  | 'no_curvature'
  | 'too_short'
  | 'zero_uncertainty'
  | 'region_not_available'
  | 'empty_input'
  | 'bad_number'
  | 'negative_frequency'
  | 'zero_frequency'
  | 'unknown_unit'
  | 'bad_grouping'
  | 'mixed_separators'
  | 'phase_only'
  | 'gap_at_end';

/**
 * The one error type thrown by every function in `common/math` and `common/units`
 * for bad input or an unsupported case. Never a silent 0 or NaN.
 *
 * @example
 * try { fitLine([1], [2]); } catch (e) { if (e instanceof MetrologyError) e.code; } // => 'too_few_points'
 */
export class MetrologyError extends Error {
  /** Machine-readable reason, stable across releases. */
  readonly code: MetrologyErrorCode;

  constructor(code: MetrologyErrorCode, message: string) {
    super(message);
    this.name = 'MetrologyError';
    this.code = code;
  }
}
