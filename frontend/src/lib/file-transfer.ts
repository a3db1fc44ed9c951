import { API_BASE, SIGN_IN_PATH, toApiError } from './api-client';
import { navigateTo } from './navigator';
import { notify } from './notifications';
import { clearSession, getSession } from './session';

// Files travel outside the JSON client: downloads come back as blobs, uploads go as bytes or multipart with
// progress. Both carry the bearer token, because every file URL of the API is behind the session.

/** `/api/certificates/1/pdf` (as the API hands out) or `/certificates/1/pdf` (relative to the API). */
export function apiUrl(path: string): string {
  if (path.startsWith(`${API_BASE}/`)) return path;
  return `${API_BASE}${path.startsWith('/') ? path : `/${path}`}`;
}

function authHeaders(): Record<string, string> {
  const token = getSession()?.accessToken;
  return token ? { Authorization: `Bearer ${token}` } : {};
}

function sessionEnded() {
  clearSession();
  const { pathname, search } = window.location;
  if (pathname !== SIGN_IN_PATH) {
    navigateTo(`${SIGN_IN_PATH}?next=${encodeURIComponent(`${pathname}${search}`)}`, { replace: true });
  }
  notify('warning', 'Your session has ended. Please sign in again.');
}

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
  let response: Response;
  try {
    response = await fetch(apiUrl(path), { headers: authHeaders(), signal });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw toApiError(0, undefined);
  }
  if (!response.ok) {
    const contentType = response.headers.get('content-type') ?? '';
    const body = parseBody(await response.text(), contentType);
    if (response.status === 401) sessionEnded();
    throw toApiError(response.status, body);
  }
  const blob = await response.blob();
  return {
    blob,
    filename: filenameFromDisposition(response.headers.get('content-disposition')),
    contentType: response.headers.get('content-type') ?? blob.type,
  };
}

/** Hands a blob to the browser as a download. */
export function saveBlob(blob: Blob, filename: string): void {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = filename;
  link.rel = 'noopener';
  link.style.display = 'none';
  document.body.appendChild(link);
  link.click();
  link.remove();
  // The download has started from the click; the URL can go once the browser has picked it up.
  window.setTimeout(() => URL.revokeObjectURL(url), 30_000);
}

/** Fetches a file with the token and saves it under the server's name (or the fallback). */
export async function downloadFile(path: string, fallbackName: string): Promise<void> {
  const file = await fetchFile(path);
  saveBlob(file.blob, file.filename ?? fallbackName);
}

/** Text as a file download (CSV reports, exported tables). */
export function saveText(text: string, filename: string, type = 'text/csv;charset=utf-8'): void {
  saveBlob(new Blob([text], { type }), filename);
}

/**
 * POSTs a file as the raw request body (its own type, or application/octet-stream) and returns the JSON
 * answer; throws an ApiError with the server's message otherwise.
 */
export async function postFile<T>(path: string, file: Blob, { authenticated = true }: { authenticated?: boolean } = {}): Promise<T> {
  let response: Response;
  try {
    response = await fetch(apiUrl(path), {
      method: 'POST',
      headers: {
        Accept: 'application/json',
        'Content-Type': file.type || 'application/octet-stream',
        ...(authenticated ? authHeaders() : {}),
      },
      body: file,
    });
  } catch {
    throw toApiError(0, undefined);
  }
  const body = parseBody(await response.text(), response.headers.get('content-type') ?? '');
  if (response.ok) return body as T;
  if (response.status === 401 && authenticated) sessionEnded();
  throw toApiError(response.status, body);
}

export type UploadProgress = { loaded: number; total: number | null };

export type UploadResult = { status: number; ok: boolean; data: unknown };

type UploadOptions = {
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
 * with the status and parsed body whatever the status, so a caller can read a refusal's report; rejects
 * only when the server cannot be reached, with an ApiError of status 0, or when aborted.
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
      if (xhr.status === 401 && authenticated) sessionEnded();
      resolve({ status: xhr.status, ok: xhr.status >= 200 && xhr.status < 300, data });
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
