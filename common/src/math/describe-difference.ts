import { MetrologyError } from './metrology-error.js';
import type { WelchDifference } from './welch-difference.js';

/**
 * A difference and its interval in plain words, e.g.
 * "after: settled drift rate lower by 4.1 Hz/min, 95 % interval 2.9 to 5.3".
 * "higher"/"lower" is the sign of the difference (b − a); the interval is given for the
 * size of the change in that direction, and a closing "(the interval includes no
 * change)" is added when it straddles zero. Numbers are rounded so that the interval's
 * half-width has two significant digits.
 *
 * @param label what b is (e.g. "after")
 * @param quantity what was compared (e.g. "settled drift rate")
 * @param unit unit text (e.g. "Hz/min"; may be empty)
 * @param diff result of welchDifference (or any { difference, low, high, confidence? })
 * @returns one sentence without a final period
 * @throws {MetrologyError} 'not_finite' for non-finite numbers
 * @example describeDifference('after', 'settled drift rate', 'Hz/min', { difference: -4.1, low: -5.3, high: -2.9 });
 * // => 'after: settled drift rate lower by 4.1 Hz/min, 95 % interval 2.9 to 5.3'
 */
export function describeDifference(
  label: string,
  quantity: string,
  unit: string,
  diff: Pick<WelchDifference, 'difference' | 'low' | 'high'> & { confidence?: number },
): string {
  const { difference, low, high } = diff;
  if (![difference, low, high].every(Number.isFinite)) {
    throw new MetrologyError('not_finite', 'describeDifference requires finite difference and interval');
  }
  const confidence = diff.confidence ?? 0.95;
  const percent = `${Number((confidence * 100).toPrecision(4))} %`;
  const halfWidth = Math.abs(high - low) / 2;
  const decimals = halfWidth > 0 ? Math.max(0, 1 - Math.floor(Math.log10(halfWidth))) : 2;
  const show = (value: number) => {
    const text = value.toFixed(Math.min(decimals, 20));
    return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
  };
  const withUnit = unit === '' ? '' : ` ${unit}`;
  const straddles = low < 0 && high > 0;
  const note = straddles ? ' (the interval includes no change)' : '';
  if (difference < 0) {
    return `${label}: ${quantity} lower by ${show(-difference)}${withUnit}, ${percent} interval ${show(-high)} to ${show(-low)}${note}`;
  }
  if (difference > 0) {
    return `${label}: ${quantity} higher by ${show(difference)}${withUnit}, ${percent} interval ${show(low)} to ${show(high)}${note}`;
  }
  return `${label}: ${quantity} unchanged, ${percent} interval ${show(low)} to ${show(high)}${withUnit}`;
}
