import { Injectable } from '@nestjs/common';
import { RunReadingsReader, type SeriesColumns } from '../readings/run-readings.reader.js';
import { RunContextReader } from '../runs/run-context.reader.js';

/** A run's readings as columns, in seq order; NaN stands for an empty dial or aux. */
export type RunSeries = {
  /** Readings the run had when it was read, excluded ones too. */
  readingCount: number;
  /** How many of those are excluded. */
  excludedCount: number;
  /** Rows held in the columns: every reading, or only the included ones when the excluded were left out. */
  count: number;
  /** Indexes of the excluded rows held, ascending (noted as they were read; none when they were left out). */
  excludedAt: number[];
  /** Whether t never goes back from one reading to the next (checked as they were read). */
  inTimeOrder: boolean;
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

  /**
   * Columns not asked for come back as NaN. With keepExcluded false the excluded readings are counted but not
   * held (what the time-series analyses want: no copy of a million readings to leave a few out).
   */
  async load(runId: number, expected: number, columns: SeriesColumns = ALL_COLUMNS, keepExcluded = true): Promise<RunSeries> {
    const excludedSeqs = await this.readings.excludedSeqs(runId);
    const anyExcluded = excludedSeqs.size > 0;
    const withDial = columns.dial;
    const withAux = columns.aux;
    let capacity = Math.max(expected, 16);
    let series = allocate(capacity, columns);
    // The columns as locals, and the last t kept: this runs once per reading (a million times for a large run),
    // mostly before V8 has optimised it, so each property load and lookup left out of it counts.
    let { seq: seqs, t: ts, dial: dials, frequency: frequencies, aux: auxes, excluded: flags } = series;
    let count = 0;
    let readingCount = 0;
    const excludedAt: number[] = [];
    let inTimeOrder = true;
    let previousT = Number.NEGATIVE_INFINITY;
    await this.readings.streamSeries(runId, columns, (row) => {
      // Readings may arrive while we read: grow rather than overrun.
      if (count === capacity) {
        capacity *= 2;
        series = grow(series, capacity, columns);
        ({ seq: seqs, t: ts, dial: dials, frequency: frequencies, aux: auxes, excluded: flags } = series);
      }
      const seq = Number(row[0]);
      const excluded = anyExcluded && excludedSeqs.has(seq);
      readingCount += 1;
      if (excluded && !keepExcluded) return;
      const t = Number(row[1]);
      if (t < previousT) inTimeOrder = false;
      previousT = t;
      seqs[count] = seq;
      ts[count] = t;
      // Columns not asked for were filled with NaN when allocated (the reader sends null for them).
      if (withDial) dials[count] = row[2] === null ? Number.NaN : Number(row[2]);
      frequencies[count] = Number(row[3]);
      if (withAux) auxes[count] = row[4] === null ? Number.NaN : Number(row[4]);
      if (excluded) {
        flags[count] = 1;
        excludedAt.push(count);
      }
      count += 1;
    });
    return {
      readingCount,
      excludedCount: keepExcluded ? excludedAt.length : readingCount - count,
      count,
      excludedAt,
      inTimeOrder,
      seq: series.seq.subarray(0, count),
      t: series.t.subarray(0, count),
      dial: series.dial.subarray(0, count),
      frequency: series.frequency.subarray(0, count),
      aux: series.aux.subarray(0, count),
      excluded: series.excluded.subarray(0, count),
    };
  }
}

type Columns = Pick<RunSeries, 'seq' | 't' | 'dial' | 'frequency' | 'aux' | 'excluded'>;

function allocate(capacity: number, columns: SeriesColumns): Columns {
  return {
    seq: new Float64Array(capacity),
    t: new Float64Array(capacity),
    dial: columns.dial ? new Float64Array(capacity) : new Float64Array(capacity).fill(Number.NaN),
    frequency: new Float64Array(capacity),
    aux: columns.aux ? new Float64Array(capacity) : new Float64Array(capacity).fill(Number.NaN),
    excluded: new Uint8Array(capacity),
  };
}

function grow(old: Columns, capacity: number, columns: SeriesColumns): Columns {
  const next = allocate(capacity, columns);
  next.seq.set(old.seq);
  next.t.set(old.t);
  next.dial.set(old.dial);
  next.frequency.set(old.frequency);
  next.aux.set(old.aux);
  next.excluded.set(old.excluded);
  return next;
}

/** Included readings in time order: t and frequency (and aux, and seq to name a reading), for the time-series analyses. */
export type IncludedSeries = { t: Float64Array; frequency: Float64Array; aux: Float64Array; seq: Float64Array };

export function includedByTime(series: RunSeries): IncludedSeries {
  const n = series.count - series.excludedAt.length;
  // Nothing excluded and already in time order (the usual case): the series' own columns, read only, no copy.
  if (n === series.count && series.inTimeOrder) return { t: series.t, frequency: series.frequency, aux: series.aux, seq: series.seq };
  // In time order with a few readings excluded: copy the stretches between them (block copies, no index).
  if (series.inTimeOrder) return withoutExcluded(series, n);
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
  const seq = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    const i = order[j]!;
    t[j] = series.t[i]!;
    frequency[j] = series.frequency[i]!;
    aux[j] = series.aux[i]!;
    seq[j] = series.seq[i]!;
  }
  return { t, frequency, aux, seq };
}

function withoutExcluded(series: RunSeries, n: number): IncludedSeries {
  const out = { t: new Float64Array(n), frequency: new Float64Array(n), aux: new Float64Array(n), seq: new Float64Array(n) };
  let to = 0;
  let from = 0;
  // The stretches between excluded readings, found from their indexes (a loop over each of a million flags
  // costs a tenth of a second while the code is still cold).
  for (const end of [...series.excludedAt, series.count]) {
    if (end > from) {
      out.t.set(series.t.subarray(from, end), to);
      out.frequency.set(series.frequency.subarray(from, end), to);
      out.aux.set(series.aux.subarray(from, end), to);
      out.seq.set(series.seq.subarray(from, end), to);
      to += end - from;
    }
    from = end + 1;
  }
  return out;
}
