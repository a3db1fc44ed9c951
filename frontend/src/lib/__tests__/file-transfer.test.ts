import { describe, expect, it, vi } from 'vitest';
import { getSession, setSession } from '@/lib/session';
import { setNavigator } from '@/lib/navigator';
import { getNotifications } from '@/lib/notifications';
import { createSessionUser } from '@/testing/data-generators';
import { mockFetch } from '@/testing/fetch-mock';
import { apiUrl, fetchFile, filenameFromDisposition, uploadWithProgress, type UploadProgress } from '../api-client';

describe('filenameFromDisposition()', () => {
  it('reads the plain and the encoded forms, preferring the encoded one', () => {
    expect(filenameFromDisposition('attachment; filename="QL-2026-0001-rev1.pdf"')).toBe('QL-2026-0001-rev1.pdf');
    expect(filenameFromDisposition('attachment; filename="x.csv"; filename*=UTF-8\'\'Pr%C3%BCfung.csv')).toBe('Prüfung.csv');
    expect(filenameFromDisposition(null)).toBeNull();
  });
});

describe('apiUrl()', () => {
  it('takes the API’s own file paths as they come and prefixes the others', () => {
    expect(apiUrl('/api/certificates/1/pdf')).toBe('/api/certificates/1/pdf');
    expect(apiUrl('/runs/3/readings.csv')).toBe('/api/runs/3/readings.csv');
  });
});

describe('fetchFile()', () => {
  it('sends the session’s token and turns a refusal into the server’s message', async () => {
    setSession({ accessToken: 'file-token', user: createSessionUser() });
    const { requests } = mockFetch([{ path: '/api/certificates/9/pdf', status: 404, body: { statusCode: 404, message: 'Certificate 9 not found' } }]);
    await expect(fetchFile('/api/certificates/9/pdf')).rejects.toThrow('Certificate 9 not found');
    expect(requests[0]?.headers.get('Authorization')).toBe('Bearer file-token');
  });
});

describe('file requests and an ended session', () => {
  it('a download answered 401 ends the session like any API call: sign-in with next=, and the warning', async () => {
    window.history.replaceState(null, '', '/jobs/4?tab=certificate');
    setSession({ accessToken: 'expired', user: createSessionUser() });
    const navigate = vi.fn();
    setNavigator(navigate);
    mockFetch([{ path: '/api/certificates/4/pdf', status: 401, body: { statusCode: 401, message: 'Unauthorized' } }]);

    await expect(fetchFile('/certificates/4/pdf')).rejects.toMatchObject({ status: 401 });

    expect(getSession()).toBeNull();
    expect(navigate).toHaveBeenCalledWith('/sign-in?next=%2Fjobs%2F4%3Ftab%3Dcertificate', { replace: true });
    expect(getNotifications().map((n) => n.message)).toEqual(['Your session has ended. Please sign in again.']);
  });

  it('a refused download leaves the message to its caller (nothing in the snackbar)', async () => {
    setSession({ accessToken: 'ok', user: createSessionUser() });
    mockFetch([{ path: '/api/runs/3/readings.csv', status: 404, body: { statusCode: 404, message: 'Run 3 not found' } }]);
    await expect(fetchFile('/runs/3/readings.csv')).rejects.toThrow('Run 3 not found');
    expect(getNotifications()).toHaveLength(0);
    expect(getSession()).not.toBeNull();
  });
});

// A stand-in XMLHttpRequest: the test plays the browser's side (progress events, the answer, an abort).
class FakeXhr {
  static last: FakeXhr | null = null;
  readonly upload: { onprogress: ((event: { loaded: number; total: number; lengthComputable: boolean }) => void) | null } = { onprogress: null };
  readonly headers: Record<string, string> = {};
  method = '';
  url = '';
  status = 0;
  responseText = '';
  sent: unknown = null;
  onload: (() => void) | null = null;
  onerror: (() => void) | null = null;
  onabort: (() => void) | null = null;
  constructor() {
    FakeXhr.last = this;
  }
  open(method: string, url: string) {
    this.method = method;
    this.url = url;
  }
  setRequestHeader(name: string, value: string) {
    this.headers[name] = value;
  }
  getResponseHeader(name: string) {
    return name.toLowerCase() === 'content-type' ? 'application/json; charset=utf-8' : null;
  }
  send(body: unknown) {
    this.sent = body;
  }
  abort() {
    this.onabort?.();
  }
  answer(status: number, body: unknown) {
    this.status = status;
    this.responseText = JSON.stringify(body);
    this.onload?.();
  }
}

describe('uploadWithProgress()', () => {
  it('reports the bytes sent as they go, sends the token, and resolves with a refusal’s report to read', async () => {
    vi.stubGlobal('XMLHttpRequest', FakeXhr);
    setSession({ accessToken: 'upload-token', user: createSessionUser() });
    const progress: UploadProgress[] = [];
    const form = new FormData();
    const done = uploadWithProgress({ path: '/runs/5/imports?mode=all', body: form, onUploadProgress: (p) => progress.push(p) });
    const xhr = FakeXhr.last!;
    expect([xhr.method, xhr.url, xhr.headers.Authorization]).toEqual(['POST', '/api/runs/5/imports?mode=all', 'Bearer upload-token']);
    expect(xhr.sent).toBe(form);
    xhr.upload.onprogress!({ loaded: 512, total: 2048, lengthComputable: true });
    xhr.upload.onprogress!({ loaded: 2048, total: 0, lengthComputable: false });
    xhr.answer(400, { statusCode: 400, message: '2 rows refused', rejected: [] });
    expect(await done).toEqual({ status: 400, ok: false, data: { statusCode: 400, message: '2 rows refused', rejected: [] } });
    expect(progress).toEqual([
      { loaded: 512, total: 2048 },
      { loaded: 2048, total: null },
    ]);
    expect(getSession()).not.toBeNull();
  });

  it('rejects with an AbortError when the caller cancels', async () => {
    vi.stubGlobal('XMLHttpRequest', FakeXhr);
    const controller = new AbortController();
    const done = uploadWithProgress({ path: '/attachments', body: new Blob(['x']), signal: controller.signal });
    controller.abort();
    await expect(done).rejects.toMatchObject({ name: 'AbortError' });
  });

  it('ends an expired session on 401 (sign-in with next=) and still hands back the answer', async () => {
    vi.stubGlobal('XMLHttpRequest', FakeXhr);
    window.history.replaceState(null, '', '/runs/5');
    setSession({ accessToken: 'expired', user: createSessionUser() });
    const navigate = vi.fn();
    setNavigator(navigate);
    const done = uploadWithProgress({ path: '/runs/5/imports', body: new FormData() });
    FakeXhr.last!.answer(401, { statusCode: 401, message: 'Unauthorized' });
    expect((await done).status).toBe(401);
    expect(getSession()).toBeNull();
    expect(navigate).toHaveBeenCalledWith('/sign-in?next=%2Fruns%2F5', { replace: true });
  });
});
