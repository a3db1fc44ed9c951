import { isUtf8 } from 'node:buffer';
import type { IncomingMessage, ServerResponse } from 'node:http';

/** Deepest nesting of arrays and objects a JSON body may have; no request of ours needs more than a few levels. */
export const MAX_JSON_DEPTH = 32;

/** Largest JSON or form body (a batch of readings is the largest we take, well under this). */
export const MAX_JSON_BODY = '1mb';

/** A refusal body-parser passes on with its own status (it keeps `status` from the error thrown in `verify`). */
class BodyRefused extends Error {
  readonly status = 400;
  readonly statusCode = 400;
  readonly expose = true;
}

/**
 * How deep arrays and objects nest in a JSON text, counted on the raw bytes (brackets inside strings
 * skipped), stopping as soon as `limit` is passed: the parsed object is never walked, so no recursion.
 */
export function jsonDepthExceeds(buf: Buffer, limit: number): boolean {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < buf.length; i++) {
    const c = buf[i];
    if (inString) {
      if (c === 0x5c)
        i++; // backslash: skip the escaped character
      else if (c === 0x22) inString = false;
    } else if (c === 0x22) inString = true;
    else if (c === 0x5b || c === 0x7b) {
      if (++depth > limit) return true;
    } else if (c === 0x5d || c === 0x7d) depth--;
  }
  return false;
}

/**
 * body-parser's `verify` for JSON: refuses bytes that are not UTF-8 (rather than storing U+FFFD) and
 * nesting deeper than MAX_JSON_DEPTH (class-transformer recurses on it and overflows the stack).
 */
export function verifyJsonBody(req: IncomingMessage & { rawBody?: Buffer }, _res: ServerResponse, buf: Buffer): void {
  if (!isUtf8(buf)) throw new BodyRefused('the JSON body is not valid UTF-8 text');
  if (jsonDepthExceeds(buf, MAX_JSON_DEPTH)) throw new BodyRefused(`the JSON body is nested deeper than ${MAX_JSON_DEPTH} levels`);
  // The payment service signs the exact bytes it sent: its webhook route checks the signature on these.
  if (req.url?.startsWith(WEBHOOK_PATH)) req.rawBody = buf;
}

/** The one route that needs a JSON body's raw bytes (Nest's RawBodyRequest.rawBody). */
const WEBHOOK_PATH = '/api/payments/webhook';

/** body-parser's `verify` for urlencoded forms: UTF-8 only (qs limits the depth itself). */
export function verifyFormBody(_req: IncomingMessage, _res: ServerResponse, buf: Buffer): void {
  if (!isUtf8(buf)) throw new BodyRefused('the form body is not valid UTF-8 text');
}
