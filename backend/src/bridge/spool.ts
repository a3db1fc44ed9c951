import { open, readFile, type FileHandle } from 'node:fs/promises';
import { dirname } from 'node:path';
import { mkdirSync } from 'node:fs';

/** A numbered reading as the bridge holds, spools and sends it. */
/** A numbered reading: a frequency (Hz), or in a phase run a time interval (s). */
export type BridgeReading = { seq: number; t: number; dial?: number | null; frequency?: number | string; timeInterval?: number };

type SpoolLine = { run: number; readings: readonly BridgeReading[] };

/**
 * The bridge's spool: an append-only file of numbered readings not yet acknowledged, one JSON line per
 * write, synced to disk. Written while the server is unreachable; emptied once everything in it is
 * acknowledged. A bridge started on a non-empty spool sends its readings first (their seq numbers make
 * a repeat harmless).
 */
export class Spool {
  private handle: FileHandle | null = null;
  private chain: Promise<void> = Promise.resolve();
  private bytes = 0;

  constructor(
    readonly path: string,
    private readonly runId: number,
  ) {}

  /** Opens the file (creating it) and returns the readings a previous bridge left in it. */
  async open(): Promise<BridgeReading[]> {
    mkdirSync(dirname(this.path), { recursive: true });
    let text = '';
    try {
      text = await readFile(this.path, 'utf8');
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code !== 'ENOENT') throw error;
    }
    const left: BridgeReading[] = [];
    const lines = text.split('\n');
    lines.forEach((line, index) => {
      if (line.trim() === '') return;
      let parsed: SpoolLine;
      try {
        parsed = JSON.parse(line) as SpoolLine;
      } catch {
        // Only the last line can be cut short (the bridge was killed mid-write); anything else is damage.
        if (index >= lines.length - 2) return;
        throw new Error(`the spool ${this.path} is damaged at line ${index + 1}; move it away and start again`);
      }
      if (parsed.run !== this.runId) {
        throw new Error(`the spool ${this.path} holds readings for run ${parsed.run}; send them with --run ${parsed.run}, or use another --spool file`);
      }
      left.push(...parsed.readings);
    });
    this.handle = await open(this.path, 'a');
    this.bytes = Buffer.byteLength(text);
    return left;
  }

  get size(): number {
    return this.bytes;
  }

  /** Appends readings and syncs them to disk (queued behind earlier writes). */
  append(readings: readonly BridgeReading[]): Promise<void> {
    if (readings.length === 0) return this.chain;
    const line = JSON.stringify({ run: this.runId, readings } satisfies SpoolLine) + '\n';
    return this.enqueue(async (handle) => {
      await handle.appendFile(line, 'utf8');
      await handle.datasync();
      this.bytes += Buffer.byteLength(line);
    });
  }

  /** Empties the file: everything in it has been acknowledged. */
  clear(): Promise<void> {
    return this.enqueue(async (handle) => {
      if (this.bytes === 0) return;
      await handle.truncate(0);
      await handle.datasync();
      this.bytes = 0;
    });
  }

  async close(): Promise<void> {
    await this.chain;
    await this.handle?.close().catch(() => undefined);
    this.handle = null;
  }

  private enqueue(work: (handle: FileHandle) => Promise<void>): Promise<void> {
    const handle = this.handle;
    if (!handle) return Promise.reject(new Error('the spool is not open'));
    const next = this.chain.then(() => work(handle));
    this.chain = next.catch(() => undefined);
    return next;
  }
}
