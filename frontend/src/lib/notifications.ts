import { useSyncExternalStore } from 'react';

export type NotificationSeverity = 'error' | 'warning' | 'info' | 'success';

export type Notification = { id: number; severity: NotificationSeverity; message: string };

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
  queue = [...queue, { id: nextId++, severity, message }];
  emit();
}

export function dismissNotification(id: number) {
  queue = queue.filter((n) => n.id !== id);
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
