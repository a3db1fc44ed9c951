// Band planner: band edges of all three ITU regions from fixtures/radio/amateur_hf_bands_itu_rr_art5.csv
// (ITU Radio Regulations, Article 5, edition 2020, entered from memory: check against the published table),
// Region 2 cross-checked with fixtures/radio/amateur_hf_bands_region2_us.csv (Hamlib, 47 CFR 97.301);
// facts of the trade for range coverage.
import { AMATEUR_BANDS_BY_REGION, AMATEUR_BANDS_SOURCE, bandsForRegion, ITU_REGIONS_WITH_BANDS, US_60M_CHANNELS_HZ, type ItuRegion } from '../amateur-bands.js';
import { dialForOutput, planBands } from '../plan-bands.js';
import { downsampleLttb } from '../downsample-lttb.js';
import { errorCode, readCsv } from './helpers.js';

const ituRows = readCsv('radio/amateur_hf_bands_itu_rr_art5.csv');
const edgesKHz = (region: ItuRegion, band: string) => {
  const found = bandsForRegion(region).find((b) => b.name === band);
  return found ? [found.lowHz / 1000, found.highHz / 1000] : null;
};

describe('AMATEUR_BANDS_BY_REGION (ITU Radio Regulations, Article 5, edition 2020, entered from memory)', () => {
  test('the source is named with the data', () => {
    expect(AMATEUR_BANDS_SOURCE).toMatch(/^ITU Radio Regulations, Article 5 .*edition 2020.*from memory, check against the published table$/);
  });
  test.each([1, 2, 3] as const)('Region %i matches amateur_hf_bands_itu_rr_art5.csv: names, edges, status and note', (region) => {
    const rows = ituRows.filter((row) => Number(row.region) === region);
    expect(rows).toHaveLength(10);
    expect(bandsForRegion(region).map((b) => [b.name, b.lowHz, b.highHz, b.status, b.note])).toEqual(
      rows.map((row) => [
        row.band,
        Number(row.lower_kHz) * 1000,
        Number(row.upper_kHz) * 1000,
        row.amateur_status,
        row.rr_note ? row.rr_note.replace(/^"|"$/g, '') : null,
      ]),
    );
  });
  test('every band lies inside 1.8-30 MHz, lowest first, with no overlaps', () => {
    for (const region of ITU_REGIONS_WITH_BANDS) {
      const bands = bandsForRegion(region);
      bands.forEach((b, i) => {
        expect(b.lowHz).toBeGreaterThanOrEqual(1.8e6);
        expect(b.highHz).toBeLessThanOrEqual(30e6);
        expect(b.highHz).toBeGreaterThan(b.lowHz);
        if (i > 0) expect(b.lowHz).toBeGreaterThanOrEqual(bands[i - 1]!.highHz);
      });
    }
  });
  // Well-known edges, each a separate fact (ITU RR Article 5 as commonly quoted in amateur licence study material).
  test('40 m is 7000-7200 kHz in Regions 1 and 3 and 7000-7300 kHz in Region 2', () => {
    expect(edgesKHz(1, '40 m')).toEqual([7000, 7200]);
    expect(edgesKHz(3, '40 m')).toEqual([7000, 7200]);
    expect(edgesKHz(2, '40 m')).toEqual([7000, 7300]);
  });
  test('80 m ends at 3800 kHz in Region 1, 4000 kHz in Region 2, 3900 kHz in Region 3', () => {
    expect(edgesKHz(1, '80 m')).toEqual([3500, 3800]);
    expect(edgesKHz(2, '80 m')).toEqual([3500, 4000]);
    expect(edgesKHz(3, '80 m')).toEqual([3500, 3900]);
  });
  test('160 m in Region 1 is 1810-1850 kHz in the ITU table', () => {
    expect(edgesKHz(1, '160 m')).toEqual([1810, 1850]);
  });
  test('60 m is the WRC-15 secondary allocation 5351.5-5366.5 kHz in every region', () => {
    for (const region of [1, 2, 3] as const) {
      expect(edgesKHz(region, '60 m')).toEqual([5351.5, 5366.5]);
      expect(bandsForRegion(region).find((b) => b.name === '60 m')!.status).toBe('secondary');
    }
  });
  test('the WARC bands 30 m, 17 m and 12 m are the same in all regions', () => {
    for (const region of [1, 2, 3] as const) {
      expect(edgesKHz(region, '30 m')).toEqual([10100, 10150]);
      expect(edgesKHz(region, '17 m')).toEqual([18068, 18168]);
      expect(edgesKHz(region, '12 m')).toEqual([24890, 24990]);
    }
  });
  test('Region 2 other than 60 m matches amateur_hf_bands_region2_us.csv (Hamlib bandplan.h, 47 CFR 97.301)', () => {
    const rows = readCsv('radio/amateur_hf_bands_region2_us.csv').filter((row) => row.lower_kHz !== 'channelised');
    expect(
      bandsForRegion(2)
        .filter((b) => b.name !== '60 m')
        .map((b) => [b.name, b.lowHz, b.highHz]),
    ).toEqual(rows.map((row) => [row.band, Number(row.lower_kHz) * 1000, Number(row.upper_kHz) * 1000]));
  });
  test('US 60 m channel centres match amateur_60m_us_channels.csv (47 CFR 97.305(c))', () => {
    expect(US_60M_CHANNELS_HZ).toEqual(readCsv('radio/amateur_60m_us_channels.csv').map((row) => Number(row.center_kHz) * 1000));
  });
  test('the regions offered are the regions with data; anything else is refused', () => {
    expect(ITU_REGIONS_WITH_BANDS).toEqual([1, 2, 3]);
    expect(ITU_REGIONS_WITH_BANDS.every((r) => (AMATEUR_BANDS_BY_REGION[r]?.length ?? 0) > 0)).toBe(true);
    expect(errorCode(() => bandsForRegion(4 as never))).toBe('bad_argument');
    expect(errorCode(() => bandsForRegion(0 as never))).toBe('bad_argument');
  });
});

describe('planBands()', () => {
  const names = (rows: ReturnType<typeof planBands>) => rows.map((row) => row.bands.map((b) => b.name));
  test('1.75–2.0 MHz at ×1, ×2, ×4 reaches 160 m, 80 m and 40 m (common practice, no published source)', () => {
    const rows = planBands([{ label: 'A', lowHz: 1.75e6, highHz: 2.0e6, multipliers: [1, 2, 4] }], 2);
    expect(names(rows)).toEqual([['160 m'], ['80 m'], ['40 m']]);
    expect(rows.every((row) => row.bands[0]!.full)).toBe(true);
    expect(rows[1]).toMatchObject({ rangeLabel: 'A', multiplier: 2, outLowHz: 3.5e6, outHighHz: 4e6 });
  });
  test('7.0–7.3 MHz at ×2, ×3, ×4 reaches 20 m, 15 m and 10 m (common practice, no published source)', () => {
    const rows = planBands([{ label: 'B', lowHz: 7.0e6, highHz: 7.3e6, multipliers: [2, 3, 4] }], 2);
    expect(names(rows)).toEqual([['20 m'], ['15 m'], ['10 m']]);
    expect(rows[2]!.bands[0]).toEqual({ name: '10 m', coveredLowHz: 28e6, coveredHighHz: 29.2e6, full: false });
  });
  test('6.0–6.5 MHz covers 17 m at ×3 and 12 m at ×4 (common practice, no published source)', () => {
    const rows = planBands([{ label: 'C', lowHz: 6.0e6, highHz: 6.5e6, multipliers: [3, 4] }], 2);
    expect(names(rows)).toEqual([['17 m'], ['12 m']]);
    expect(rows.every((row) => row.bands[0]!.full)).toBe(true);
  });
  test('in Region 1, 3.5-4.0 MHz covers 80 m whole and 7.0-7.3 MHz covers 40 m whole (band edges from the ITU RR fixture)', () => {
    const rows = planBands(
      [
        { label: 'A', lowHz: 1.75e6, highHz: 2.0e6, multipliers: [1, 2, 4] },
        { label: 'B', lowHz: 7.0e6, highHz: 7.3e6, multipliers: [1] },
      ],
      1,
    );
    expect(rows.map((row) => row.bands.map((b) => `${b.name}${b.full ? '' : ' part'}`))).toEqual([['160 m'], ['80 m'], ['40 m'], ['40 m']]);
    // 1.75-2.0 MHz holds Region 1's 1810-1850 kHz whole; ×2 gives 3.5-4.0 MHz, beyond 80 m's 3.8 MHz top.
    expect(rows[1]!.bands[0]).toEqual({ name: '80 m', coveredLowHz: 3.5e6, coveredHighHz: 3.8e6, full: true });
    expect(rows[3]!.bands[0]).toEqual({ name: '40 m', coveredLowHz: 7.0e6, coveredHighHz: 7.2e6, full: true });
  });
  test('5.3-5.4 MHz reaches 60 m in every region, 6.0-6.5 MHz at ×1 reaches nothing', () => {
    for (const region of [1, 2, 3] as const) {
      expect(
        names(
          planBands(
            [
              { label: 'F', lowHz: 5.3e6, highHz: 5.4e6, multipliers: [1] },
              { label: 'G', lowHz: 6.0e6, highHz: 6.5e6, multipliers: [1] },
            ],
            region,
          ),
        ),
      ).toEqual([['60 m'], []]);
    }
  });
  test('a band touched only at one edge is not counted', () => {
    expect(names(planBands([{ label: 'D', lowHz: 2.0e6, highHz: 2.5e6, multipliers: [1] }], 2))).toEqual([[]]);
  });
  test('bad input', () => {
    expect(errorCode(() => planBands([{ label: 'x', lowHz: 2e6, highHz: 1e6, multipliers: [1] }], 2))).toBe('bad_frequency');
    expect(errorCode(() => planBands([{ label: 'x', lowHz: 1e6, highHz: 2e6, multipliers: [0] }], 2))).toBe('bad_argument');
    expect(errorCode(() => planBands([], 4 as never))).toBe('bad_argument');
  });
});

describe('dialForOutput()', () => {
  test('6.75 MHz × 4 = 27 MHz: the dial for a 27 MHz output at ×4 reads 6.75 on a true MHz dial (common practice, no published source)', () => {
    const points = [
      { dial: 6.5, measured: 6.5e6 },
      { dial: 7.0, measured: 7.0e6 },
    ];
    expect(dialForOutput(points, 4, 27e6)).toBeCloseTo(6.75, 12);
    expect(planBands([{ label: 'E', lowHz: 6.75e6, highHz: 7e6, multipliers: [4] }], 2)[0]!.outLowHz).toBe(27e6);
  });
  test('uses the measured points, so a dial reading low gives a corrected setting', () => {
    // Dial reads 15 kHz high at both ends: 7.015 on the dial gives 7.000 MHz.
    const points = [
      { dial: 7.015, measured: 7.0e6 },
      { dial: 7.315, measured: 7.3e6 },
    ];
    expect(dialForOutput(points, 2, 14.2e6)).toBeCloseTo(7.115, 12);
    expect(errorCode(() => dialForOutput(points, 2, 15e6))).toBe('outside_span');
    expect(errorCode(() => dialForOutput(points, 0, 14.2e6))).toBe('bad_argument');
  });
});

describe('downsampleLttb()', () => {
  test('keeps the first and last points and the peak of each bucket', () => {
    expect(downsampleLttb([0, 1, 2, 3, 4], [0, 5, 0, 1, 0], 3)).toEqual({ x: [0, 1, 4], y: [0, 5, 0] });
  });
  test('returns threshold points, in order, all taken from the input', () => {
    const x = Array.from({ length: 10_000 }, (_, i) => i);
    const y = x.map((v) => Math.sin(v / 50) + (v === 5000 ? 10 : 0));
    const out = downsampleLttb(Object.freeze(x), Object.freeze(y), 2000);
    expect(out.x).toHaveLength(2000);
    expect(out.x[0]).toBe(0);
    expect(out.x[1999]).toBe(9999);
    expect(out.x.every((v, i) => i === 0 || v > out.x[i - 1]!)).toBe(true);
    expect(out.x.every((v, i) => y[v] === out.y[i])).toBe(true);
    expect(out.x).toContain(5000); // the spike survives
  });
  test('short input comes back as a copy', () => {
    const x = [1, 2];
    const out = downsampleLttb(x, [3, 4], 10);
    expect(out).toEqual({ x: [1, 2], y: [3, 4] });
    expect(out.x).not.toBe(x);
  });
  test('bad input', () => {
    expect(errorCode(() => downsampleLttb([1, 2, 3], [1, 2, 3], 2))).toBe('bad_argument');
    expect(errorCode(() => downsampleLttb([1, 2, 3], [1, 2], 3))).toBe('length_mismatch');
  });
});
