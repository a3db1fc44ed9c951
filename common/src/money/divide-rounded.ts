import { MetrologyError } from '../math/metrology-error.js';

/**
 * a / b rounded to the nearest integer, halves away from zero, exactly (in BigInt, so a product of two large
 * amounts never loses a unit to floating point). The one rounding rule of every money figure.
 *
 * @example divideRounded(5, 2); // => 3
 * @example divideRounded(-5, 2); // => -3
 * @throws {MetrologyError} 'bad_argument' unless a is a safe integer and b a positive safe integer
 */
export function divideRounded(a: bigint | number, b: bigint | number): number {
  const n = BigInt(a);
  const d = BigInt(b);
  if (d <= 0n) throw new MetrologyError('bad_argument', `divideRounded requires a positive divisor (got ${d})`);
  const magnitude = n < 0n ? -n : n;
  const q = (2n * magnitude + d) / (2n * d);
  const result = n < 0n ? -q : q;
  if (result > BigInt(Number.MAX_SAFE_INTEGER) || result < -BigInt(Number.MAX_SAFE_INTEGER)) {
    throw new MetrologyError('bad_argument', 'divideRounded requires a result within the safe integer range');
  }
  return Number(result);
}
