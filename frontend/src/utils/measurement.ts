import { formatFrequency, type FrequencyUnit } from '@kilocycle/common/units';

const MINUS = '\u2212';

/** The unit a frequency reads best in: MHz from 1 MHz, kHz from 1 kHz, else Hz. */
export function unitFor(hz: number): FrequencyUnit {
  const magnitude = Math.abs(hz);
  if (magnitude >= 1e6) return 'MHz';
  if (magnitude >= 1e3) return 'kHz';
  return 'Hz';
}

const DECIMALS_FOR_1_HZ: Record<FrequencyUnit, number> = { Hz: 0, kHz: 3, MHz: 6 };

/**
 * A frequency digit-grouped in a chosen (or fitting) unit, to `resolutionHz` (default 1 Hz): `7 001.250 kHz`.
 * A proper minus sign, so columns of signed numbers line up.
 */
export function formatHz(hz: number | null | undefined, unit?: FrequencyUnit, resolutionDecimalsInHz = 0): string {
  if (hz === null || hz === undefined || !Number.isFinite(hz)) return '—';
  const chosen = unit ?? unitFor(hz);
  const decimals = Math.min(12, Math.max(0, (DECIMALS_FOR_1_HZ[chosen] ?? 0) + resolutionDecimalsInHz));
  return formatFrequency(hz, chosen, decimals).replace('-', MINUS);
}

/** A number with a proper minus sign and thin-space digit groups in the integer part. */
export function formatNumber(value: number | null | undefined, decimals: number): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const fixed = Math.abs(value).toFixed(Math.max(0, decimals));
  const [integer = '0', fraction] = fixed.split('.');
  const grouped = integer.replace(/\B(?=(\d{3})+$)/g, '\u2009');
  const negative = value < 0 && Number(fixed) !== 0;
  return `${negative ? MINUS : ''}${grouped}${fraction !== undefined ? `.${fraction}` : ''}`;
}

/** Significant digits without exponent for ordinary magnitudes, exponent form for tiny or huge ones (Allan deviations). */
export function formatSignificant(value: number | null | undefined, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  if (magnitude < 1e-3 || magnitude >= 1e7) {
    const [mantissa = '0', exponent = '0'] = value.toExponential(digits - 1).split('e');
    return `${mantissa.replace('-', MINUS)}\u00d710${superscript(Number(exponent))}`;
  }
  const decimals = Math.max(0, digits - 1 - Math.floor(Math.log10(magnitude)));
  return formatNumber(value, decimals);
}

/** As formatSignificant, without trailing zeros after the point (`1.000` → `1`, `0.09000` → `0.09`). */
export function formatCompact(value: number | null | undefined, digits = 4): string {
  const text = formatSignificant(value, digits);
  if (text.includes('\u00d7') || !text.includes('.')) return text;
  return text.replace(/\.?0+$/, '');
}

const SUPERSCRIPTS: Record<string, string> = {
  '-': '\u207b',
  '0': '\u2070',
  '1': '\u00b9',
  '2': '\u00b2',
  '3': '\u00b3',
  '4': '\u2074',
  '5': '\u2075',
  '6': '\u2076',
  '7': '\u2077',
  '8': '\u2078',
  '9': '\u2079',
};

function superscript(n: number): string {
  return String(n)
    .split('')
    .map((c) => SUPERSCRIPTS[c] ?? c)
    .join('');
}

/** A byte count for people: `812 B`, `4.2 kB`, `18.6 MB`. */
export function formatBytes(bytes: number | null | undefined): string {
  if (bytes === null || bytes === undefined || !Number.isFinite(bytes)) return '—';
  if (bytes < 1000) return `${bytes} B`;
  if (bytes < 1e6) return `${(bytes / 1e3).toFixed(1)} kB`;
  if (bytes < 1e9) return `${(bytes / 1e6).toFixed(1)} MB`;
  return `${(bytes / 1e9).toFixed(2)} GB`;
}
