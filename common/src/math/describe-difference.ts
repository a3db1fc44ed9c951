import { MetrologyError } from './metrology-error.js';
import type { WelchDifference } from './welch-difference.js';

/**
 * A difference and its interval in plain words, e.g.
 * "after: settled drift rate lower by 4.1 Hz/min (95 % interval 2.9 to 5.3 Hz/min lower)".
 * "higher"/"lower" is the sign of the difference (b − a). Each end of the interval carries the
 * unit and its own direction, so the sentence never asks the reader to flip a sign: an interval
 * on one side of zero reads "2.9 to 5.3 Hz/min lower"; one that straddles zero reads from its low
 * end to its high end, "82 × 10⁻⁹ lower to 3 × 10⁻⁹ higher", followed by "so it includes no
 * change". Numbers are rounded so that the interval's half-width has two significant digits.
 *
 * @param label what b is (e.g. "after")
 * @param quantity what was compared (e.g. "settled drift rate")
 * @param unit unit text (e.g. "Hz/min" or "× 10⁻⁹"; may be empty)
 * @param diff result of welchDifference (or any { difference, low, high, confidence? })
 * @returns one sentence without a final period
 * @throws {MetrologyError} 'not_finite' for non-finite numbers
 * @example describeDifference('after', 'settled drift rate', 'Hz/min', { difference: -4.1, low: -5.3, high: -2.9 });
 * // => 'after: settled drift rate lower by 4.1 Hz/min (95 % interval 2.9 to 5.3 Hz/min lower)'
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
  // One end of the interval with its own direction: "3 × 10⁻⁹ higher", "82 × 10⁻⁹ lower", "no change".
  const end = (value: number) => {
    const text = show(Math.abs(value));
    if (Number(text) === 0) return 'no change';
    return `${text}${withUnit} ${value < 0 ? 'lower' : 'higher'}`;
  };
  const lowEnd = end(low);
  const highEnd = end(high);
  let interval: string;
  if (high < 0 && highEnd !== 'no change') interval = `${show(-high)} to ${show(-low)}${withUnit} lower`;
  else if (low > 0 && lowEnd !== 'no change') interval = `${show(low)} to ${show(high)}${withUnit} higher`;
  else interval = `${lowEnd} to ${highEnd}`;
  const straddles = low < 0 && high > 0 && lowEnd !== 'no change' && highEnd !== 'no change';
  const note = straddles ? ', so it includes no change' : '';
  const stated = `${percent} interval ${interval}${note}`;
  if (difference < 0) return `${label}: ${quantity} lower by ${show(-difference)}${withUnit} (${stated})`;
  if (difference > 0) return `${label}: ${quantity} higher by ${show(difference)}${withUnit} (${stated})`;
  return `${label}: ${quantity} unchanged (${stated})`;
}
