import { bandsForRegion, type ItuRegion } from './amateur-bands.js';
import { dialForFrequency } from './dial-for-frequency.js';
import { assertFinite, assertPositive } from './guards.js';
import { MetrologyError } from './metrology-error.js';

export type BandPlanRow = {
  rangeLabel: string;
  multiplier: number;
  /** Range low end × multiplier, Hz. */
  outLowHz: number;
  outHighHz: number;
  /** Bands this output overlaps, with the overlap; `full` when the whole band is reached. */
  bands: Array<{ name: string; coveredLowHz: number; coveredHighHz: number; full: boolean }>;
};

/**
 * Band planner (PRODUCT §5.7): for each range and each output multiplier (harmonic or
 * multiplier stage), the output span [low·k, high·k] and the amateur bands of the chosen
 * ITU region it overlaps (an overlap of positive width; touching at one edge does not count).
 *
 * @param ranges ranges with label, span in Hz and the multipliers the owner uses
 * @param region ITU region (see bandsForRegion)
 * @returns one row per range and multiplier, in input order
 * @throws {MetrologyError} 'bad_frequency' (span ≤ 0 or reversed), 'bad_argument' (multiplier ≤ 0),
 *   'region_not_available'
 * @example planBands([{ label: '1', lowHz: 1.75e6, highHz: 2e6, multipliers: [2] }], 2)[0].bands[0].name; // => '80 m'
 */
export function planBands(
  ranges: ReadonlyArray<{ label: string; lowHz: number; highHz: number; multipliers: readonly number[] }>,
  region: ItuRegion,
): BandPlanRow[] {
  const fn = 'planBands';
  const bands = bandsForRegion(region);
  const rows: BandPlanRow[] = [];
  for (const range of ranges) {
    assertPositive(fn, `the low end of range ${range.label}`, range.lowHz, 'bad_frequency');
    assertPositive(fn, `the high end of range ${range.label}`, range.highHz, 'bad_frequency');
    if (!(range.highHz > range.lowHz)) {
      throw new MetrologyError('bad_frequency', `${fn} requires the high end above the low end (range ${range.label})`);
    }
    for (const multiplier of range.multipliers) {
      assertPositive(fn, `multiplier of range ${range.label}`, multiplier);
      const outLowHz = range.lowHz * multiplier;
      const outHighHz = range.highHz * multiplier;
      const covered = bands
        .filter((band) => Math.min(outHighHz, band.highHz) > Math.max(outLowHz, band.lowHz))
        .map((band) => ({
          name: band.name,
          coveredLowHz: Math.max(outLowHz, band.lowHz),
          coveredHighHz: Math.min(outHighHz, band.highHz),
          full: outLowHz <= band.lowHz && outHighHz >= band.highHz,
        }));
      rows.push({ rangeLabel: range.label, multiplier, outLowHz, outHighHz, bands: covered });
    }
  }
  return rows;
}

/**
 * Corrected dial setting for a wanted output frequency through a multiplier: the
 * fundamental is wanted/k, found on the measured calibration points by
 * {@link dialForFrequency}.
 *
 * @param points measured calibration points (dial, measured fundamental in Hz)
 * @param multiplier output multiplier k > 0
 * @param wantedOutputHz wanted output frequency, Hz
 * @returns dial setting
 * @throws {MetrologyError} 'bad_argument' (k ≤ 0), and whatever dialForFrequency throws ('outside_span' …)
 * @example dialForOutput([{ dial: 6, measured: 6e6 }, { dial: 7, measured: 7e6 }], 4, 27e6); // => 6.75
 */
export function dialForOutput(points: ReadonlyArray<{ dial: number; measured: number }>, multiplier: number, wantedOutputHz: number): number {
  assertPositive('dialForOutput', 'the multiplier', multiplier);
  assertFinite('dialForOutput', 'the wanted output frequency', wantedOutputHz);
  return dialForFrequency(points, wantedOutputHz / multiplier);
}
