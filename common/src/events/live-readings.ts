import type { Reading, ReadingAuthor, ReadingSource } from '../types/lab.js';

/** A stored reading as the server knows it when it fans a batch out (the batch's author is kept beside it). */
export type StoredReadingView = Omit<Reading, 'author'>;

/**
 * Readings just stored in a run, one message per stored batch, in seq order. What every reading of a batch
 * shares (the author, the path that stored it, the receipt time; none is excluded yet) is sent once, and the
 * rest as one column per field: a thousand-reading batch is about a quarter of the text of a list of objects
 * with their keys, for the server to encode and each watching page to decode.
 */
export type LiveReadingsEvent = {
  runId: number;
  author: ReadingAuthor | null;
  source: ReadingSource;
  receivedAt: string;
  id: number[];
  seq: number[];
  t: number[];
  dial: Array<number | null>;
  frequency: number[];
  aux: Array<number | null>;
};

/** The event for one stored batch (the server's side); all readings of a batch share their source and receipt time. */
export function toLiveReadingsEvent(runId: number, author: ReadingAuthor | null, readings: readonly StoredReadingView[]): LiveReadingsEvent {
  const first = readings[0];
  if (!first) throw new Error('toLiveReadingsEvent: a batch without readings is not sent');
  const n = readings.length;
  const event: LiveReadingsEvent = {
    runId,
    author,
    source: first.source,
    receivedAt: first.receivedAt,
    id: new Array<number>(n),
    seq: new Array<number>(n),
    t: new Array<number>(n),
    dial: new Array<number | null>(n),
    frequency: new Array<number>(n),
    aux: new Array<number | null>(n),
  };
  for (let i = 0; i < n; i++) {
    const r = readings[i]!;
    if (r.source !== first.source || r.receivedAt !== first.receivedAt) throw new Error('toLiveReadingsEvent: one batch, one source and one receipt time');
    event.id[i] = r.id;
    event.seq[i] = r.seq;
    event.t[i] = r.t;
    event.dial[i] = r.dial;
    event.frequency[i] = r.frequency;
    event.aux[i] = r.aux;
  }
  return event;
}

/** The batch's readings as the pages keep them, each with the batch's author (the page's side). */
export function liveReadings(event: LiveReadingsEvent): Reading[] {
  return event.seq.map((seq, i) => ({
    id: event.id[i]!,
    seq,
    t: event.t[i]!,
    dial: event.dial[i] ?? null,
    frequency: event.frequency[i]!,
    aux: event.aux[i] ?? null,
    source: event.source,
    receivedAt: event.receivedAt,
    excluded: false,
    excludedReason: null,
    author: event.author,
  }));
}
