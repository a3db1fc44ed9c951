import { assertFinite } from './guards.js';
import { MetrologyError } from './metrology-error.js';

/**
 * The inverse of a calibration: which dial setting gives frequency F, by linear
 * interpolation between the two measured points that bracket F (points sorted by
 * dial; the measured frequencies must rise or fall strictly with the dial).
 *
 * @param points measured points: dial setting and measured frequency (Hz); at least 2
 * @param targetHz wanted frequency in Hz
 * @returns dial setting (same unit as the points' dial values)
 * @throws {MetrologyError} 'too_few_points', 'not_finite', 'bad_dial' (repeated dial),
 *   'not_monotonic' (frequency does not move one way with the dial),
 *   'outside_span' (target beyond the measured frequencies: no extrapolation)
 * @example dialForFrequency([{ dial: 1750, measured: 1_735_000 }, { dial: 2000, measured: 1_990_000 }], 1_862_500); // => 1875
 */
export function dialForFrequency(points: ReadonlyArray<{ dial: number; measured: number }>, targetHz: number): number {
  const fn = 'dialForFrequency';
  if (!Array.isArray(points) || points.length < 2) {
    throw new MetrologyError('too_few_points', `${fn} requires at least 2 data points`);
  }
  assertFinite(fn, 'the target frequency', targetHz);
  const sorted = [...points].sort((a, b) => a.dial - b.dial);
  let direction = 0;
  for (let i = 0; i < sorted.length; i++) {
    assertFinite(fn, 'dial values', sorted[i]!.dial);
    assertFinite(fn, 'measured frequencies', sorted[i]!.measured);
    if (i === 0) continue;
    const dDial = sorted[i]!.dial - sorted[i - 1]!.dial;
    const dFrequency = sorted[i]!.measured - sorted[i - 1]!.measured;
    if (dDial === 0) {
      throw new MetrologyError('bad_dial', `${fn} requires distinct dial values (${sorted[i]!.dial} appears twice): average repeated readings first`);
    }
    const sign = Math.sign(dFrequency);
    if (sign === 0 || (direction !== 0 && sign !== direction)) {
      throw new MetrologyError(
        'not_monotonic',
        `${fn} requires the measured frequency to rise or fall steadily with the dial (it turns near dial ${sorted[i]!.dial})`,
      );
    }
    direction = sign;
  }
  const first = sorted[0]!;
  const last = sorted[sorted.length - 1]!;
  const low = Math.min(first.measured, last.measured);
  const high = Math.max(first.measured, last.measured);
  if (targetHz < low || targetHz > high) {
    throw new MetrologyError('outside_span', `${fn}: ${targetHz} Hz is outside the measured span ${low} to ${high} Hz`);
  }
  for (let i = 1; i < sorted.length; i++) {
    const a = sorted[i - 1]!;
    const b = sorted[i]!;
    const inSegment = direction > 0 ? targetHz <= b.measured : targetHz >= b.measured;
    if (inSegment) {
      return a.dial + ((targetHz - a.measured) * (b.dial - a.dial)) / (b.measured - a.measured);
    }
  }
  return last.dial;
}

/** A dial setting for a wanted frequency, saying whether it comes from beyond the measured settings. */
export type DialEstimate = {
  dial: number;
  /** True when the frequency lies outside the measured ones and the dial was extrapolated from the end segment. */
  extrapolated: boolean;
  /** The measured dial settings' extent: lowest and highest dial measured. */
  measuredFrom: number;
  measuredTo: number;
};

/**
 * {@link dialForFrequency}, extended beyond the measured span and marked so: inside the measured
 * frequencies it interpolates (extrapolated false); outside, it continues the straight line through
 * the two measured points at that end, dial = a + (F − f_a)·(b − a)/(f_b − f_a), and says so
 * (extrapolated true), so a page can mark the figure as a prediction beyond the readings.
 *
 * @param points measured points (dial, measured Hz); at least 2, frequency strictly monotonic in dial
 * @param targetHz wanted frequency, Hz
 * @param dialSpan optional dial span of the range: an extrapolated setting beyond it is refused
 * @returns the dial setting, whether it was extrapolated, and the measured dial extent
 * @throws {MetrologyError} as dialForFrequency ('too_few_points', 'not_finite', 'bad_dial', 'not_monotonic'), and
 *   'outside_span' when the extrapolated setting lies beyond `dialSpan`
 * @example dialForFrequencyEstimate([{ dial: 1750, measured: 1_735_000 }, { dial: 2000, measured: 1_990_000 }], 2_000_000); // => { dial: 2009.80…, extrapolated: true, … }
 */
export function dialForFrequencyEstimate(
  points: ReadonlyArray<{ dial: number; measured: number }>,
  targetHz: number,
  dialSpan?: { min: number; max: number },
): DialEstimate {
  const fn = 'dialForFrequencyEstimate';
  let inside: number | null = null;
  try {
    inside = dialForFrequency(points, targetHz);
  } catch (error) {
    // Only "outside the measured span" is answered by extrapolation; every other refusal stands.
    if (!(error instanceof MetrologyError && error.code === 'outside_span')) throw error;
  }
  const sorted = [...points].sort((a, b) => a.dial - b.dial);
  const first = sorted[0]!;
  const last = sorted[sorted.length - 1]!;
  const extent = { measuredFrom: first.dial, measuredTo: last.dial };
  if (inside !== null) return { dial: inside, extrapolated: false, ...extent };
  const rising = last.measured > first.measured;
  const belowFirst = rising ? targetHz < first.measured : targetHz > first.measured;
  const [a, b] = belowFirst ? [sorted[0]!, sorted[1]!] : [sorted[sorted.length - 2]!, last];
  const dial = a.dial + ((targetHz - a.measured) * (b.dial - a.dial)) / (b.measured - a.measured);
  if (dialSpan && (dial < Math.min(dialSpan.min, dialSpan.max) || dial > Math.max(dialSpan.min, dialSpan.max))) {
    throw new MetrologyError('outside_span', `${fn}: ${targetHz} Hz would need dial ${dial}, beyond the dial's span ${dialSpan.min} to ${dialSpan.max}`);
  }
  return { dial, extrapolated: true, ...extent };
}
