import { render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { BridgeChip, clockTime } from '../ui/bridge-chip';

describe('<BridgeChip>', () => {
  afterEach(() => vi.useRealTimers());

  it('should show nothing bridge-like on a run no bridge has fed (an imported run)', () => {
    const { container } = render(
      <BridgeChip bridge={{ connected: false, since: null, lastReadingAt: '2026-12-03T10:00:00.000Z' }} change={null} lastArrivalAt={null} />,
    );
    expect(container.textContent).toBe('');
  });

  it('should say Live with the age of the newest reading while a bridge is connected, ticking each second', async () => {
    vi.useFakeTimers({ now: Date.parse('2026-12-03T10:00:04.000Z') });
    render(
      <BridgeChip
        bridge={{ connected: true, since: '2026-12-03T09:59:00.000Z', lastReadingAt: '2026-12-03T10:00:00.000Z' }}
        change={null}
        lastArrivalAt={null}
      />,
    );
    expect(screen.getByTestId('bridge-chip').textContent).toBe('Livelast reading 4 s ago');
    await vi.advanceTimersByTimeAsync(3000);
    expect(screen.getByTestId('bridge-chip').textContent).toBe('Livelast reading 7 s ago');
  });

  it('should turn to "Bridge offline since" the moment a live event says it dropped, and never say Live then', () => {
    const since = '2026-12-03T10:05:09.000Z';
    render(
      <BridgeChip
        bridge={{ connected: true, since: '2026-12-03T09:59:00.000Z', lastReadingAt: null }}
        change={{ connected: false, since }}
        lastArrivalAt={Date.now()}
      />,
    );
    expect(screen.getByTestId('bridge-chip').textContent).toBe(`Bridge offline since ${clockTime(since)}`);
    expect(clockTime(since)).toMatch(/^\d\d:\d\d:09$/);
    expect(screen.queryByText('Live')).toBeNull();
  });
});
