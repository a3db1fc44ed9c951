import { formatNumber, formatSignificant } from './frequency';

/** As formatSignificant, without trailing zeros after the point (`1.000` → `1`, `0.090 00` → `0.09`). */
export function formatCompact(value: number | null | undefined, digits = 4): string {
  const text = formatSignificant(value, digits);
  if (text.includes('\u00d7') || !text.includes('.')) return text;
  // Digit groups after the point are separated by spaces, so strip zeros and those spaces together.
  return text.replace(/\.?[0 ]+$/, '');
}

/** A count for people, digits grouped as every other number of the app: `25 000` readings. */
export function formatCount(count: number | null | undefined): string {
  return formatNumber(count, 0);
}

/** A byte count for people: `812 B`, `4.2 kB`, `18.6 MB`. */
export function formatBytes(bytes: number | null | undefined): string {
  if (bytes === null || bytes === undefined || !Number.isFinite(bytes)) return '—';
  if (bytes < 1000) return `${bytes} B`;
  if (bytes < 1e6) return `${(bytes / 1e3).toFixed(1)} kB`;
  if (bytes < 1e9) return `${(bytes / 1e6).toFixed(1)} MB`;
  return `${(bytes / 1e9).toFixed(2)} GB`;
}
