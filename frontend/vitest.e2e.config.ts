import { defineConfig } from 'vitest/config';

// Browser tests: playwright-core drives Debian's chromium against a running app (KC_E2E_URL),
// which `bin/kilocycle test browser` starts on its own database with the demo data.
export default defineConfig({
  test: {
    environment: 'node',
    include: ['e2e/**/*.e2e.test.ts'],
    testTimeout: 90_000,
    hookTimeout: 60_000,
    fileParallelism: false,
    pool: 'forks',
  },
});
