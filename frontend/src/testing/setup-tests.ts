import { cleanup } from '@testing-library/react';
import { afterEach, beforeEach } from 'vitest';
import { clearNotifications } from '@/lib/notifications';
import { setNavigator } from '@/lib/navigator';

beforeEach(() => {
  window.localStorage.clear();
  window.history.replaceState(null, '', '/');
});

afterEach(() => {
  cleanup();
  clearNotifications();
  setNavigator(null);
});
