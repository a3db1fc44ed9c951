import { MetrologyError } from '../math/metrology-error.js';
import { formatFrequency } from './format-frequency.js';
import type { FrequencyUnit } from './frequency-unit.js';

/**
 * How far outside a range's nominal frequency span a reading may lie before it is refused as a
 * probable slip (a unit left off, a digit group too many): 10 % of the span on either side.
 *
 * Why 10 %: a working range is calibrated a little beyond its end marks (dials overrun, an as-found
 * instrument can be a few per cent off), so readings just outside the span are real; a unit slip is a
 * factor of 1 000 or more, far beyond any such margin. Common practice, no published source.
 */
export const SPAN_MARGIN = 0.1;

/** The accepted band around a span: from `low` to `high` hertz, ends included. */
export type SpanLimits = { low: number; high: number };

/** What a refused frequency was understood as and what it probably meant. */
export type OutsideSpan = {
  /** The frequency as understood, Hz. */
  hz: number;
  /** The value ×/÷ 10³ or 10⁶ that lands within the limits (the likely intended reading), or null. */
  probableHz: number | null;
  /** One sentence for the person who typed it, e.g. `1900 read as 1.900 kHz, outside this range (1 750–2 000 kHz) by more than 10 % of its span; did you mean 1 900 kHz?` */
  message: string;
};

/**
 * The accepted band of a range: its nominal span widened by `margin` × span on either side,
 * low = fMin − m·(fMax − fMin), high = fMax + m·(fMax − fMin).
 *
 * @param freqMinHz low end of the range's nominal frequency span, Hz (finite, > 0)
 * @param freqMaxHz high end, Hz (finite, > freqMinHz)
 * @param margin fraction of the span allowed outside it on either side (finite, ≥ 0); default {@link SPAN_MARGIN}
 * @returns `{low, high}` in Hz
 * @throws {MetrologyError} 'bad_frequency' for a missing, non-finite or reversed span; 'bad_argument' for a bad margin
 * @example spanLimits(1_750_000, 2_000_000); // => { low: 1_725_000, high: 2_025_000 }
 */
export function spanLimits(freqMinHz: number, freqMaxHz: number, margin: number = SPAN_MARGIN): SpanLimits {
  if (!Number.isFinite(freqMinHz) || !Number.isFinite(freqMaxHz) || freqMinHz <= 0 || freqMaxHz <= freqMinHz) {
    throw new MetrologyError('bad_frequency', `a range's span needs 0 < freqMinHz < freqMaxHz (got ${freqMinHz} and ${freqMaxHz})`);
  }
  if (!Number.isFinite(margin) || margin < 0) throw new MetrologyError('bad_argument', `the span margin must be a finite fraction ≥ 0 (got ${margin})`);
  const span = freqMaxHz - freqMinHz;
  return { low: freqMinHz - margin * span, high: freqMaxHz + margin * span };
}

/**
 * Whether a frequency lies within the accepted band (ends included). Two comparisons and no
 * allocation, for the ingest path: compute the limits once per batch with {@link spanLimits}.
 *
 * @param hz frequency, Hz
 * @param limits from {@link spanLimits}
 * @returns true when low ≤ hz ≤ high (false for NaN)
 * @example isWithinSpan(1_900, spanLimits(1_750_000, 2_000_000)); // => false
 */
export function isWithinSpan(hz: number, limits: SpanLimits): boolean {
  return hz >= limits.low && hz <= limits.high;
}

// The smallest change of unit first: a kHz or MHz reading typed as Hz (× 10³), the reverse (÷ 10³), then 10⁶.
const FACTORS = [1e3, -1e3, 1e6, -1e6] as const;

/**
 * The reading that was probably meant: the frequency × 10³, ÷ 10³, × 10⁶ or ÷ 10⁶ (a kHz or MHz
 * reading typed without its unit, or the reverse), the first in that order that lands within the
 * accepted band (only a range spanning more than three decades lets two land).
 *
 * @param hz frequency as understood, Hz (finite, > 0)
 * @param limits from {@link spanLimits}
 * @returns the probable frequency in Hz, or null when no such factor lands within the band
 * @example probableFrequency(1_900, spanLimits(1_750_000, 2_000_000)); // => 1_900_000
 */
export function probableFrequency(hz: number, limits: SpanLimits): number | null {
  if (!Number.isFinite(hz) || hz <= 0) return null;
  for (const factor of FACTORS) {
    // Dividing rather than multiplying by 0.001 keeps round numbers round (1 900 000 / 1e3 = 1 900 exactly).
    const candidate = factor > 0 ? hz * factor : hz / -factor;
    if (isWithinSpan(candidate, limits)) return candidate;
  }
  return null;
}

/**
 * Checks a reading against its range: null when it lies within the span widened by the margin,
 * otherwise what it was understood as, what was probably meant and a sentence saying both.
 *
 * @param typed the reading as given (text as typed, or the number sent), quoted back in the message
 * @param hz the reading as understood, Hz
 * @param freqMinHz low end of the range's nominal span, Hz
 * @param freqMaxHz high end, Hz
 * @param margin fraction of the span allowed outside it on either side; default {@link SPAN_MARGIN}
 * @returns null, or {@link OutsideSpan}
 * @throws {MetrologyError} as {@link spanLimits}
 * @example checkFrequencySpan('1900', 1900, 1_750_000, 2_000_000)?.message;
 * // => '1900 read as 1.900 kHz, outside this range (1 750–2 000 kHz) by more than 10 % of its span; did you mean 1 900 kHz?'
 */
export function checkFrequencySpan(typed: string | number, hz: number, freqMinHz: number, freqMaxHz: number, margin: number = SPAN_MARGIN): OutsideSpan | null {
  const limits = spanLimits(freqMinHz, freqMaxHz, margin);
  if (isWithinSpan(hz, limits)) return null;
  return outsideSpan(typed, hz, freqMinHz, freqMaxHz, margin, limits);
}

/**
 * The refusal for a reading already known to lie outside the limits (the hot path compares first and
 * builds this only for the few refused readings).
 *
 * @param typed the reading as given, quoted back
 * @param hz the reading as understood, Hz
 * @param freqMinHz low end of the span, Hz
 * @param freqMaxHz high end of the span, Hz
 * @param margin the margin the limits were made with
 * @param limits from {@link spanLimits}
 * @returns {@link OutsideSpan}
 */
export function outsideSpan(typed: string | number, hz: number, freqMinHz: number, freqMaxHz: number, margin: number, limits: SpanLimits): OutsideSpan {
  const probableHz = probableFrequency(hz, limits);
  const unit = displayUnit(freqMaxHz);
  const spanText = `${compact(freqMinHz, unit, 0).replace(` ${unit}`, '')}–${compact(freqMaxHz, unit, 0)}`;
  const understood = Number.isFinite(hz) ? compact(hz, displayUnit(hz), displayUnit(hz) === 'Hz' ? 0 : 3) : String(hz);
  const percent = `${Number((margin * 100).toFixed(2))} %`;
  const typedText = typeof typed === 'string' ? typed.trim() : String(typed);
  const guess = probableHz === null ? '; check the unit and the reading' : `; did you mean ${compact(probableHz, unit, 0)}?`;
  return { hz, probableHz, message: `${typedText} read as ${understood}, outside this range (${spanText}) by more than ${percent} of its span${guess}` };
}

/** The unit a frequency reads best in on a bench: Hz below 1 kHz, kHz up to 30 MHz (as dials are marked), then MHz. */
function displayUnit(hz: number): FrequencyUnit {
  const magnitude = Math.abs(hz);
  if (magnitude < 1e3) return 'Hz';
  if (magnitude < 30e6) return 'kHz';
  return 'MHz';
}

/** Digit-grouped, with at least `minDecimals` and as few more as show the value to 1 mHz. */
function compact(hz: number, unit: FrequencyUnit, minDecimals: number): string {
  const perUnit = unit === 'MHz' ? 1e6 : unit === 'kHz' ? 1e3 : 1;
  const value = hz / perUnit;
  const most = unit === 'MHz' ? 9 : unit === 'kHz' ? 6 : 3;
  let decimals = minDecimals;
  while (decimals < most && Math.abs(Number(value.toFixed(decimals)) - value) * perUnit > 5e-4) decimals += 1;
  return formatFrequency(hz, unit, decimals);
}
