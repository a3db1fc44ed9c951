import { describe, expect, it, vi } from 'vitest';
import { getSession, setSession } from '@/lib/session';
import { setNavigator } from '@/lib/navigator';
import { getNotifications } from '@/lib/notifications';
import { createSessionUser } from '@/testing/data-generators';
import { mockFetch } from '@/testing/fetch-mock';
import { apiUrl, fetchFile, filenameFromDisposition } from '../api-client';

describe('filenameFromDisposition()', () => {
  it('reads the plain and the encoded forms, preferring the encoded one', () => {
    expect(filenameFromDisposition('attachment; filename="QL-2026-0001-rev1.pdf"')).toBe('QL-2026-0001-rev1.pdf');
    expect(filenameFromDisposition("attachment; filename=\"x.csv\"; filename*=UTF-8''Pr%C3%BCfung.csv")).toBe('Prüfung.csv');
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
