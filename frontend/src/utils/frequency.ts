import { formatFrequency, type FrequencyUnit } from '@kilocycle/common/units';

const DECIMALS: Record<FrequencyUnit, number> = { Hz: 1, kHz: 3, MHz: 6 };

/** The unit a frequency reads best in on a bench: Hz below 1 kHz, kHz up to 30 MHz (as dials are marked), then MHz. */
export function bestUnit(hz: number): FrequencyUnit {
  const magnitude = Math.abs(hz);
  if (magnitude < 1e3) return 'Hz';
  if (magnitude < 30e6) return 'kHz';
  return 'MHz';
}

/**
 * A frequency digit-grouped for people (`7 001.250 kHz`); `—` for a missing or non-finite value.
 * The default resolution is 1 Hz in kHz, 1 Hz in MHz and 0.1 Hz in Hz.
 */
export function formatHz(hz: number | null | undefined, unit?: FrequencyUnit, decimals?: number): string {
  if (hz === null || hz === undefined || !Number.isFinite(hz)) return '—';
  const shown = unit ?? bestUnit(hz);
  return formatFrequency(hz, shown, decimals ?? DECIMALS[shown]);
}

/** A frequency to a given resolution in Hz, in the unit that reads best: `formatHzTo(7453820.12, 0.01)` → `7 453.820 12 kHz`. */
export function formatHzTo(hz: number | null | undefined, resolutionHz: number): string {
  if (hz === null || hz === undefined || !Number.isFinite(hz)) return '—';
  const unit = bestUnit(hz);
  const perUnit = unit === 'MHz' ? 1e6 : unit === 'kHz' ? 1e3 : 1;
  const decimals = Math.min(12, Math.max(0, Math.ceil(Math.log10(perUnit / resolutionHz) - 1e-9)));
  return formatFrequency(hz, unit, decimals);
}

/** A signed difference in Hz (`+312.4 Hz`, `-8.0 Hz`), for errors, corrections and offsets. */
export function formatSignedHz(hz: number | null | undefined, decimals = 1): string {
  if (hz === null || hz === undefined || !Number.isFinite(hz)) return '—';
  const text = formatFrequency(hz, 'Hz', decimals);
  return hz > 0 && !/^0(\.0*)? Hz$/.test(text) ? `+${text}` : text;
}

/** A plain number with a fixed number of decimals, digits grouped in threes both sides of the point (`1 735.995 0`), signed on request. */
export function formatNumber(value: number | null | undefined, decimals = 3, signed = false): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const fixed = Math.abs(value).toFixed(decimals);
  const [integerPart = '0', fractionPart] = fixed.split('.');
  const grouped = integerPart.replace(/\B(?=(\d{3})+$)/g, ' ');
  const body = fractionPart === undefined ? grouped : `${grouped}.${fractionPart.replace(/(\d{3})(?=\d)/g, '$1 ')}`;
  const isZero = Number(fixed) === 0;
  const sign = value < 0 && !isZero ? '-' : signed && !isZero ? '+' : '';
  return `${sign}${body}`;
}

/** A number in significant figures, for ratios such as scale error or R² (`-2.31e-3` → `-0.002 31`). */
export function formatSignificant(value: number | null | undefined, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  const magnitude = Math.floor(Math.log10(Math.abs(value)));
  if (magnitude < -4 || magnitude > 6) {
    const [mantissa = '', exponent = ''] = value.toExponential(digits - 1).split('e');
    const superscript = exponent.replace('+', '').replace(/[-0-9]/g, (c) => '⁻⁰¹²³⁴⁵⁶⁷⁸⁹'['-0123456789'.indexOf(c)] ?? c);
    return `${mantissa}×10${superscript}`;
  }
  const decimals = Math.max(0, digits - 1 - magnitude);
  return formatNumber(value, decimals);
}

/** A duration in seconds as people say it: `42 s`, `7 min 30 s`, `2 h 05 min`; a negative one (a difference) gets a minus sign. */
export function formatDuration(seconds: number | null | undefined): string {
  if (seconds === null || seconds === undefined || !Number.isFinite(seconds)) return '—';
  const s = Math.round(Math.abs(seconds));
  const sign = seconds < 0 && s > 0 ? '\u2212' : '';
  if (s < 60) return `${sign}${s} s`;
  if (s < 3600) {
    const rest = s % 60;
    return rest === 0 ? `${sign}${Math.floor(s / 60)} min` : `${sign}${Math.floor(s / 60)} min ${rest} s`;
  }
  // Round to whole minutes first, so 1 h 59.5 min reads 2 h 00 min, never 1 h 60 min.
  const totalMinutes = Math.round(s / 60);
  return `${sign}${Math.floor(totalMinutes / 60)} h ${String(totalMinutes % 60).padStart(2, '0')} min`;
}

/** A frequency as short as it can be said, for spans in lists: `150 kHz`, `7.3 MHz`, `455 kHz`. */
export function formatHzShort(hz: number | null | undefined): string {
  if (hz === null || hz === undefined || !Number.isFinite(hz)) return '—';
  const magnitude = Math.abs(hz);
  const [value, unit] = magnitude >= 1e6 ? [hz / 1e6, 'MHz'] : magnitude >= 1e3 ? [hz / 1e3, 'kHz'] : [hz, 'Hz'];
  const text = value.toFixed(6).replace(/\.?0+$/, '');
  return `${text} ${unit}`;
}
