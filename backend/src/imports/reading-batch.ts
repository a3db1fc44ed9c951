import type { ImportRejection, ReadingInput, RunDataKind } from '@kilocycle/common/types';
import { MAX_BATCH } from '../readings/readings-writer.service.js';

/**
 * Up to MAX_BATCH converted rows kept as numbers (NaN: not given) with their line numbers, so that a
 * batch waiting on the database holds no text and no per-row objects: a million-row import then
 * leaves little for the garbage collector to promote, and the server's memory stays flat.
 */
export class ReadingBatch {
  readonly t = new Float64Array(MAX_BATCH);
  readonly dial = new Float64Array(MAX_BATCH);
  /** Each reading's value: frequency (Hz), or the time interval (s) in a phase run. */
  readonly frequency = new Float64Array(MAX_BATCH);
  readonly aux = new Float64Array(MAX_BATCH);
  readonly lines = new Int32Array(MAX_BATCH);
  size = 0;
  readonly rejected: ImportRejection[] = [];

  constructor(private readonly dataKind: RunDataKind = 'frequency') {}

  get full(): boolean {
    return this.size + this.rejected.length >= MAX_BATCH;
  }

  get empty(): boolean {
    return this.size === 0 && this.rejected.length === 0;
  }

  add(line: number, input: ReadingInput): void {
    const i = this.size++;
    this.lines[i] = line;
    this.t[i] = input.t ?? Number.NaN;
    this.dial[i] = typeof input.dial === 'number' ? input.dial : Number.NaN;
    this.frequency[i] = Number(this.dataKind === 'phase' ? input.timeInterval : input.frequency);
    this.aux[i] = input.aux ?? Number.NaN;
  }

  /** The readings for the write path, built just before they are sent. */
  inputs(): ReadingInput[] {
    const out: ReadingInput[] = new Array(this.size);
    for (let i = 0; i < this.size; i++) {
      const input: ReadingInput = this.dataKind === 'phase' ? { timeInterval: this.frequency[i]! } : { frequency: this.frequency[i]! };
      if (!Number.isNaN(this.t[i]!)) input.t = this.t[i]!;
      if (!Number.isNaN(this.dial[i]!)) input.dial = this.dial[i]!;
      if (!Number.isNaN(this.aux[i]!)) input.aux = this.aux[i]!;
      out[i] = input;
    }
    return out;
  }
}
