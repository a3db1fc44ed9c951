// Jest for the local ESLint rules (native ESM: run with NODE_OPTIONS=--experimental-vm-modules).
export default {
  rootDir: '.',
  testEnvironment: 'node',
  testMatch: ['<rootDir>/*.test.mjs'],
  transform: {},
};
