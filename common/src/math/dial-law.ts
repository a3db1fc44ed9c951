import { unitMultiplier, type FrequencyUnit } from '../units/frequency-unit.js';
import { assertFinite } from './guards.js';
import { MetrologyError } from './metrology-error.js';

/**
 * How a range's dial maps to nominal frequency: a direct-reading dial marked in a
 * frequency unit, or a table of dial-to-frequency points (frequencies in Hz) read by
 * linear interpolation.
 */
export type DialLaw = { kind: 'direct'; unit: FrequencyUnit } | { kind: 'table'; points: ReadonlyArray<{ dial: number; frequency: number }> };

/** How far beyond the ends of a table law a dial value may be read, as a fraction of the table's dial span. */
export const TABLE_EXTRAPOLATION_FRACTION = 0.1;

/**
 * Nominal frequency of a dial setting.
 * - direct: nominal = dial × (Hz per `unit`) — dial 1750 on a kHz dial is 1 750 000 Hz;
 * - table: linear interpolation between the two neighbouring table points (sorted by
 *   dial); beyond the ends the end segment is extended, but only up to ±10 % of the
 *   table's dial span.
 *
 * @param law the range's dial law
 * @param dial dial setting (in the dial's own unit or divisions)
 * @returns nominal frequency in Hz, greater than zero
 * @throws {MetrologyError} 'not_finite' (dial), 'too_few_points' (table with under 2 points),
 *   'bad_dial' (repeated dial values in the table), 'bad_frequency' (table frequency or result ≤ 0),
 *   'outside_table' (more than 10 % of the span beyond the table)
 * @example dialToNominal({ kind: 'direct', unit: 'kHz' }, 1750); // => 1750000
 * @example dialToNominal({ kind: 'table', points: [{ dial: 0, frequency: 1e6 }, { dial: 100, frequency: 2e6 }] }, 25); // => 1250000
 */
export function dialToNominal(law: DialLaw, dial: number): number {
  const fn = 'dialToNominal';
  assertFinite(fn, 'the dial value', dial);
  let nominal: number;
  if (law.kind === 'direct') {
    nominal = dial * unitMultiplier(law.unit);
  } else if (law.kind === 'table') {
    nominal = interpolateTable(law.points, dial);
  } else {
    throw new MetrologyError('bad_argument', `${fn} requires a dial law of kind 'direct' or 'table'`);
  }
  if (!(nominal > 0)) {
    throw new MetrologyError('bad_frequency', `${fn} gives a nominal frequency of ${nominal} Hz at dial ${dial}; it must be greater than zero`);
  }
  return nominal;
}

function interpolateTable(points: ReadonlyArray<{ dial: number; frequency: number }>, dial: number): number {
  const fn = 'dialToNominal';
  if (!Array.isArray(points) || points.length < 2) {
    throw new MetrologyError('too_few_points', `${fn} requires at least 2 data points in a table law`);
  }
  const sorted = [...points].sort((a, b) => a.dial - b.dial);
  for (let i = 0; i < sorted.length; i++) {
    const point = sorted[i]!;
    assertFinite(fn, 'table dial values', point.dial);
    assertFinite(fn, 'table frequencies', point.frequency);
    if (point.frequency <= 0) {
      throw new MetrologyError('bad_frequency', `${fn} requires table frequencies greater than zero (got ${point.frequency} at dial ${point.dial})`);
    }
    if (i > 0 && point.dial === sorted[i - 1]!.dial) {
      throw new MetrologyError('bad_dial', `${fn} requires distinct dial values in a table law (${point.dial} appears twice)`);
    }
  }
  const first = sorted[0]!;
  const last = sorted[sorted.length - 1]!;
  const margin = TABLE_EXTRAPOLATION_FRACTION * (last.dial - first.dial);
  if (dial < first.dial - margin || dial > last.dial + margin) {
    throw new MetrologyError(
      'outside_table',
      `${fn}: dial ${dial} is outside the table (${first.dial} to ${last.dial}, read up to 10 % of the span beyond its ends)`,
    );
  }
  // Segment index: the last point whose dial is ≤ the setting, clamped to a real segment.
  let index = 0;
  while (index < sorted.length - 2 && dial > sorted[index + 1]!.dial) index++;
  const a = sorted[index]!;
  const b = sorted[index + 1]!;
  return a.frequency + ((b.frequency - a.frequency) * (dial - a.dial)) / (b.dial - a.dial);
}
