import { describe, expect, it, vi } from 'vitest';
import { mockFetch } from '@/testing/fetch-mock';
import { createSessionUser } from '@/testing/data-generators';
import { api, ApiError, toApiError } from '../api-client';
import { setNavigator } from '../navigator';
import { getNotifications } from '../notifications';
import { getSession, SESSION_STORAGE_KEY, setSession } from '../session';

describe('toApiError()', () => {
  it('joins the list of messages that Nest validation sends', () => {
    const error = toApiError(400, {
      statusCode: 400,
      message: ['email must be an email', 'property nickname should not exist'],
      error: 'Bad Request',
    });
    expect(error).toBeInstanceOf(ApiError);
    expect(error.status).toBe(400);
    expect(error.messages).toEqual(['email must be an email', 'property nickname should not exist']);
    expect(error.message).toBe('email must be an email; property nickname should not exist');
    expect(error.error).toBe('Bad Request');
  });

  it('keeps a single string message as it is', () => {
    const error = toApiError(409, { statusCode: 409, message: 'A user with this e-mail already exists', error: 'Conflict' });
    expect(error.message).toBe('A user with this e-mail already exists');
  });

  it('falls back to a plain sentence when the body has no message', () => {
    expect(toApiError(503, undefined).message).toBe('The server had a problem (503). Try again shortly.');
    expect(toApiError(403, { statusCode: 403 }).message).toBe('You are not allowed to do this.');
    expect(toApiError(502, '<html>Bad gateway</html>').message).toBe('The server had a problem (502). Try again shortly.');
  });
});

describe('api', () => {
  it('sends the stored token and the query parameters, leaving out empty ones', async () => {
    setSession({ accessToken: 'abc.def', user: createSessionUser({ role: 'admin' }) });
    const { requests } = mockFetch([{ path: '/api/users', body: { items: [], total: 0 } }]);

    const result = await api.get('/users', { params: { page: 2, pageSize: 25, q: '', role: undefined, active: false } });

    expect(result).toEqual({ items: [], total: 0 });
    expect(requests).toHaveLength(1);
    expect(requests[0].url).toBe('/api/users?page=2&pageSize=25&active=false');
    expect(requests[0].headers.get('Authorization')).toBe('Bearer abc.def');
  });

  it('rejects with a readable ApiError and shows it in the snackbar', async () => {
    setSession({ accessToken: 't', user: createSessionUser({ role: 'admin' }) });
    mockFetch([
      {
        method: 'POST',
        path: '/api/users',
        status: 400,
        body: { statusCode: 400, message: ['password must be longer than or equal to 12 characters'], error: 'Bad Request' },
      },
    ]);

    const failure = api.post('/users', { email: 'a@b.test' });
    await expect(failure).rejects.toMatchObject({
      name: 'ApiError',
      status: 400,
      message: 'password must be longer than or equal to 12 characters',
    });
    expect(getNotifications().map((n) => n.message)).toEqual(['password must be longer than or equal to 12 characters']);
    expect(getSession()).not.toBeNull();
  });

  it('does not show the snackbar when the caller opts out', async () => {
    mockFetch([{ method: 'POST', path: '/api/organizations', status: 409, body: { statusCode: 409, message: 'Name taken' } }]);
    await expect(api.post('/organizations', {}, { notify: false })).rejects.toBeInstanceOf(ApiError);
    expect(getNotifications()).toHaveLength(0);
  });

  it('on 401 clears the session and sends the user to sign-in with the current path as next', async () => {
    window.history.replaceState(null, '', '/admin/users?page=3');
    setSession({ accessToken: 'expired', user: createSessionUser({ role: 'admin' }) });
    const navigate = vi.fn();
    setNavigator(navigate);
    mockFetch([{ path: '/api/users', status: 401, body: { statusCode: 401, message: 'Unauthorized' } }]);

    await expect(api.get('/users')).rejects.toMatchObject({ status: 401 });

    expect(window.localStorage.getItem(SESSION_STORAGE_KEY)).toBeNull();
    expect(getSession()).toBeNull();
    expect(navigate).toHaveBeenCalledWith('/sign-in?next=%2Fadmin%2Fusers%3Fpage%3D3', { replace: true });
  });

  it('leaves the session alone when the sign-in call itself answers 401', async () => {
    window.history.replaceState(null, '', '/sign-in');
    const previous = { accessToken: 'still-good', user: createSessionUser() };
    setSession(previous);
    const navigate = vi.fn();
    setNavigator(navigate);
    mockFetch([{ method: 'POST', path: '/api/auth/login', status: 401, body: { statusCode: 401, message: 'Invalid e-mail or password' } }]);

    await expect(api.post('/auth/login', { email: 'x@y.test', password: 'wrong' })).rejects.toMatchObject({
      status: 401,
      message: 'Invalid e-mail or password',
    });
    expect(getSession()).toEqual(previous);
    expect(navigate).not.toHaveBeenCalled();
  });

  it('reports an unreachable server as status 0 with a plain message', async () => {
    vi.stubGlobal('fetch', vi.fn().mockRejectedValue(new TypeError('Failed to fetch')));
    await expect(api.get('/health')).rejects.toMatchObject({
      status: 0,
      message: 'The server could not be reached. Check the connection and try again.',
    });
  });
});
