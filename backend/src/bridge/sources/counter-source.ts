import type { AttachAck } from '@kilocycle/common/events';
import { parseFrequency, parseNumber } from '@kilocycle/common/units';

/** One reading as a source produces it; the bridge numbers it and stamps `t` when the source does not. */
export type Captured = { t?: number; dial?: number | null; frequency: number };

export type SourceContext = {
  /** What the server said when the bridge attached: the run, its range and when it started. */
  attach: AttachAck;
  /** A message for the operator (stderr, above the status line). */
  warn: (message: string) => void;
};

/** Where readings come from: a counter over TCP or a serial line, standard input, or a simulation. */
export interface CounterSource {
  readonly label: string;
  /** Produces readings until it ends by itself (input closed) or stop() is called. */
  run(emit: (reading: Captured) => void, context: SourceContext): Promise<void>;
  stop(): void;
  /** Input lines that held no reading (each was reported through warn). */
  readonly skipped: number;
}

/**
 * Reads one text line: `frequency` or `dial,frequency` (a tab or semicolon also separates them).
 * The frequency is in Hz unless it carries a unit (`7.050 MHz`); numbers use a decimal point.
 * Returns null for blank lines and # comments; throws with a reason when the line holds no reading.
 */
export function parseReadingLine(line: string): Captured | null {
  const text = line.trim();
  if (text === '' || text.startsWith('#')) return null;
  const parts = text.split(/[,;\t]/);
  if (parts.length > 2) throw new Error(`expected "frequency" or "dial,frequency", got ${parts.length} fields`);
  const frequencyText = parts.at(-1)!.trim();
  let frequency: number;
  try {
    frequency = parseFrequency(frequencyText, 'Hz');
  } catch (error) {
    throw new Error(`"${frequencyText}" is not a frequency (${error instanceof Error ? error.message : String(error)})`, {
      cause: error,
    });
  }
  if (parts.length === 1) return { frequency };
  const dialText = parts[0].trim();
  try {
    return { dial: parseNumber(dialText), frequency };
  } catch (error) {
    throw new Error(`"${dialText}" is not a dial setting (${error instanceof Error ? error.message : String(error)})`, {
      cause: error,
    });
  }
}

/** Waits ms, or less when the signal aborts. */
export function sleep(ms: number, signal?: AbortSignal): Promise<void> {
  return new Promise((resolve) => {
    if (signal?.aborted) return resolve();
    const timer = setTimeout(done, ms);
    function done() {
      clearTimeout(timer);
      signal?.removeEventListener('abort', done);
      resolve();
    }
    signal?.addEventListener('abort', done, { once: true });
  });
}
