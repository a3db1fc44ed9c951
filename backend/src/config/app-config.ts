import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { checkEnvironment, ConfigError } from './env-schema.js';

export { ConfigError } from './env-schema.js';

export type AppMode = 'demo' | 'production';

export type AppConfig = {
  mode: AppMode;
  host: string;
  port: number;
  publicUrl: string;
  varDir: string;
  frontendDist: string;
  /**
   * The primary, and the replica for reads when KC_DB_REPLICA_HOST is set (same user, password and database;
   * port KC_DB_REPLICA_PORT, default 3318); null: every query goes to the primary.
   */
  db: { host: string; port: number; name: string; user: string; password: string; replica: { host: string; port: number } | null };
  jwtSecret: string;
  jwtTtlSeconds: number;
  adminPassword: string | null;
  /** The first admin's address in production mode (KC_ADMIN_EMAIL). */
  adminEmail: string;
  bcryptCost: number;
  /** The daily recall reminder: off with KC_RECALL_DISABLED, first run KC_RECALL_DELAY_MS after start. */
  recall: { disabled: boolean; delayMs: number };
  /** Proxies whose X-Forwarded-For is believed (KC_TRUSTED_PROXIES); empty: the socket's address is the client's. */
  trustedProxies: string[];
  /**
   * Several app nodes sharing state (KC_REDIS_URL set): live fan-out and throttles in Redis. Null for the one
   * process of `bin/kilocycle start`, which keeps them in memory.
   */
  cluster: { redisUrl: string } | null;
  /** The certificate signing key's PEM file when given (KC_SIGNING_KEY_FILE); null: var/keys, made on first use. */
  signingKeyFile: string | null;
  /** This node's name among several (KC_NODE_NAME); null when unset. */
  nodeName: string | null;
  /**
   * Money: the lab's currency (KC_CURRENCY, default EUR) and the payment service: the real one when its key and
   * webhook secret are set, else the local fake started on 127.0.0.1:fakePort (KC_PAYMENT_FAKE_PORT, default 5191).
   */
  billing: { currency: string; payments: { kind: 'service'; secretKey: string; webhookSecret: string } | { kind: 'fake'; fakePort: number } };
};

const here = dirname(fileURLToPath(import.meta.url));
/** The repository root: backend/dist/config or backend/src/config → ../../.. */
export const REPO_ROOT = resolve(here, '..', '..', '..');

/** Reads a secret from the environment, else from a file under var/, creating it on first use. */
function secretFromFile(varDir: string, fileName: string): string {
  const path = join(varDir, fileName);
  if (existsSync(path)) return readFileSync(path, 'utf8').trim();
  mkdirSync(dirname(path), { recursive: true });
  const secret = randomBytes(32).toString('hex');
  writeFileSync(path, secret + '\n', { mode: 0o600 });
  return secret;
}

/** A file named by a setting must be there and readable: the start is refused (ConfigError) otherwise. */
function givenFile(key: string, path: string, what: string): string {
  const full = resolve(path);
  try {
    readFileSync(full);
  } catch (error) {
    const reason = (error as NodeJS.ErrnoException).code === 'ENOENT' ? 'it does not exist' : 'it cannot be read';
    throw new ConfigError([{ key, value: path, must: `name a readable file holding ${what} (${reason})` }]);
  }
  return full;
}

/** The shared session secret from KC_JWT_SECRET_FILE (never created: every node must read the same one). */
function givenSecret(path: string): string {
  const secret = readFileSync(givenFile('KC_JWT_SECRET_FILE', path, 'the session secret'), 'utf8').trim();
  if (secret.length < 32)
    throw new ConfigError([{ key: 'KC_JWT_SECRET_FILE', value: path, must: 'hold a secret of 32 characters or more (e.g. openssl rand -hex 32)' }]);
  return secret;
}

/**
 * Builds the configuration from the environment, with defaults for a bench machine. Every KC_* value
 * goes through the one schema (env-schema.ts); a bad one throws a ConfigError listing every bad key,
 * so a misconfigured start fails at once and says why.
 */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): AppConfig {
  const { values: v, problems } = checkEnvironment(env);
  if (problems.length > 0) throw new ConfigError(problems);
  const mode = v.KC_MODE ?? 'demo';
  const varDir = resolve(v.KC_VAR_DIR ?? join(REPO_ROOT, 'var'));
  const port = v.KC_PORT ?? 5180;
  const dbPasswordFile = join(varDir, 'db-password');
  const dbPassword = v.KC_DB_PASSWORD ?? (existsSync(dbPasswordFile) ? readFileSync(dbPasswordFile, 'utf8').trim() : '');
  return {
    mode,
    host: v.KC_HOST ?? '127.0.0.1',
    port,
    publicUrl: (v.KC_PUBLIC_URL ?? `http://127.0.0.1:${port}`).replace(/\/$/, ''),
    varDir,
    frontendDist: resolve(v.KC_FRONTEND_DIST ?? join(REPO_ROOT, 'frontend', 'dist')),
    db: {
      host: v.KC_DB_HOST ?? '127.0.0.1',
      port: v.KC_DB_PORT ?? 3317,
      name: v.KC_DB_NAME ?? 'kilocycle',
      user: v.KC_DB_USER ?? 'kilocycle',
      password: dbPassword,
      replica: v.KC_DB_REPLICA_HOST ? { host: v.KC_DB_REPLICA_HOST, port: v.KC_DB_REPLICA_PORT ?? 3318 } : null,
    },
    jwtSecret: v.KC_JWT_SECRET ?? (v.KC_JWT_SECRET_FILE ? givenSecret(v.KC_JWT_SECRET_FILE) : secretFromFile(varDir, 'jwt-secret')),
    jwtTtlSeconds: v.KC_JWT_TTL ?? 8 * 3600,
    adminPassword: v.KC_ADMIN_PASSWORD ?? null,
    adminEmail: v.KC_ADMIN_EMAIL ?? 'admin@localhost',
    bcryptCost: 10,
    recall: { disabled: v.KC_RECALL_DISABLED ?? false, delayMs: v.KC_RECALL_DELAY_MS ?? 60_000 },
    trustedProxies: v.KC_TRUSTED_PROXIES ?? [],
    cluster: v.KC_REDIS_URL ? { redisUrl: v.KC_REDIS_URL } : null,
    signingKeyFile: v.KC_SIGNING_KEY_FILE ? givenFile('KC_SIGNING_KEY_FILE', v.KC_SIGNING_KEY_FILE, 'a certificate signing key (PEM)') : null,
    nodeName: v.KC_NODE_NAME ?? null,
    billing: {
      currency: v.KC_CURRENCY ?? 'EUR',
      payments:
        v.KC_STRIPE_SECRET_KEY && v.KC_STRIPE_WEBHOOK_SECRET
          ? { kind: 'service', secretKey: v.KC_STRIPE_SECRET_KEY, webhookSecret: v.KC_STRIPE_WEBHOOK_SECRET }
          : { kind: 'fake', fakePort: v.KC_PAYMENT_FAKE_PORT ?? 5191 },
    },
  };
}

/** KC_* names in the environment that no part of Kilocycle reads (printed as warnings at start). */
export function configWarnings(env: NodeJS.ProcessEnv = process.env): string[] {
  return checkEnvironment(env).warnings;
}

export const APP_CONFIG = Symbol('APP_CONFIG');
