import { generateKeyPairSync, randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createTestApp, type TestApp } from './test-app.js';

/** Creates an app with these settings in the environment (its configuration is read while it is built). */
export async function appWith(env: Record<string, string>, reset: boolean): Promise<TestApp> {
  const saved = Object.fromEntries(Object.keys(env).map((key) => [key, process.env[key]]));
  Object.assign(process.env, env);
  try {
    return await createTestApp({ reset });
  } finally {
    for (const [key, value] of Object.entries(saved)) {
      if (value === undefined) delete process.env[key];
      else process.env[key] = value;
    }
  }
}

/**
 * What every node of a cluster shares besides Redis (the session secret and the certificate key), written as
 * an operator would, and the settings naming them with the Redis address. remove() deletes the files.
 */
export function clusterSettings(redisUrl: string): { env: Record<string, string>; remove: () => void } {
  const dir = mkdtempSync(join(tmpdir(), 'kc-cluster-keys-'));
  writeFileSync(join(dir, 'jwt-secret'), randomBytes(32).toString('hex'));
  writeFileSync(join(dir, 'signing.key.pem'), generateKeyPairSync('ed25519').privateKey.export({ type: 'pkcs8', format: 'pem' }));
  return {
    env: { KC_REDIS_URL: redisUrl, KC_JWT_SECRET_FILE: join(dir, 'jwt-secret'), KC_SIGNING_KEY_FILE: join(dir, 'signing.key.pem') },
    remove: () => rmSync(dir, { recursive: true, force: true }),
  };
}
