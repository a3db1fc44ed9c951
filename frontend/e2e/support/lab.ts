import type { Page } from 'playwright-core';
import { BASE_URL } from './browser';

/** The signed-in page's session token, to set up or check data through the same API the page uses. */
export async function sessionToken(page: Page): Promise<string> {
  const raw = await page.evaluate(() => window.localStorage.getItem('kc.session'));
  if (!raw) throw new Error('no session in the page: sign in first');
  return (JSON.parse(raw) as { accessToken: string }).accessToken;
}

export async function apiRequest<T>(token: string, method: string, path: string, body?: unknown): Promise<T> {
  const response = await fetch(`${BASE_URL}/api${path}`, {
    method,
    headers: { ...(token ? { Authorization: `Bearer ${token}` } : {}), Accept: 'application/json', ...(body === undefined ? {} : { 'Content-Type': 'application/json' }) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const text = await response.text();
  if (!response.ok) throw new Error(`${method} ${path} answered ${response.status}: ${text}`);
  return (text ? JSON.parse(text) : undefined) as T;
}

export const apiGet = <T>(token: string, path: string) => apiRequest<T>(token, 'GET', path);

/** Signs in through the API (for set-up the test does as another person than the page's). */
export async function apiLogin(email: string, password: string): Promise<string> {
  const answer = await apiRequest<{ accessToken: string }>('', 'POST', '/auth/login', { email, password });
  return answer.accessToken;
}
