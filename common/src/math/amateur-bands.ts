import { MetrologyError } from './metrology-error.js';

/** ITU regions. */
export type ItuRegion = 1 | 2 | 3;

/** Whether the amateur service holds the band as a primary (exclusive or shared) or a secondary service. */
export type AmateurBandStatus = 'primary' | 'secondary';

/** An amateur band of an ITU region: name, edges in Hz, the amateur service's status and the allocation's own note. */
export type AmateurBand = { name: string; lowHz: number; highHz: number; status: AmateurBandStatus; note: string | null };

/** Where the band edges come from, said wherever they are shown or tested. */
export const AMATEUR_BANDS_SOURCE =
  'ITU Radio Regulations, Article 5 (Table of Frequency Allocations), edition 2020 — values entered from memory, check against the published table';

/** Said beside every band: the ITU table is the outer frame, national rules decide. */
export const NATIONAL_RULES_NOTE = 'National allocations differ within the ITU band: check your licence.';

/** What each region covers, for people choosing one. */
export const ITU_REGION_NAMES: Readonly<Record<ItuRegion, string>> = Object.freeze({
  1: 'Region 1 (Europe, Africa, the Middle East, northern Asia)',
  2: 'Region 2 (the Americas)',
  3: 'Region 3 (Asia and the Pacific)',
});

type Row = [name: string, lowKHz: number, highKHz: number, status: AmateurBandStatus, note: string | null];

const SIXTY_M_NOTE = 'RR 5.133B (WRC-15): at most 15 W e.i.r.p.';
const THIRTY_M_NOTE = 'the fixed service is primary';
const COMMON_UPPER: Row[] = [
  ['20 m', 14_000, 14_350, 'primary', null],
  ['17 m', 18_068, 18_168, 'primary', null],
  ['15 m', 21_000, 21_450, 'primary', null],
  ['12 m', 24_890, 24_990, 'primary', null],
  ['10 m', 28_000, 29_700, 'primary', null],
];

/**
 * HF amateur bands (160 m to 10 m) of each ITU region, in kHz as the table prints them.
 * Source: {@link AMATEUR_BANDS_SOURCE}; the same rows are in fixtures/radio/amateur_hf_bands_itu_rr_art5.csv.
 * Region 2's bands other than 60 m agree with fixtures/radio/amateur_hf_bands_region2_us.csv (Hamlib, 47 CFR 97.301).
 */
const TABLE_KHZ: Readonly<Record<ItuRegion, Row[]>> = {
  1: [
    ['160 m', 1_810, 1_850, 'primary', 'RR 5.96: many Region 1 administrations allocate up to 200 kHz more in 1715-1800 and 1850-2000 kHz nationally'],
    ['80 m', 3_500, 3_800, 'primary', 'shared with the fixed and mobile services'],
    ['60 m', 5_351.5, 5_366.5, 'secondary', SIXTY_M_NOTE],
    ['40 m', 7_000, 7_200, 'primary', '7100-7200 kHz amateur in Region 1 since 29 March 2009 (WRC-03)'],
    ['30 m', 10_100, 10_150, 'secondary', THIRTY_M_NOTE],
    ...COMMON_UPPER,
  ],
  2: [
    ['160 m', 1_800, 2_000, 'primary', '1850-2000 kHz shared with the fixed; mobile and radiolocation services'],
    ['80 m', 3_500, 4_000, 'primary', '3750-4000 kHz shared with the fixed and mobile services'],
    ['60 m', 5_351.5, 5_366.5, 'secondary', `${SIXTY_M_NOTE} (some administrations allow more); the United States uses five channels instead`],
    ['40 m', 7_000, 7_300, 'primary', null],
    ['30 m', 10_100, 10_150, 'secondary', THIRTY_M_NOTE],
    ...COMMON_UPPER,
  ],
  3: [
    ['160 m', 1_800, 2_000, 'primary', 'shared with the fixed; mobile and radionavigation services'],
    ['80 m', 3_500, 3_900, 'primary', 'shared with the fixed and mobile services'],
    ['60 m', 5_351.5, 5_366.5, 'secondary', SIXTY_M_NOTE],
    ['40 m', 7_000, 7_200, 'primary', null],
    ['30 m', 10_100, 10_150, 'secondary', THIRTY_M_NOTE],
    ...COMMON_UPPER,
  ],
};

/** The bands of each region, lowest first, edges in Hz. */
export const AMATEUR_BANDS_BY_REGION: Readonly<Partial<Record<ItuRegion, ReadonlyArray<AmateurBand>>>> = Object.freeze(
  Object.fromEntries(
    Object.entries(TABLE_KHZ).map(([region, rows]) => [
      region,
      Object.freeze(rows.map(([name, lowKHz, highKHz, status, note]) => Object.freeze({ name, lowHz: lowKHz * 1000, highHz: highKHz * 1000, status, note }))),
    ]),
  ),
);

/** The regions that have a band table, in order: the only ones a page may offer. */
export const ITU_REGIONS_WITH_BANDS: ReadonlyArray<ItuRegion> = Object.freeze(
  (Object.keys(AMATEUR_BANDS_BY_REGION).map(Number) as ItuRegion[]).filter((r) => (AMATEUR_BANDS_BY_REGION[r]?.length ?? 0) > 0).sort((a, b) => a - b),
);

/** US 60 m channel centre frequencies, Hz (47 CFR 97.305(c) as copied in fixtures/radio). */
export const US_60M_CHANNELS_HZ: ReadonlyArray<number> = Object.freeze([5_332_000, 5_348_000, 5_358_500, 5_373_000, 5_405_000]);

/**
 * The HF amateur bands of an ITU region, from {@link AMATEUR_BANDS_BY_REGION}.
 *
 * @param region 1, 2 or 3
 * @returns the bands, lowest first
 * @throws {MetrologyError} 'region_not_available' for a region with no table, 'bad_argument' for anything but 1, 2 or 3
 * @example bandsForRegion(1)[0]; // => { name: '160 m', lowHz: 1810000, highHz: 1850000, status: 'primary', note: 'RR 5.96: …' }
 */
export function bandsForRegion(region: ItuRegion): ReadonlyArray<AmateurBand> {
  if (region !== 1 && region !== 2 && region !== 3) {
    throw new MetrologyError('bad_argument', `bandsForRegion requires an ITU region 1, 2 or 3 (got ${String(region)})`);
  }
  const bands = AMATEUR_BANDS_BY_REGION[region];
  if (!bands || bands.length === 0) {
    throw new MetrologyError('region_not_available', `bandsForRegion: there is no band table for ITU Region ${region}`);
  }
  return bands;
}
