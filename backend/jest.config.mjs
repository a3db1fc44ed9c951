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
};
