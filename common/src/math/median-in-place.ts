import { quickselect } from 'simple-statistics';

/**
 * Median of a scratch array, found by selection rather than a sort: simple-statistics' quickselect (Floyd–Rivest)
 * puts the ⌊n/2⌋-th smallest value at index ⌊n/2⌋ with every value before it no greater, in O(n). The median is that
 * value for odd n, and for even n the mean of it and the largest value before it, (x₍ₙ/₂₎ + x₍ₙ/₂₊₁₎)/2 in order
 * statistics: the same values, added the same way, as taking the middle of the sorted array. Internal: callers check
 * the input (finite, at least one value).
 *
 * @param scratch the values, in any order; REARRANGED in place (pass a copy)
 * @returns the median
 * @example medianInPlace(new Float64Array([7, 1, 4, 9, 3, 12])); // => 5.5
 */
export function medianInPlace(scratch: Float64Array): number {
  const middle = scratch.length >> 1;
  // quickselect is typed for number[]; it only reads, compares and swaps by index, which a Float64Array does too.
  quickselect(scratch as unknown as number[], middle);
  const upper = scratch[middle]!;
  if (scratch.length % 2 === 1) return upper;
  let lower = scratch[0]!;
  for (let i = 1; i < middle; i++) if (scratch[i]! > lower) lower = scratch[i]!;
  return (lower + upper) / 2;
}
