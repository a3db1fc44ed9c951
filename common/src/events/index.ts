import type { CounterCapture } from '../types/captures.js';
import type { IngestAck, RangeSpan, Reading, ReadingInput, RunDataKind, RunKind } from '../types/lab.js';
import type { ImportProgress } from '../types/studies.js';

/** Socket.io namespaces and event names shared by the server, the bridge and the browser. */
export const NAMESPACES = { ingest: '/ingest', live: '/live' } as const;

/** The most readings one `readings` batch may carry; a larger batch is refused whole. */
export const MAX_INGEST_BATCH = 1000;

/**
 * Events on `/ingest` (benches). The bridge connects with `auth: {token}` (the bench token); a wrong
 * or revoked token ends in `connect_error` whose message says why and whose `data` is a
 * {@link ConnectRefusal}. `attach` and `readings` are emitted with an acknowledgement callback; the
 * server answers through it and, when it refuses, also emits `refused`.
 */
export const INGEST_EVENTS = {
  /** bench → server: {@link AttachRequest}; ack {@link AttachReply}. */
  attach: 'attach',
  /** bench → server: {@link IngestBatch}; ack {@link IngestBatchReply} after the batch is committed. */
  readings: 'readings',
  /** server → bench: {@link RefusedEvent}, whenever an attach or a batch is refused whole. */
  refused: 'refused',
} as const;

/**
 * Events on `/live` (browsers). The page connects with `auth: {token}` (the session's JWT), then
 * emits `join` for each run it shows; stored readings arrive as `readings` events. Every socket is also in
 * its user's own room ({@link userRoom}), where the progress of that user's imports arrives.
 */
export const LIVE_EVENTS = {
  /** browser → server: {@link JoinRequest}; ack {@link JoinReply}. */
  join: 'join',
  /** browser → server: {@link JoinRequest}; ack {@link LeaveReply}. */
  leave: 'leave',
  /** server → browser: {@link LiveReadingsEvent}, after each commit that stored readings in the run. */
  readings: 'readings',
  /** server → browser: {@link LiveExclusionEvent}, when a reading of the run is excluded. */
  excluded: 'excluded',
  /** server → browser: {@link LiveBridgeEvent}, when the run's first bridge attaches or its last one drops. */
  bridge: 'bridge',
  /** server → browser: {@link LiveCaptureEvent}, as a counter-assisted setting takes readings, settles or ends. */
  capture: 'capture',
  /** server → browser, to the importing user's room: {@link LiveImportProgressEvent}, as an import moves (a few times a second at most) and when it ends. */
  importProgress: 'import-progress',
} as const;

/** The socket.io room a run's live readings go to. */
export function runRoom(runId: number): string {
  return `run:${runId}`;
}

/** The socket.io room of one signed-in user (every `/live` socket of theirs joins it on connect). */
export function userRoom(userId: number): string {
  return `user:${userId}`;
}

/** Why the server refused something; the bridge stops on the permanent ones and retries `server_error`. */
export type IngestErrorCode =
  'bad_request' | 'batch_too_large' | 'not_attached' | 'run_not_found' | 'not_assigned' | 'run_closed' | 'job_locked' | 'forbidden' | 'server_error';

/** The answer to a refused request: nothing was written. */
export type Refusal = { ok: false; code: IngestErrorCode; error: string };

/** `connect_error` data when a handshake is refused. */
export type ConnectRefusal = { code: 'no_token' | 'bad_token' | 'bench_inactive' | 'bad_session' | 'server_error' };

export type AttachRequest = { runId: number };

/** What a bench needs to know about the run it attached to. */
export type AttachAck = {
  ok: true;
  runId: number;
  /** The run's highest stored sequence number (0 when empty): a new bridge numbers after it. */
  lastSeq: number;
  kind: RunKind;
  /** What the run's readings hold: a phase run takes `timeInterval` (s), every other run `frequency` (Hz). */
  dataKind: RunDataKind;
  /** When the run started (ISO 8601); a reading's `t` is seconds since then. */
  startedAt: string;
  benchId: number;
  benchName: string;
  range: RangeSpan;
};
export type AttachReply = AttachAck | Refusal;

/**
 * One batch: at most {@link MAX_INGEST_BATCH} readings, each with its own `seq`. A reading whose
 * frequency lies outside the run's range span by more than `SPAN_MARGIN` of it (common/units
 * `spanLimits`) is rejected with a reason in the acknowledgement, like any other bad reading: a bench
 * has no one to confirm it (`confirmed` is ignored here), so a reading that is right though outside the
 * span is entered on the run's page instead, where a person confirms it.
 */
export type IngestBatch = { runId: number; readings: ReadingInput[] };

/**
 * The acknowledgement of a stored batch: accepted, duplicates (this very reading was stored before
 * under that seq: a resend), and every refused reading with its reason. `duplicateSeqs` lists the
 * duplicates; `conflictSeqs` lists seqs already holding a different reading (another bridge on the
 * run got there first): those readings were not stored, and the sender numbers them afresh.
 */
export type IngestBatchAck = IngestAck & { ok: true; runId: number; duplicateSeqs: number[]; conflictSeqs: number[] };
export type IngestBatchReply = IngestBatchAck | Refusal;

export type RefusedEvent = { request: 'attach' | 'readings'; runId: number | null; code: IngestErrorCode; reason: string };

export type JoinRequest = { runId: number };
export type JoinAck = { ok: true; runId: number; lastSeq: number };
export type JoinReply = JoinAck | Refusal;
export type LeaveReply = { ok: true; runId: number } | Refusal;

/** A reading just excluded (with its reason): the page marks it and refits without it. */
export type LiveExclusionEvent = { runId: number; reading: Reading };

/** A bridge for the run came online (since = when it attached) or went offline (since = when it dropped). */
export type LiveBridgeEvent = { runId: number; connected: boolean; since: string };

/** The latest bridge change a page heard for the run it shows (a {@link LiveBridgeEvent} without its run). */
export type RunBridgeChange = Omit<LiveBridgeEvent, 'runId'>;

/** A counter-assisted setting's progress or end (types/captures.ts); `sentAt` is the server's time of sending. */
export type LiveCaptureEvent = { runId: number; capture: CounterCapture; sentAt: string };

/**
 * An import's progress as the server has it now (the whole state, so a page that missed some events is up to
 * date with the next one); GET /api/imports/:importId/progress answers the same after a reload.
 */
export type LiveImportProgressEvent = ImportProgress;

export { liveReadings, toLiveReadingsEvent, type LiveReadingsEvent, type StoredReadingView } from './live-readings.js';
