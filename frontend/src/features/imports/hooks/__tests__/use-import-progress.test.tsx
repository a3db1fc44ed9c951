import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import { act, renderHook, waitFor } from '@testing-library/react';
import type { ReactNode } from 'react';
import { LIVE_EVENTS, NAMESPACES, type LiveImportProgressEvent } from '@kilocycle/common/events';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { createQueryClient } from '@/lib/react-query';
import { clearSession } from '@/lib/session';
import { mockFetch } from '@/testing/fetch-mock';
import { signInAs } from '@/testing/test-utils';
import { useImportProgress } from '../use-import-progress';

// A stand-in socket: the test fires the events socket.io-client would.
const handlers = new Map<string, (...args: unknown[]) => unknown>();
const opened: Array<{ url: string; disconnect: ReturnType<typeof vi.fn> }> = [];
vi.mock('socket.io-client', () => ({
  io: (url: string) => {
    const socket = { url, on: (event: string, handler: (...args: unknown[]) => unknown) => handlers.set(event, handler), disconnect: vi.fn() };
    opened.push(socket);
    return socket;
  },
}));

const progress = (patch: Partial<LiveImportProgressEvent>): LiveImportProgressEvent => ({
  importId: 'upload-0001',
  runId: 3,
  phase: 'writing',
  bytesTotal: 1000,
  bytesDone: 400,
  rowsDone: 4000,
  rowsRejected: 0,
  imported: 4000,
  fraction: 0.58,
  message: null,
  updatedAt: '2026-03-01T09:00:01.000Z',
  ...patch,
});

function setup(client: QueryClient) {
  return ({ children }: { children: ReactNode }) => <QueryClientProvider client={client}>{children}</QueryClientProvider>;
}

describe('useImportProgress()', () => {
  afterEach(() => {
    handlers.clear();
    opened.length = 0;
    clearSession();
    vi.useRealTimers();
  });

  it('should take each progress event of its import from the live socket into the query, without polling', async () => {
    signInAs({ role: 'technician' });
    const { fetchMock } = mockFetch([{ path: '/api/imports/upload-0001/progress', status: 404, body: { statusCode: 404, message: 'no import upload-0001' } }]);
    const client = createQueryClient();
    const { result } = renderHook(() => useImportProgress('upload-0001', true), { wrapper: setup(client) });
    expect(opened.map((s) => s.url)).toEqual([NAMESPACES.live]);
    // Connected before the upload reached the server: one look, which finds nothing yet.
    act(() => void handlers.get('connect')!());
    await waitFor(() => expect(fetchMock).toHaveBeenCalledTimes(1));

    await act(async () => {
      await handlers.get(LIVE_EVENTS.importProgress)!(progress({ phase: 'validating', fraction: 0.2, updatedAt: '2026-03-01T09:00:00.500Z' }));
    });
    await waitFor(() => expect(result.current.data).toMatchObject({ phase: 'validating', fraction: 0.2 }));
    // Another import of the same user (another tab) is not this one.
    await act(async () => {
      await handlers.get(LIVE_EVENTS.importProgress)!(progress({ importId: 'upload-0002', phase: 'done', fraction: 1 }));
    });
    expect(client.getQueryData(['imports', 'progress', 'upload-0001'])).toMatchObject({ phase: 'validating' });
    await act(async () => {
      await handlers.get(LIVE_EVENTS.importProgress)!(progress({}));
    });
    await waitFor(() => expect(result.current.data).toEqual(progress({})));
    // An older state arriving late does not move the bar back.
    await act(async () => {
      await handlers.get(LIVE_EVENTS.importProgress)!(progress({ fraction: 0.4, updatedAt: '2026-03-01T09:00:00.900Z' }));
    });
    expect(client.getQueryData(['imports', 'progress', 'upload-0001'])).toEqual(progress({}));
    expect(result.current.data?.fraction).toBe(0.58);

    // Nothing more is fetched while events arrive: no polling.
    await new Promise((resolve) => setTimeout(resolve, 700));
    expect(fetchMock).toHaveBeenCalledTimes(1);
  });

  it('should show the state the server has when the socket connects mid-import (a reload), and close the socket when the import ends', async () => {
    signInAs({ role: 'technician' });
    mockFetch([{ path: '/api/imports/upload-0001/progress', body: progress({ phase: 'writing', fraction: 0.7 }) }]);
    const client = createQueryClient();
    const { result, rerender } = renderHook(({ active }) => useImportProgress('upload-0001', active), {
      wrapper: setup(client),
      initialProps: { active: true },
    });
    act(() => void handlers.get('connect')!());
    await waitFor(() => expect(result.current.data).toMatchObject({ phase: 'writing', fraction: 0.7 }));
    rerender({ active: false });
    expect(opened[0]!.disconnect).toHaveBeenCalled();
  });

  it('should open no socket before an import starts', () => {
    signInAs({ role: 'technician' });
    mockFetch([]);
    renderHook(() => useImportProgress(null, false), { wrapper: setup(createQueryClient()) });
    expect(opened).toEqual([]);
  });
});
