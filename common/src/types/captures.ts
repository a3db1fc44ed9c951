import type { Reading } from './lab.js';

/**
 * Whether a bench bridge feeds a run now. `since` is when the bridge connected (while connected) or when it
 * went offline; null, with connected false, for a run no bridge has fed (typed or imported readings only).
 * `lastReadingAt` is when the run's newest reading was stored (whatever its source), null when it has none.
 */
export type RunBridge = { connected: boolean; since: string | null; lastReadingAt: string | null };

/** How a procedure's counter-assisted capture decides that the counter has settled, and the dial marks it proposes. */
export type CaptureSettings = {
  /** N: consecutive counter readings that must agree (2 to 50). */
  captureSettleCount: number;
  /** The band, in Hz, the N readings must lie within (max − min). */
  captureToleranceHz: number;
  /** Seconds a setting waits for the counter to settle before it ends with a message (5 to 600). */
  captureTimeoutS: number;
  /** Dial marks in the order the procedure takes them; the capture form proposes the next one. Empty: none. */
  dialMarks: number[];
};

export const CAPTURE_DEFAULTS: CaptureSettings = { captureSettleCount: 5, captureToleranceHz: 5, captureTimeoutS: 30, dialMarks: [] };
export const CAPTURE_LIMITS = {
  settleCount: { min: 2, max: 50 },
  toleranceHz: { min: 0.001, max: 1_000_000 },
  timeoutS: { min: 5, max: 600 },
  dialMarks: { max: 100 },
} as const;

/** waiting: taking counter readings; then settled, or ended (abandoned, timed out, failed: with a message). */
export type CaptureStatus = 'waiting' | 'settled' | 'abandoned' | 'timed_out' | 'failed';

/** A dial setting waiting for (or done with) the counter: GET/POST/DELETE /api/runs/:id/capture and the live `capture` event. */
export type CounterCapture = {
  runId: number;
  dial: number;
  status: CaptureStatus;
  /** When Enter was pressed (server time); only counter readings stored after it count. */
  startedAt: string;
  /** Counter readings taken so far. */
  count: number;
  /** max − min of the last N readings so far (null before the first). */
  spreadHz: number | null;
  lastHz: number | null;
  settleCount: number;
  toleranceHz: number;
  timeoutS: number;
  /** When settled: the stored reading for the setting (the mean), with n and SD of the counter readings behind it. */
  reading: Reading | null;
  mean: number | null;
  n: number | null;
  sd: number | null;
  /** Server time at which the settle condition was met (before the write). */
  settledAt: string | null;
  /** Why it ended, for abandoned, timed_out and failed. */
  message: string | null;
};

export type StartCaptureRequest = { dial: number | string };
/** GET /api/runs/:id/capture: the setting waiting now (null when none), and the next dial mark the procedure proposes. */
export type CaptureState = { capture: CounterCapture | null; nextMark: number | null; settings: CaptureSettings };
