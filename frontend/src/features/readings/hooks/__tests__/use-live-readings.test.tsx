import { QueryClientProvider } from '@tanstack/react-query';
import { act, renderHook } from '@testing-library/react';
import type { ReactNode } from 'react';
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
});
