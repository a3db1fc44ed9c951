import { navigateTo } from './navigator';
import { notify } from './notifications';
import { clearSession, getSession } from './session';

export const API_BASE = '/api';
export const SIGN_IN_PATH = '/sign-in';

type QueryValue = string | number | boolean | null | undefined;

export type RequestOptions = {
  params?: Record<string, QueryValue>;
  /** Show failures in the snackbar (default true); turn off where the caller shows them itself. */
  notify?: boolean;
  /** Treat 401 as an expired session (default true); off for the sign-in call itself. */
  handleUnauthorized?: boolean;
  signal?: AbortSignal;
};

/** A failed API call, with the server's message made readable. */
export class ApiError extends Error {
  readonly status: number;
  /** Every message the server gave (Nest's validation pipe sends one per field). */
  readonly messages: string[];
  /** Nest's `error` (e.g. "Bad Request"), when present. */
  readonly error: string | undefined;

  constructor(status: number, messages: string[], error?: string) {
    super(messages.join('; '));
    this.name = 'ApiError';
    this.status = status;
    this.messages = messages;
    this.error = error;
  }
}

const FALLBACK_MESSAGES: Record<number, string> = {
  0: 'The server could not be reached. Check the connection and try again.',
  400: 'The request was not accepted.',
  401: 'Your session has ended. Please sign in again.',
  403: 'You are not allowed to do this.',
  404: 'Not found.',
  409: 'This conflicts with an existing record.',
  429: 'Too many attempts. Wait a minute and try again.',
};

function fallbackMessage(status: number) {
  if (FALLBACK_MESSAGES[status]) return FALLBACK_MESSAGES[status];
  if (status >= 500) return `The server had a problem (${status}). Try again shortly.`;
  return `The request failed (${status}).`;
}

/** Turns a Nest error body `{statusCode, message, error}` (message a string or a list) into an ApiError. */
export function toApiError(status: number, body: unknown): ApiError {
  let messages: string[] = [];
  let error: string | undefined;
  if (typeof body === 'object' && body !== null) {
    const record = body as Record<string, unknown>;
    const { message } = record;
    if (typeof message === 'string' && message.trim()) messages = [message.trim()];
    else if (Array.isArray(message)) messages = message.filter((m): m is string => typeof m === 'string' && m.trim() !== '').map((m) => m.trim());
    if (typeof record.error === 'string') error = record.error;
  } else if (typeof body === 'string' && body.trim() && body.length < 300 && !body.trimStart().startsWith('<')) {
    messages = [body.trim()];
  }
  if (messages.length === 0) messages = [error && error !== 'Error' ? error : fallbackMessage(status)];
  return new ApiError(status, messages, error);
}

/** `/api/certificates/1/pdf` (as the API hands out) or `/certificates/1/pdf` (relative to the API). */
export function apiUrl(path: string): string {
  if (path.startsWith(`${API_BASE}/`)) return path;
  return `${API_BASE}${path.startsWith('/') ? path : `/${path}`}`;
}

function buildUrl(path: string, params?: Record<string, QueryValue>) {
  const url = apiUrl(path);
  if (!params) return url;
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) {
    if (value === undefined || value === null || value === '') continue;
    search.set(key, String(value));
  }
  const query = search.toString();
  return query ? `${url}?${query}` : url;
}

function authHeaders(): Record<string, string> {
  const token = getSession()?.accessToken;
  return token ? { Authorization: `Bearer ${token}` } : {};
}

/** A response body as the server meant it: JSON when it says so (and parses), otherwise the text. */
function parseBody(text: string, contentType: string): unknown {
  if (!text) return undefined;
  if (contentType.includes('json')) {
    try {
      return JSON.parse(text) as unknown;
    } catch {
      return text;
    }
  }
  return text;
}

async function readBody(response: Response): Promise<unknown> {
  if (response.status === 204) return undefined;
  return parseBody(await response.text(), response.headers.get('content-type') ?? '');
}

function redirectToSignIn() {
  const { pathname, search, hash } = window.location;
  if (pathname === SIGN_IN_PATH) return;
  const next = `${pathname}${search}${hash}`;
  navigateTo(`${SIGN_IN_PATH}?next=${encodeURIComponent(next)}`, { replace: true });
}

/** An expired or revoked session: forget it and go to sign-in with the current page as `next`. */
function endSession(warn: boolean) {
  clearSession();
  redirectToSignIn();
  if (warn) notify('warning', FALLBACK_MESSAGES[401]);
}

type FailureHandling = { notify: boolean; handleUnauthorized: boolean; warnSessionEnded: boolean };

/** What every refused call does, JSON or file: a 401 ends the session, other refusals go to the snackbar when asked. */
function refused(status: number, body: unknown, handling: FailureHandling): ApiError {
  const error = toApiError(status, body);
  if (status === 401 && handling.handleUnauthorized) endSession(handling.warnSessionEnded);
  else if (handling.notify) notify('error', error.message);
  return error;
}

/** fetch, with an unreachable server turned into an ApiError of status 0 (an abort stays an AbortError). */
async function send(url: string, init: RequestInit, shouldNotify: boolean): Promise<Response> {
  try {
    return await fetch(url, init);
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    const error = toApiError(0, undefined);
    if (shouldNotify) notify('error', error.message);
    throw error;
  }
}

async function request<T>(method: string, path: string, body: unknown, options: RequestOptions = {}): Promise<T> {
  // A 401 from the sign-in call means wrong credentials, not an expired session.
  const { params, signal, notify: shouldNotify = true, handleUnauthorized = path !== '/auth/login' } = options;
  const headers: Record<string, string> = { Accept: 'application/json', ...authHeaders() };
  if (body !== undefined) headers['Content-Type'] = 'application/json';

  const response = await send(buildUrl(path, params), { method, headers, body: body === undefined ? undefined : JSON.stringify(body), signal }, shouldNotify);
  const data = await readBody(response);
  if (response.ok) return data as T;
  throw refused(response.status, data, { notify: shouldNotify, handleUnauthorized, warnSessionEnded: shouldNotify });
}

// Files: downloads come back as blobs, uploads go as bytes or multipart with progress. They carry the bearer
// token (every file URL of the API is behind the session) and end an expired session like any other call;
// their callers show refusals themselves, so nothing goes to the snackbar but the session-ended warning.
const FILE_FAILURES = { notify: false, warnSessionEnded: true } as const;

/** The file name a `Content-Disposition` header offers, if any. */
export function filenameFromDisposition(header: string | null): string | null {
  if (!header) return null;
  const encoded = /filename\*\s*=\s*(?:UTF-8'')?([^;]+)/i.exec(header);
  if (encoded?.[1]) {
    try {
      return decodeURIComponent(encoded[1].trim().replace(/^"|"$/g, ''));
    } catch {
      // fall through to the plain form
    }
  }
  const plain = /filename\s*=\s*"?([^";]+)"?/i.exec(header);
  return plain?.[1]?.trim() || null;
}

export type FetchedFile = { blob: Blob; filename: string | null; contentType: string };

/** GETs a file of the API with the session's token; throws an ApiError (and ends an expired session) on failure. */
export async function fetchFile(path: string, { signal }: { signal?: AbortSignal } = {}): Promise<FetchedFile> {
  const response = await send(apiUrl(path), { headers: authHeaders(), signal }, false);
  if (!response.ok) throw refused(response.status, await readBody(response), { ...FILE_FAILURES, handleUnauthorized: true });
  const blob = await response.blob();
  return {
    blob,
    filename: filenameFromDisposition(response.headers.get('content-disposition')),
    contentType: response.headers.get('content-type') ?? blob.type,
  };
}

/**
 * POSTs a file as the raw request body (its own type, or application/octet-stream) and returns the JSON
 * answer; throws an ApiError with the server's message otherwise.
 */
export async function postFile<T>(path: string, file: Blob, { authenticated = true }: { authenticated?: boolean } = {}): Promise<T> {
  const headers = { Accept: 'application/json', 'Content-Type': file.type || 'application/octet-stream', ...(authenticated ? authHeaders() : {}) };
  const response = await send(apiUrl(path), { method: 'POST', headers, body: file }, false);
  const data = await readBody(response);
  if (response.ok) return data as T;
  throw refused(response.status, data, { ...FILE_FAILURES, handleUnauthorized: authenticated });
}

export type UploadProgress = { loaded: number; total: number | null };

export type UploadResult = { status: number; ok: boolean; data: unknown };

export type UploadOptions = {
  method?: 'POST' | 'PUT';
  path: string;
  body: FormData | Blob;
  headers?: Record<string, string>;
  /** Called as the request body goes out (bytes sent so far). */
  onUploadProgress?: (progress: UploadProgress) => void;
  signal?: AbortSignal;
  /** Attach the session's token (default true); off for the public pages. */
  authenticated?: boolean;
};

/**
 * Sends a file with XMLHttpRequest, whose upload events give a real byte count (fetch has none). Resolves
 * with the status and parsed body whatever the status, so a caller can read a refusal's report (a 401 still
 * ends the session); rejects only when the server cannot be reached, with an ApiError of status 0, or when
 * aborted.
 */
export function uploadWithProgress({
  method = 'POST',
  path,
  body,
  headers = {},
  onUploadProgress,
  signal,
  authenticated = true,
}: UploadOptions): Promise<UploadResult> {
  return new Promise<UploadResult>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open(method, apiUrl(path));
    xhr.setRequestHeader('Accept', 'application/json');
    for (const [name, value] of Object.entries({ ...(authenticated ? authHeaders() : {}), ...headers })) {
      xhr.setRequestHeader(name, value);
    }
    if (onUploadProgress) {
      xhr.upload.onprogress = (event) => onUploadProgress({ loaded: event.loaded, total: event.lengthComputable ? event.total : null });
    }
    xhr.onload = () => {
      const data = parseBody(xhr.responseText, xhr.getResponseHeader('content-type') ?? '');
      const ok = xhr.status >= 200 && xhr.status < 300;
      if (xhr.status === 401) refused(xhr.status, data, { ...FILE_FAILURES, handleUnauthorized: authenticated });
      resolve({ status: xhr.status, ok, data });
    };
    xhr.onerror = () => reject(toApiError(0, undefined));
    xhr.onabort = () => reject(new DOMException('The upload was cancelled', 'AbortError'));
    if (signal) {
      if (signal.aborted) {
        xhr.abort();
        return;
      }
      signal.addEventListener('abort', () => xhr.abort(), { once: true });
    }
    xhr.send(body);
  });
}

export const api = {
  get: <T>(path: string, options?: RequestOptions) => request<T>('GET', path, undefined, options),
  post: <T>(path: string, body?: unknown, options?: RequestOptions) => request<T>('POST', path, body, options),
  patch: <T>(path: string, body?: unknown, options?: RequestOptions) => request<T>('PATCH', path, body, options),
  put: <T>(path: string, body?: unknown, options?: RequestOptions) => request<T>('PUT', path, body, options),
  delete: <T>(path: string, options?: RequestOptions) => request<T>('DELETE', path, undefined, options),
};
