import type { AttachAck } from '@kilocycle/common/events';
import type { RunDataKind } from '@kilocycle/common/types';
import { parseFrequency, parseNumber, parseTimeInterval } from '@kilocycle/common/units';

/**
 * One reading as a source produces it; the bridge numbers it and stamps `t` when the source does not. A frequency
 * run's reading gives `frequency` (Hz), a phase run's `timeInterval` (s): the run's data kind, told at attach, decides.
 */
export type Captured = { t?: number; dial?: number | null; frequency?: number; timeInterval?: number };

/**
 * A counter's bare number as a reading of the run's kind, or null when it cannot be one: a frequency must be
 * above zero; a time interval may have either sign (the counter's stop may come before its start's reference edge).
 */
export function numberReading(dataKind: RunDataKind, value: number | null): Captured | null {
  if (value === null || !Number.isFinite(value)) return null;
  if (dataKind === 'phase') return { timeInterval: value };
  return value > 0 ? { frequency: value } : null;
}

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
 * In a phase run the value is a time interval in seconds unless it carries a unit (`12.5 ns`).
 * Returns null for blank lines and # comments; throws with a reason when the line holds no reading.
 */
export function parseReadingLine(line: string, dataKind: RunDataKind = 'frequency'): Captured | null {
  const text = line.trim();
  if (text === '' || text.startsWith('#')) return null;
  const parts = text.split(/[,;\t]/);
  const what = dataKind === 'phase' ? 'time interval' : 'frequency';
  if (parts.length > 2) throw new Error(`expected "${what}" or "dial,${what}", got ${parts.length} fields`);
  const valueText = parts.at(-1)!.trim();
  let value: Captured;
  try {
    value = dataKind === 'phase' ? { timeInterval: parseTimeInterval(valueText) } : { frequency: parseFrequency(valueText, 'Hz') };
  } catch (error) {
    throw new Error(`"${valueText}" is not a ${what} (${error instanceof Error ? error.message : String(error)})`, {
      cause: error,
    });
  }
  if (parts.length === 1) return value;
  const dialText = parts[0].trim();
  try {
    return { dial: parseNumber(dialText), ...value };
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
