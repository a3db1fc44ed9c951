import type { SessionUser } from '@kilocycle/common/types';

export type Session = { accessToken: string; user: SessionUser };

export const SESSION_STORAGE_KEY = 'kc.session';

type Listener = () => void;
const listeners = new Set<Listener>();

// Parsed once per raw value so useSyncExternalStore gets a stable snapshot.
let cachedRaw: string | null = null;
let cachedSession: Session | null = null;

function isSession(value: unknown): value is Session {
  if (typeof value !== 'object' || value === null) return false;
  const candidate = value as Partial<Session>;
  return typeof candidate.accessToken === 'string' && typeof candidate.user === 'object' && candidate.user !== null && typeof candidate.user.role === 'string';
}

function readRaw(): string | null {
  try {
    return window.localStorage.getItem(SESSION_STORAGE_KEY);
  } catch {
    return null;
  }
}

export function getSession(): Session | null {
  const raw = readRaw();
  if (raw === cachedRaw) return cachedSession;
  cachedRaw = raw;
  try {
    const parsed: unknown = raw ? JSON.parse(raw) : null;
    cachedSession = isSession(parsed) ? parsed : null;
  } catch {
    cachedSession = null;
  }
  return cachedSession;
}

function emit() {
  listeners.forEach((listener) => listener());
}

export function setSession(session: Session) {
  window.localStorage.setItem(SESSION_STORAGE_KEY, JSON.stringify(session));
  emit();
}

export function clearSession() {
  window.localStorage.removeItem(SESSION_STORAGE_KEY);
  emit();
}

export function subscribeSession(listener: Listener) {
  listeners.add(listener);
  // Signing out in another tab signs this one out too.
  const onStorage = (event: StorageEvent) => {
    if (event.key === null || event.key === SESSION_STORAGE_KEY) listener();
  };
  window.addEventListener('storage', onStorage);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', onStorage);
  };
}
