import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import { act, renderHook } from '@testing-library/react';
import type { ReactNode } from 'react';
import { LIVE_EVENTS, type LiveExclusionEvent, type LiveReadingsEvent } from '@kilocycle/common/events';
import type { Reading } from '@kilocycle/common/types';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { createQueryClient } from '@/lib/react-query';
import { clearSession } from '@/lib/session';
import { signInAs } from '@/testing/test-utils';
import { useLiveReadings } from '../use-live-readings';

// A stand-in socket: the test fires the events socket.io-client would.
const handlers = new Map<string, (...args: unknown[]) => void>();
vi.mock('socket.io-client', () => ({
  io: () => ({
    on: (event: string, handler: (...args: unknown[]) => void) => handlers.set(event, handler),
    emit: vi.fn(),
    disconnect: vi.fn(),
  }),
}));

function wrapper({ children }: { children: ReactNode }) {
  return <QueryClientProvider client={createQueryClient()}>{children}</QueryClientProvider>;
}

describe('useLiveReadings()', () => {
  afterEach(() => {
    handlers.clear();
    clearSession();
  });

  it('should say the feed ended, not that it is reconnecting, when the server closes the socket', () => {
    signInAs();
    const { result } = renderHook(() => useLiveReadings(7), { wrapper });
    act(() => handlers.get('disconnect')!('io server disconnect'));
    expect(result.current.state).toBe('refused');
    expect(result.current.message).toMatch(/session ended\. Sign in again/);
  });

  it('should say it is reconnecting when the connection is lost', () => {
    signInAs();
    const { result } = renderHook(() => useLiveReadings(7), { wrapper });
    act(() => handlers.get('disconnect')!('transport close'));
    expect(result.current).toMatchObject({ state: 'offline', message: 'Connection lost; reconnecting…' });
  });

  it('should mark a reading excluded on another screen at once and fetch the reading lists, the run and its analysis again', () => {
    signInAs();
    const client: QueryClient = createQueryClient();
    const reading = (seq: number, excluded = false): Reading => ({
      id: 40 + seq,
      seq,
      t: seq * 2,
      dial: 1750,
      frequency: 1_750_010 + seq,
      aux: null,
      source: 'manual',
      receivedAt: '2026-03-01T09:00:00Z',
      excluded,
      excludedReason: excluded ? 'Counter gate misread' : null,
      author: null,
    });
    // What the run page holds in its cache: the live latest readings, a page of the readings table, the run and its analysis.
    client.setQueryData(['readings', 7, 'latest'], [reading(1), reading(2), reading(3)]);
    client.setQueryData(['readings', 7, { page: 1 }], { items: [], total: 3 });
    client.setQueryData(['runs', 'detail', 7], { id: 7 });
    client.setQueryData(['runs', 'analysis', 7], { runId: 7 });
    client.setQueryData(['runs', 'analysis', 8], { runId: 8 });
    renderHook(() => useLiveReadings(7), {
      wrapper: ({ children }: { children: ReactNode }) => <QueryClientProvider client={client}>{children}</QueryClientProvider>,
    });

    const event: LiveExclusionEvent = { runId: 7, reading: reading(2, true) };
    act(() => handlers.get(LIVE_EVENTS.excluded)!(event));

    expect(client.getQueryData<Reading[]>(['readings', 7, 'latest'])!.map((r) => [r.seq, r.excluded, r.excludedReason])).toEqual([
      [1, false, null],
      [2, true, 'Counter gate misread'],
      [3, false, null],
    ]);
    expect(client.getQueryState(['readings', 7, { page: 1 }])!.isInvalidated).toBe(true);
    expect(client.getQueryState(['runs', 'detail', 7])!.isInvalidated).toBe(true);
    expect(client.getQueryState(['runs', 'analysis', 7])!.isInvalidated).toBe(true);
    // The live list is kept by the stream, not refetched; another run is left alone.
    expect(client.getQueryState(['readings', 7, 'latest'])!.isInvalidated).toBe(false);
    expect(client.getQueryState(['runs', 'analysis', 8])!.isInvalidated).toBe(false);
  });

  it("should add a batch that arrives as columns to the run's latest readings, each with the batch's author", () => {
    signInAs();
    const client = createQueryClient();
    renderHook(() => useLiveReadings(7), {
      wrapper: ({ children }: { children: ReactNode }) => <QueryClientProvider client={client}>{children}</QueryClientProvider>,
    });
    const author = { kind: 'bench' as const, id: 2, name: 'Bench West' };
    const event: LiveReadingsEvent = {
      runId: 7,
      author,
      source: 'bridge',
      receivedAt: '2026-03-01T09:00:05.250Z',
      id: [61, 62],
      seq: [1, 2],
      t: [0.5, 1],
      dial: [null, null],
      frequency: [7_049_990.5, 7_049_991.25],
      aux: [20.5, null],
    };
    act(() => handlers.get(LIVE_EVENTS.readings)!(event));
    act(() => handlers.get(LIVE_EVENTS.readings)!({ ...event, runId: 8, seq: [9], id: [99] }));
    expect(client.getQueryData<Reading[]>(['readings', 7, 'latest'])).toEqual([
      {
        id: 61,
        seq: 1,
        t: 0.5,
        dial: null,
        frequency: 7_049_990.5,
        aux: 20.5,
        source: 'bridge',
        receivedAt: '2026-03-01T09:00:05.250Z',
        excluded: false,
        excludedReason: null,
        author,
      },
      {
        id: 62,
        seq: 2,
        t: 1,
        dial: null,
        frequency: 7_049_991.25,
        aux: null,
        source: 'bridge',
        receivedAt: '2026-03-01T09:00:05.250Z',
        excluded: false,
        excludedReason: null,
        author,
      },
    ]);
  });

  it('should ignore an exclusion in another run', () => {
    signInAs();
    const client = createQueryClient();
    client.setQueryData(['runs', 'analysis', 7], { runId: 7 });
    renderHook(() => useLiveReadings(7), {
      wrapper: ({ children }: { children: ReactNode }) => <QueryClientProvider client={client}>{children}</QueryClientProvider>,
    });
    act(() => handlers.get(LIVE_EVENTS.excluded)!({ runId: 8, reading: { id: 1, seq: 1 } }));
    expect(client.getQueryState(['runs', 'analysis', 7])!.isInvalidated).toBe(false);
  });

  it("should listen to every event the server emits on /live about a run (import progress is the import page's)", () => {
    signInAs();
    renderHook(() => useLiveReadings(7), { wrapper });
    const serverToBrowser = Object.values(LIVE_EVENTS).filter((e) => e !== LIVE_EVENTS.join && e !== LIVE_EVENTS.leave && e !== LIVE_EVENTS.importProgress);
    expect(serverToBrowser.filter((e) => !handlers.has(e))).toEqual([]);
  });
});
