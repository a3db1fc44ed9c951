import type { IngestErrorCode, Refusal } from '@kilocycle/common/events';

/** A refused socket request (the ingest and live gateways share it); the gateways turn it into a {@link Refusal} acknowledgement. */
export class IngestException extends Error {
  constructor(
    readonly code: IngestErrorCode,
    message: string,
  ) {
    super(message);
    this.name = 'IngestException';
  }
}

/**
 * Any error as the refusal a client receives; unexpected errors become `server_error` (try again) with a
 * plain sentence: their detail (a database address, SQL) stays in the server's log, see {@link errorDetail}.
 */
export function toRefusal(error: unknown): Refusal {
  if (error instanceof IngestException) return { ok: false, code: error.code, error: error.message };
  return { ok: false, code: 'server_error', error: 'the server could not handle this just now; nothing was stored, send it again' };
}

/** What went wrong, for the server's log only. */
export function errorDetail(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

/** Reads a socket payload: an object, or the same object as JSON text (some bench scripts send strings). */
export function payloadObject(payload: unknown, example: string): Record<string, unknown> {
  let value = payload;
  if (typeof value === 'string') {
    try {
      value = JSON.parse(value) as unknown;
    } catch (error) {
      throw new IngestException('bad_request', `the payload is not valid JSON (${error instanceof Error ? error.message : String(error)}); send ${example}`);
    }
  }
  if (value === null || typeof value !== 'object' || Array.isArray(value)) {
    throw new IngestException('bad_request', `the payload must be an object: ${example}`);
  }
  return value as Record<string, unknown>;
}

/** A run id from a payload, or a bad_request naming the field. */
export function runIdOf(body: Record<string, unknown>): number {
  const runId = body.runId;
  if (typeof runId !== 'number' || !Number.isInteger(runId) || runId < 1 || runId > 2_147_483_647) {
    throw new IngestException('bad_request', 'runId must be a whole number (the id of a run)');
  }
  return runId;
}
