import { MetrologyError } from './metrology-error.js';

/** An amateur band: name and edges in Hz. */
export type AmateurBand = { name: string; lowHz: number; highHz: number };

/** ITU regions. */
export type ItuRegion = 1 | 2 | 3;

/**
 * HF amateur bands of ITU Region 2 (edges as in the United States), in Hz, from
 * fixtures/radio/amateur_hf_bands_region2_us.csv (ITU Radio Regulations Article 5 and
 * 47 CFR 97.301 as copied there; 10 m upper edge from the Hamlib band plan only).
 * 60 m is left out: in the US it is five channels, not a band (see US_60M_CHANNELS_HZ).
 */
export const AMATEUR_BANDS_REGION2: ReadonlyArray<AmateurBand> = Object.freeze(
  [
    { name: '160 m', lowHz: 1_800_000, highHz: 2_000_000 },
    { name: '80 m', lowHz: 3_500_000, highHz: 4_000_000 },
    { name: '40 m', lowHz: 7_000_000, highHz: 7_300_000 },
    { name: '30 m', lowHz: 10_100_000, highHz: 10_150_000 },
    { name: '20 m', lowHz: 14_000_000, highHz: 14_350_000 },
    { name: '17 m', lowHz: 18_068_000, highHz: 18_168_000 },
    { name: '15 m', lowHz: 21_000_000, highHz: 21_450_000 },
    { name: '12 m', lowHz: 24_890_000, highHz: 24_990_000 },
    { name: '10 m', lowHz: 28_000_000, highHz: 29_700_000 },
  ].map((band) => Object.freeze(band)),
);

/** US 60 m channel centre frequencies, Hz (47 CFR 97.305(c) as copied in fixtures/radio). */
export const US_60M_CHANNELS_HZ: ReadonlyArray<number> = Object.freeze([5_332_000, 5_348_000, 5_358_500, 5_373_000, 5_405_000]);

/**
 * The HF amateur bands of an ITU region. Only Region 2 is backed by a published source in
 * this project; Regions 1 and 3 differ (40 m, 80 m and others) and are refused rather than
 * guessed.
 *
 * @param region 1, 2 or 3
 * @returns the bands, lowest first
 * @throws {MetrologyError} 'region_not_available' for regions 1 and 3, 'bad_argument' otherwise
 * @example bandsForRegion(2)[0]; // => { name: '160 m', lowHz: 1800000, highHz: 2000000 }
 */
export function bandsForRegion(region: ItuRegion): ReadonlyArray<AmateurBand> {
  if (region === 2) return AMATEUR_BANDS_REGION2;
  if (region === 1 || region === 3) {
    throw new MetrologyError('region_not_available', `bandsForRegion: band edges for ITU Region ${region} are not available yet (only Region 2 has a sourced table)`);
  }
  throw new MetrologyError('bad_argument', `bandsForRegion requires an ITU region 1, 2 or 3 (got ${String(region)})`);
}
