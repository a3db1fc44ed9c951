import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

export type AppMode = 'demo' | 'production';

export type AppConfig = {
  mode: AppMode;
  host: string;
  port: number;
  publicUrl: string;
  varDir: string;
  frontendDist: string;
  db: { host: string; port: number; name: string; user: string; password: string };
  jwtSecret: string;
  jwtTtlSeconds: number;
  adminPassword: string | null;
  bcryptCost: number;
};

const here = dirname(fileURLToPath(import.meta.url));
/** The repository root: backend/dist/config or backend/src/config → ../../.. */
export const REPO_ROOT = resolve(here, '..', '..', '..');

function intFromEnv(env: NodeJS.ProcessEnv, key: string, fallback: number, problems: string[]): number {
  const raw = env[key];
  if (raw === undefined || raw === '') return fallback;
  const value = Number(raw);
  if (!Number.isInteger(value) || value <= 0 || value > 65535) {
    problems.push(`${key} must be a whole number from 1 to 65535 (got "${raw}")`);
    return fallback;
  }
  return value;
}

/** Reads a secret from the environment, else from a file under var/, creating it on first use. */
function secretFromFile(varDir: string, fileName: string): string {
  const path = join(varDir, fileName);
  if (existsSync(path)) return readFileSync(path, 'utf8').trim();
  mkdirSync(dirname(path), { recursive: true });
  const secret = randomBytes(32).toString('hex');
  writeFileSync(path, secret + '\n', { mode: 0o600 });
  return secret;
}

/**
 * Builds the configuration from the environment, with defaults for a bench machine.
 * Throws one error listing every bad key, so a misconfigured start fails at once and says why.
 */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): AppConfig {
  const problems: string[] = [];
  const mode = (env.KC_MODE ?? 'demo') as AppMode;
  if (mode !== 'demo' && mode !== 'production') problems.push(`KC_MODE must be demo or production (got "${mode}")`);
  const varDir = resolve(env.KC_VAR_DIR ?? join(REPO_ROOT, 'var'));
  const port = intFromEnv(env, 'KC_PORT', 5180, problems);
  const host = env.KC_HOST ?? '127.0.0.1';
  const dbPort = intFromEnv(env, 'KC_DB_PORT', 3317, problems);
  const adminPassword = env.KC_ADMIN_PASSWORD ?? null;
  if (mode === 'production' && (!adminPassword || adminPassword.length < 12)) {
    problems.push('KC_ADMIN_PASSWORD (12 characters or more) must be set in production mode');
  }
  const dbPasswordFile = join(varDir, 'db-password');
  const dbPassword =
    env.KC_DB_PASSWORD ?? (existsSync(dbPasswordFile) ? readFileSync(dbPasswordFile, 'utf8').trim() : '');
  if (problems.length > 0) throw new Error(`Configuration problems: ${problems.join('; ')}`);
  return {
    mode,
    host,
    port,
    publicUrl: (env.KC_PUBLIC_URL ?? `http://127.0.0.1:${port}`).replace(/\/$/, ''),
    varDir,
    frontendDist: resolve(env.KC_FRONTEND_DIST ?? join(REPO_ROOT, 'frontend', 'dist')),
    db: {
      host: env.KC_DB_HOST ?? '127.0.0.1',
      port: dbPort,
      name: env.KC_DB_NAME ?? 'kilocycle',
      user: env.KC_DB_USER ?? 'kilocycle',
      password: dbPassword,
    },
    jwtSecret: env.KC_JWT_SECRET ?? secretFromFile(varDir, 'jwt-secret'),
    jwtTtlSeconds: intFromEnv(env, 'KC_JWT_TTL', 8 * 3600, problems),
    adminPassword,
    bcryptCost: 10,
  };
}

export const APP_CONFIG = Symbol('APP_CONFIG');
