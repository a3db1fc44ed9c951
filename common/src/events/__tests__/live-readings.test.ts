import { liveReadings, toLiveReadingsEvent, type StoredReadingView } from '../live-readings.js';

// Hand-written batches (no source to cite: the shapes are our own protocol): two bridge readings at one receipt time.
const AT = '2026-12-04T09:30:00.125Z';
const BATCH: StoredReadingView[] = [
  { id: 501, seq: 7, t: 3.5, dial: null, frequency: 7_049_998.75, aux: 21.5, source: 'bridge', receivedAt: AT, excluded: false, excludedReason: null },
  { id: 502, seq: 8, t: 4, dial: 1750.5, frequency: 7_049_999.125, aux: null, source: 'bridge', receivedAt: AT, excluded: false, excludedReason: null },
];
const BENCH = { kind: 'bench' as const, id: 3, name: 'Bench East' };

describe('live readings event', () => {
  it('should send what a batch shares once and the rest as columns', () => {
    expect(toLiveReadingsEvent(12, BENCH, BATCH)).toEqual({
      runId: 12,
      author: BENCH,
      source: 'bridge',
      receivedAt: AT,
      id: [501, 502],
      seq: [7, 8],
      t: [3.5, 4],
      dial: [null, 1750.5],
      frequency: [7_049_998.75, 7_049_999.125],
      aux: [21.5, null],
    });
  });

  it('should give the page back every reading as stored, each with the batch author, through JSON', () => {
    const wire = JSON.parse(JSON.stringify(toLiveReadingsEvent(12, BENCH, BATCH)));
    expect(liveReadings(wire)).toEqual(BATCH.map((r) => ({ ...r, author: BENCH })));
  });

  it('should be a quarter or less of the text of the same thousand readings as objects with their keys', () => {
    const many: StoredReadingView[] = Array.from({ length: 1000 }, (_, i) => ({
      id: 1_000_000 + i,
      seq: i + 1,
      t: (i + 1) * 0.5,
      dial: null,
      frequency: 7_050_000 - 1270 * Math.exp(-((i + 1) * 0.5) / 600),
      aux: null,
      source: 'bridge',
      receivedAt: AT,
      excluded: false,
      excludedReason: null,
    }));
    const columns = JSON.stringify(toLiveReadingsEvent(1, BENCH, many)).length;
    const objects = JSON.stringify({ runId: 1, author: BENCH, readings: many }).length;
    expect(columns / objects).toBeLessThanOrEqual(0.25);
  });

  it('should refuse an empty batch and a batch that mixes receipt times', () => {
    expect(() => toLiveReadingsEvent(1, null, [])).toThrow('without readings');
    expect(() => toLiveReadingsEvent(1, null, [BATCH[0]!, { ...BATCH[1]!, receivedAt: '2026-12-04T09:30:01.000Z' }])).toThrow('one receipt time');
  });
});
