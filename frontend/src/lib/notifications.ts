import { useSyncExternalStore } from 'react';

export type NotificationSeverity = 'error' | 'warning' | 'info' | 'success';

export type Notification = { id: number; severity: NotificationSeverity; message: string; createdAt: number };

/**
 * A notice survives the page change its own action makes (save, then go to the new record) when that change
 * comes within this long of it; any later page change closes it, so it never follows the person around.
 */
export const NAVIGATION_GRACE_MS = 1500;

type Listener = () => void;

let queue: readonly Notification[] = [];
let nextId = 1;
const listeners = new Set<Listener>();

function emit() {
  listeners.forEach((listener) => listener());
}

export function notify(severity: NotificationSeverity, message: string) {
  // The same message twice in a row (e.g. several queries failing together) is shown once.
  if (queue.some((n) => n.message === message && n.severity === severity)) return;
  queue = [...queue, { id: nextId++, severity, message, createdAt: Date.now() }];
  emit();
}

export function dismissNotification(id: number) {
  queue = queue.filter((n) => n.id !== id);
  emit();
}

/** On a page change: close every notice older than the grace period (see NAVIGATION_GRACE_MS). */
export function dismissOnNavigation(now = Date.now()) {
  const kept = queue.filter((n) => now - n.createdAt < NAVIGATION_GRACE_MS);
  if (kept.length === queue.length) return;
  queue = kept;
  emit();
}

export function clearNotifications() {
  queue = [];
  emit();
}

function subscribe(listener: Listener) {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

export function getNotifications() {
  return queue;
}

export function useNotifications() {
  return useSyncExternalStore(subscribe, getNotifications, getNotifications);
}
