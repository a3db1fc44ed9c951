import { existsSync, mkdtempSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { megabytesFromEnv, removeStaleUploads } from './multipart-upload.js';

describe('megabytesFromEnv()', () => {
  test('reads megabytes, falls back to the default and refuses nonsense', () => {
    expect(megabytesFromEnv('KC_X_MB', 15, {})).toBe(15 * 1024 * 1024);
    expect(megabytesFromEnv('KC_X_MB', 15, { KC_X_MB: '0.5' })).toBe(512 * 1024);
    expect(() => megabytesFromEnv('KC_X_MB', 15, { KC_X_MB: 'lots' })).toThrow(/KC_X_MB must be a number of megabytes/);
  });
});

describe('removeStaleUploads()', () => {
  test('removes only old upload files', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'kc-stale-'));
    try {
      const old = join(dir, `${'a'.repeat(32)}.upload`);
      const fresh = join(dir, `${'b'.repeat(32)}.upload`);
      const other = join(dir, 'notes.txt');
      for (const path of [old, fresh, other]) writeFileSync(path, 'x');
      const twoHoursAgo = (Date.now() - 2 * 3600_000) / 1000;
      utimesSync(old, twoHoursAgo, twoHoursAgo);
      utimesSync(other, twoHoursAgo, twoHoursAgo);
      expect(await removeStaleUploads(dir, 3600_000)).toBe(1);
      expect([existsSync(old), existsSync(fresh), existsSync(other)]).toEqual([false, true, true]);
      expect(await removeStaleUploads(join(dir, 'missing'), 1)).toBe(0);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
