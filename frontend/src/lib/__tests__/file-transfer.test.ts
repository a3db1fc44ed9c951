import { describe, expect, it } from 'vitest';
import { setSession } from '@/lib/session';
import { createSessionUser } from '@/testing/data-generators';
import { mockFetch } from '@/testing/fetch-mock';
import { apiUrl, fetchFile, filenameFromDisposition } from '../file-transfer';

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
