import { describe, expect, it } from 'vitest';
import type { RunAnalysis } from '@kilocycle/common/types';
import { noReadingsNotice } from '../run-access';

const empty = (readingCount: number, excludedCount: number): RunAnalysis => ({
  state: 'empty',
  analysis: 'none',
  runId: 3,
  runKind: 'warmup',
  readingCount,
  excludedCount,
  usedCount: 0,
});

describe('noReadingsNotice', () => {
  it('says "No readings yet" for a run the API calls empty with nothing recorded', () => {
    expect(noReadingsNotice(empty(0, 0), null)).toBe('No readings yet.');
  });

  it('says the readings are excluded when there are some but none is included', () => {
    expect(noReadingsNotice(empty(1, 1), null)).toBe('No readings to analyse: the one reading is excluded.');
    expect(noReadingsNotice(empty(12, 12), null)).toBe('No readings to analyse: all 12 readings are excluded.');
  });

  it('says nothing while loading, and gives way to a newer refusal (the old "empty" answer is still in the data then)', () => {
    expect(noReadingsNotice(undefined, null)).toBeNull();
    expect(noReadingsNotice(empty(0, 0), new Error('a warm-up fit requires at least 5 data points'))).toBeNull();
  });
});
