import { Injectable } from '@nestjs/common';
import { RunReadingsReader, type SeriesColumns } from '../readings/run-readings.reader.js';
import { RunContextReader } from '../runs/run-context.reader.js';

/** A run's readings as columns, in seq order; NaN stands for an empty dial or aux. */
export type RunSeries = {
  count: number;
  seq: Float64Array;
  t: Float64Array;
  dial: Float64Array;
  frequency: Float64Array;
  aux: Float64Array;
  excluded: Uint8Array;
};

export type RunCounts = { readingCount: number; excludedCount: number };

export type { SeriesColumns };
const ALL_COLUMNS: SeriesColumns = { dial: true, aux: true };

/**
 * Reads a run's readings as the readings module streams them (row arrays straight from the driver, see
 * RunReadingsReader.streamSeries) into typed arrays: no entities, no per-row objects.
 */
@Injectable()
export class RunSeriesLoader {
  constructor(
    private readonly readings: RunReadingsReader,
    private readonly runs: RunContextReader,
  ) {}

  /** The run's reading and exclusion counts from its counters (kept with every batch and exclusion: nothing is counted). */
  async counts(runId: number): Promise<RunCounts> {
    const counters = await this.runs.counters(runId);
    return { readingCount: counters?.readingCount ?? 0, excludedCount: counters?.excludedCount ?? 0 };
  }

  /** Columns not asked for come back as NaN. */
  async load(runId: number, expected: number, columns: SeriesColumns = ALL_COLUMNS): Promise<RunSeries> {
    const excludedSeqs = await this.readings.excludedSeqs(runId);
    let capacity = Math.max(expected, 16);
    let series = allocate(capacity);
    let count = 0;
    await this.readings.streamSeries(runId, columns, (row) => {
      // Readings may arrive while we read: grow rather than overrun.
      if (count === capacity) {
        capacity *= 2;
        series = grow(series, capacity);
      }
      const seq = Number(row[0]);
      series.seq[count] = seq;
      series.t[count] = Number(row[1]);
      series.dial[count] = row[2] === null ? Number.NaN : Number(row[2]);
      series.frequency[count] = Number(row[3]);
      series.aux[count] = row[4] === null ? Number.NaN : Number(row[4]);
      series.excluded[count] = excludedSeqs.has(seq) ? 1 : 0;
      count += 1;
    });
    return {
      count,
      seq: series.seq.subarray(0, count),
      t: series.t.subarray(0, count),
      dial: series.dial.subarray(0, count),
      frequency: series.frequency.subarray(0, count),
      aux: series.aux.subarray(0, count),
      excluded: series.excluded.subarray(0, count),
    };
  }
}

function allocate(capacity: number): Omit<RunSeries, 'count'> {
  return {
    seq: new Float64Array(capacity),
    t: new Float64Array(capacity),
    dial: new Float64Array(capacity),
    frequency: new Float64Array(capacity),
    aux: new Float64Array(capacity),
    excluded: new Uint8Array(capacity),
  };
}

function grow(old: Omit<RunSeries, 'count'>, capacity: number): Omit<RunSeries, 'count'> {
  const next = allocate(capacity);
  next.seq.set(old.seq);
  next.t.set(old.t);
  next.dial.set(old.dial);
  next.frequency.set(old.frequency);
  next.aux.set(old.aux);
  next.excluded.set(old.excluded);
  return next;
}

/** Included readings in time order: t and frequency (and aux), for the time-series analyses. */
export function includedByTime(series: RunSeries): { t: Float64Array; frequency: Float64Array; aux: Float64Array } {
  let n = 0;
  for (let i = 0; i < series.count; i++) if (series.excluded[i] === 0) n++;
  // Nothing excluded and already in time order (the usual case): the series' own columns, read only, no copy.
  if (n === series.count && inTimeOrder(series.t)) return { t: series.t, frequency: series.frequency, aux: series.aux };
  const order = new Uint32Array(n);
  let k = 0;
  let sorted = true;
  for (let i = 0; i < series.count; i++) {
    if (series.excluded[i] !== 0) continue;
    if (k > 0 && series.t[i]! < series.t[order[k - 1]!]!) sorted = false;
    order[k++] = i;
  }
  // Readings come in seq order, which is time order unless a bridge re-sent old ones late.
  if (!sorted) order.sort((a, b) => series.t[a]! - series.t[b]! || series.seq[a]! - series.seq[b]!);
  const t = new Float64Array(n);
  const frequency = new Float64Array(n);
  const aux = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    const i = order[j]!;
    t[j] = series.t[i]!;
    frequency[j] = series.frequency[i]!;
    aux[j] = series.aux[i]!;
  }
  return { t, frequency, aux };
}

function inTimeOrder(t: Float64Array): boolean {
  for (let i = 1; i < t.length; i++) if (t[i]! < t[i - 1]!) return false;
  return true;
}
