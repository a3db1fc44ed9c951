import { formatNumber } from './frequency';

const SUPERSCRIPT = '⁻⁰¹²³⁴⁵⁶⁷⁸⁹';

/** 12 significant digits: drops the noise of float arithmetic (0.09999999999990905 → 0.1) and keeps every real digit. */
function clean(value: number): number {
  return Number(value.toPrecision(12));
}

/**
 * A value on a log axis or in a τ column, as people write it: `0.1`, `1.6`, `12.8`, `1 024`, and
 * `2×10⁻¹¹` for what is very small or very large. At least `digits` significant digits, never rounding
 * away a whole-number digit (τ = 1 024 s stays `1 024`), trailing zeros dropped, digits grouped as in
 * every other number of the app.
 */
export function formatAxisNumber(value: number | null | undefined, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  const v = clean(value);
  const magnitude = Math.floor(Math.log10(Math.abs(v)));
  if (magnitude < -3 || magnitude > 6) {
    const [mantissa = '', exponent = ''] = v.toExponential(digits - 1).split('e');
    const trimmed = mantissa.includes('.') ? mantissa.replace(/\.?0+$/, '') : mantissa;
    const power = exponent.replace('+', '').replace(/[-0-9]/g, (c) => SUPERSCRIPT['-0123456789'.indexOf(c)] ?? c);
    return `${trimmed}×10${power}`;
  }
  const text = formatNumber(v, Math.max(0, digits - 1 - magnitude));
  // The fraction's digit groups are separated by spaces: strip trailing zeros and those spaces together.
  return text.includes('.') ? text.replace(/\.?[0 ]+$/, '') : text;
}

/**
 * Tick values for a log axis from `min` to `max`: every decade, with 2 and 5 between them while the
 * total stays within `maxTicks` (then only decades, then every second or third decade). Fewer than two
 * ticks (a span inside one decade) gives an empty list: let the chart place its own.
 */
export function logTicks(min: number, max: number, maxTicks = 8): number[] {
  if (!(min > 0) || !(max > 0) || !Number.isFinite(min) || !Number.isFinite(max) || max < min) return [];
  const low = Math.floor(Math.log10(min) + 1e-9);
  const high = Math.ceil(Math.log10(max) - 1e-9);
  const inside = (v: number) => v >= min * (1 - 1e-9) && v <= max * (1 + 1e-9);
  const withSteps: number[] = [];
  const decades: number[] = [];
  for (let e = low; e <= high; e++) {
    for (const m of [1, 2, 5]) {
      const v = clean(m * 10 ** e);
      if (!inside(v)) continue;
      withSteps.push(v);
      if (m === 1) decades.push(v);
    }
  }
  let ticks = withSteps;
  for (let every = 1; ticks.length > maxTicks; every++) ticks = decades.filter((_, i) => i % every === 0);
  return ticks.length >= 2 ? ticks : [];
}
