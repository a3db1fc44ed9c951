import { defineConfig, mergeConfig } from 'vitest/config';
import viteConfig from './vite.config.ts';

export default mergeConfig(
  viteConfig,
  defineConfig({
    test: {
      environment: 'happy-dom',
      include: ['src/**/__tests__/**/*.test.{ts,tsx}'],
      setupFiles: ['src/testing/setup-tests.ts'],
      restoreMocks: true,
      unstubGlobals: true,
    },
  }),
);
