import { useSyncExternalStore } from 'react';
import type { LiveCaptureEvent } from '@kilocycle/common/events';

/**
 * The run's counter-assisted setting as the live feed pushes it, held outside React state so that only the
 * capture form re-renders on each event (not the whole run page with its charts): the settled reading must
 * show within 300 ms of the counter settling.
 */
export type CaptureFeed = { get: () => LiveCaptureEvent | null; subscribe: (listener: () => void) => () => void; push: (event: LiveCaptureEvent) => void };

export function createCaptureFeed(): CaptureFeed {
  let latest: LiveCaptureEvent | null = null;
  const listeners = new Set<() => void>();
  return {
    get: () => latest,
    subscribe: (listener) => {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    push: (event) => {
      latest = event;
      for (const listener of listeners) listener();
    },
  };
}

const none = () => () => undefined;
const nothing = () => null;

/** The latest event of the feed (null without one, or before the first event). */
export function useCaptureFeed(feed: CaptureFeed | undefined): LiveCaptureEvent | null {
  return useSyncExternalStore(feed?.subscribe ?? none, feed?.get ?? nothing);
}
