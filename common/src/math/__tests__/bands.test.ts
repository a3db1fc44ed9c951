// Band planner: band edges from fixtures/radio (ITU RR Article 5 / 47 CFR 97.301, Region 2),
// facts of the trade for range coverage.
import { AMATEUR_BANDS_REGION2, bandsForRegion, US_60M_CHANNELS_HZ } from '../amateur-bands.js';
import { dialForOutput, planBands } from '../plan-bands.js';
import { downsampleLttb } from '../downsample-lttb.js';
import { errorCode, readCsv } from './helpers.js';

describe('AMATEUR_BANDS_REGION2', () => {
  test('matches amateur_hf_bands_region2_us.csv (ITU RR Art. 5 / 47 CFR 97.301), 60 m left out as channelised', () => {
    const rows = readCsv('radio/amateur_hf_bands_region2_us.csv').filter((row) => row.lower_kHz !== 'channelised');
    expect(AMATEUR_BANDS_REGION2.map((b) => [b.name, b.lowHz, b.highHz])).toEqual(
      rows.map((row) => [row.band, Number(row.lower_kHz) * 1000, Number(row.upper_kHz) * 1000]),
    );
  });
  test('US 60 m channel centres match amateur_60m_us_channels.csv (47 CFR 97.305(c))', () => {
    expect(US_60M_CHANNELS_HZ).toEqual(readCsv('radio/amateur_60m_us_channels.csv').map((row) => Number(row.center_kHz) * 1000));
  });
  test('regions 1 and 3 are not available; others are refused', () => {
    expect(bandsForRegion(2)).toBe(AMATEUR_BANDS_REGION2);
    expect(errorCode(() => bandsForRegion(1))).toBe('region_not_available');
    expect(errorCode(() => bandsForRegion(3))).toBe('region_not_available');
    expect(errorCode(() => bandsForRegion(4 as never))).toBe('bad_argument');
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
  test('a band touched only at one edge is not counted', () => {
    expect(names(planBands([{ label: 'D', lowHz: 2.0e6, highHz: 2.5e6, multipliers: [1] }], 2))).toEqual([[]]);
  });
  test('bad input', () => {
    expect(errorCode(() => planBands([{ label: 'x', lowHz: 2e6, highHz: 1e6, multipliers: [1] }], 2))).toBe('bad_frequency');
    expect(errorCode(() => planBands([{ label: 'x', lowHz: 1e6, highHz: 2e6, multipliers: [0] }], 2))).toBe('bad_argument');
    expect(errorCode(() => planBands([], 1))).toBe('region_not_available');
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
