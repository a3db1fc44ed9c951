import { includedByTime, type RunSeries } from '../../src/analysis/run-series.loader.js';

// Hand-made series: every expected column below is written out, not computed by the code under test.
function series(t: number[], excluded: number[]): RunSeries {
  const n = t.length;
  return {
    readingCount: n,
    excludedCount: excluded.length,
    count: n,
    excludedAt: excluded,
    inTimeOrder: t.every((value, i) => i === 0 || value >= t[i - 1]!),
    seq: Float64Array.from(t, (_, i) => i + 1),
    t: Float64Array.from(t),
    dial: new Float64Array(n).fill(Number.NaN),
    frequency: Float64Array.from(t, (_, i) => 1000 + i),
    aux: Float64Array.from(t, (_, i) => 10 * i),
    excluded: Uint8Array.from(t, (_, i) => (excluded.includes(i) ? 1 : 0)),
  };
}

describe('includedByTime: the included readings in time order', () => {
  it('should hand back the series’ own columns when nothing is excluded and time runs forward', () => {
    const s = series([0, 1, 2, 3], []);
    const out = includedByTime(s);
    expect(out.t).toBe(s.t);
    expect(out.frequency).toBe(s.frequency);
    expect(out.aux).toBe(s.aux);
  });

  it('should drop excluded readings at the start, in the middle (two together) and at the end', () => {
    const out = includedByTime(series([0, 1, 2, 3, 4, 5, 6, 7], [0, 3, 4, 7]));
    expect(Array.from(out.t)).toEqual([1, 2, 5, 6]);
    expect(Array.from(out.frequency)).toEqual([1001, 1002, 1005, 1006]);
    expect(Array.from(out.aux)).toEqual([10, 20, 50, 60]);
  });

  it('should put readings a bridge re-sent late back in time order, ties by sequence number', () => {
    const out = includedByTime(series([0, 2, 1, 2, 3], [4]));
    expect(Array.from(out.t)).toEqual([0, 1, 2, 2]);
    expect(Array.from(out.frequency)).toEqual([1000, 1002, 1001, 1003]);
  });

  it('should give empty columns when every reading is excluded', () => {
    const out = includedByTime(series([0, 1], [0, 1]));
    expect(out.t.length).toBe(0);
    expect(out.frequency.length).toBe(0);
  });
});
