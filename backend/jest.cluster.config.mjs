// The cluster suite (bin/kilocycle test cluster): one file that starts the whole cluster with
// bin/kilocycle cluster start, so it runs apart from the backend suite, with long time limits.
import base from './jest.config.mjs';

export default { ...base, roots: ['<rootDir>/test-cluster'], testTimeout: 300_000 };
