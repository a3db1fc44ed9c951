import { RUN_DATA_KIND_NAMES, type RunDataKind } from '@kilocycle/common/types';

/** What a run's readings hold, as the header and the stability page say it. */
export const DATA_KIND_LABELS: Readonly<Record<RunDataKind, string>> = {
  frequency: 'Frequency data (Hz)',
  phase: 'Phase data (time interval, s)',
};

/** The opening choice, naming the instrument each kind comes from. */
export const DATA_KIND_CHOICES: Readonly<Record<RunDataKind, string>> = {
  frequency: 'Frequency (Hz) from a frequency counter',
  phase: 'Phase (time interval, s) from a time-interval counter',
};

/** A value column's heading: `Frequency` or `Time interval (s)`. */
export function valueHeading(dataKind: RunDataKind = 'frequency'): string {
  const names = RUN_DATA_KIND_NAMES[dataKind];
  return dataKind === 'frequency' ? names.value : `${names.value} (${names.unit})`;
}

const SUPERSCRIPT = '⁻⁰¹²³⁴⁵⁶⁷⁸⁹';

/**
 * A time interval in seconds, in significant figures with a power of ten (`1.250 00×10⁻⁸`): the column is
 * headed "(s)", so no unit is repeated on each value. `—` for a missing or non-finite value.
 */
export function formatSeconds(seconds: number | null | undefined, digits = 6): string {
  if (seconds === null || seconds === undefined || !Number.isFinite(seconds)) return '—';
  if (seconds === 0) return '0';
  const [mantissa = '', exponent = ''] = seconds.toExponential(digits - 1).split('e');
  const [whole = '', fraction = ''] = mantissa.split('.');
  const grouped = fraction ? `${whole}.${fraction.replace(/(\d{3})(?=\d)/g, '$1 ')}` : whole;
  if (exponent === '+0') return grouped;
  const superscript = exponent.replace('+', '').replace(/[-0-9]/g, (c) => SUPERSCRIPT['-0123456789'.indexOf(c)] ?? c);
  return `${grouped}×10${superscript}`;
}
