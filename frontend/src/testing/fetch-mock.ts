import { vi } from 'vitest';

export type MockRoute = {
  method?: string;
  /** Matched against the path without the query string, e.g. `/api/auth/login`. */
  path: string;
  status?: number;
  body?: unknown;
};

export type RecordedRequest = { method: string; url: string; headers: Headers; body: unknown };

/**
 * Replaces `fetch` with canned answers. A request no route matches fails the test loudly, as an
 * unhandled request should.
 */
export function mockFetch(routes: MockRoute[]) {
  const requests: RecordedRequest[] = [];
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = typeof input === 'string' ? input : input instanceof URL ? input.href : input.url;
    const method = (init?.method ?? 'GET').toUpperCase();
    const pathname = new URL(url, 'http://localhost').pathname;
    const body = typeof init?.body === 'string' ? (JSON.parse(init.body) as unknown) : undefined;
    requests.push({ method, url, headers: new Headers(init?.headers), body });
    const route = routes.find((r) => (r.method ?? 'GET').toUpperCase() === method && r.path === pathname);
    if (!route) throw new Error(`Unhandled request in test: ${method} ${url}`);
    const status = route.status ?? 200;
    return new Response(route.body === undefined ? null : JSON.stringify(route.body), {
      status,
      headers: { 'Content-Type': 'application/json; charset=utf-8' },
    });
  });
  vi.stubGlobal('fetch', fetchMock);
  return { fetchMock, requests };
}
