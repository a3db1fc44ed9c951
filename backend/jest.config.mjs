// Jest runs in native ESM mode (NODE_OPTIONS=--experimental-vm-modules): @nestjs/* 12 is ESM-only.
export default {
  testEnvironment: 'node',
  extensionsToTreatAsEsm: ['.ts'],
  roots: ['<rootDir>/src', '<rootDir>/test'],
  testMatch: ['**/*.spec.ts', '**/*.e2e-spec.ts'],
  moduleNameMapper: {
    '^@kilocycle/common/(.*)$': '<rootDir>/../common/src/$1/index.ts',
    '^(\\.{1,2}/.*)\\.js$': '$1',
  },
  transform: { '^.+\\.ts$': ['ts-jest', { useESM: true, tsconfig: '<rootDir>/tsconfig.spec.json' }] },
  // Answers @nestjs/throttler's one require of ESM-only @nestjs/common (see that file).
  resolver: '<rootDir>/test/support/jest-resolver.cjs',
  testTimeout: 60000,
  maxWorkers: 1,
  // One worker process, not the runner's own: Jest's ESM module registry keeps growing from file to file, and in one
  // process the backend suite reached the 4 GB heap limit on a long run. The worker is replaced after any file that
  // leaves it above this (Jest's documented remedy; a memory limit is what makes Jest use a worker at maxWorkers 1).
  workerIdleMemoryLimit: '1.5GB',
};
