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
    else if (Array.isArray(message))
      messages = message.filter((m): m is string => typeof m === 'string' && m.trim() !== '').map((m) => m.trim());
    if (typeof record.error === 'string') error = record.error;
  } else if (typeof body === 'string' && body.trim() && body.length < 300 && !body.trimStart().startsWith('<')) {
    messages = [body.trim()];
  }
  if (messages.length === 0) messages = [error && error !== 'Error' ? error : fallbackMessage(status)];
  return new ApiError(status, messages, error);
}

function buildUrl(path: string, params?: Record<string, QueryValue>) {
  const url = `${API_BASE}${path.startsWith('/') ? path : `/${path}`}`;
  if (!params) return url;
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) {
    if (value === undefined || value === null || value === '') continue;
    search.set(key, String(value));
  }
  const query = search.toString();
  return query ? `${url}?${query}` : url;
}

async function readBody(response: Response): Promise<unknown> {
  if (response.status === 204) return undefined;
  const text = await response.text();
  if (!text) return undefined;
  const type = response.headers.get('content-type') ?? '';
  if (type.includes('json')) {
    try {
      return JSON.parse(text);
    } catch {
      return text;
    }
  }
  return text;
}

function redirectToSignIn() {
  const { pathname, search, hash } = window.location;
  if (pathname === SIGN_IN_PATH) return;
  const next = `${pathname}${search}${hash}`;
  navigateTo(`${SIGN_IN_PATH}?next=${encodeURIComponent(next)}`, { replace: true });
}

async function request<T>(method: string, path: string, body: unknown, options: RequestOptions = {}): Promise<T> {
  // A 401 from the sign-in call means wrong credentials, not an expired session.
  const { params, signal, notify: shouldNotify = true, handleUnauthorized = path !== '/auth/login' } = options;
  const headers: Record<string, string> = { Accept: 'application/json' };
  const token = getSession()?.accessToken;
  if (token) headers.Authorization = `Bearer ${token}`;
  if (body !== undefined) headers['Content-Type'] = 'application/json';

  let response: Response;
  try {
    response = await fetch(buildUrl(path, params), {
      method,
      headers,
      body: body === undefined ? undefined : JSON.stringify(body),
      signal,
    });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    const error = toApiError(0, undefined);
    if (shouldNotify) notify('error', error.message);
    throw error;
  }

  const data = await readBody(response);
  if (response.ok) return data as T;

  const error = toApiError(response.status, data);
  if (response.status === 401 && handleUnauthorized) {
    clearSession();
    redirectToSignIn();
    if (shouldNotify) notify('warning', FALLBACK_MESSAGES[401]);
  } else if (shouldNotify) {
    notify('error', error.message);
  }
  throw error;
}

export const api = {
  get: <T>(path: string, options?: RequestOptions) => request<T>('GET', path, undefined, options),
  post: <T>(path: string, body?: unknown, options?: RequestOptions) => request<T>('POST', path, body, options),
  patch: <T>(path: string, body?: unknown, options?: RequestOptions) => request<T>('PATCH', path, body, options),
  put: <T>(path: string, body?: unknown, options?: RequestOptions) => request<T>('PUT', path, body, options),
  delete: <T>(path: string, options?: RequestOptions) => request<T>('DELETE', path, undefined, options),
};
