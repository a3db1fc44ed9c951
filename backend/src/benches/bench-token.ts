import { createHash, randomBytes } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { AuditService } from '../audit/audit.service.js';
import { Bench } from './bench.entity.js';

/** Bench tokens start with this, so one pasted in the wrong place is recognisable. */
export const BENCH_TOKEN_PREFIX = 'kcb_';

/** A fresh bench token: 32 random bytes, URL-safe. */
export function newBenchToken(): string {
  return BENCH_TOKEN_PREFIX + randomBytes(32).toString('base64url');
}

/** Tokens are long random strings, so a plain SHA-256 is enough to store them (no salt or stretching needed). */
export function hashBenchToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/**
 * Stores the hash of a new token for a bench (the old one stops working at once) and records it in
 * the audit log; returns the token, which is stored nowhere. Shared by the REST route and the CLI;
 * call it inside a transaction.
 */
export async function issueBenchToken(manager: EntityManager, benchId: number, actorId: number | null, via: 'api' | 'cli'): Promise<string> {
  const token = newBenchToken();
  await manager.update(Bench, { id: benchId }, { tokenHash: hashBenchToken(token), tokenIssuedAt: new Date() });
  await AuditService.within(manager).record({ actorId, entity: 'bench', entityId: benchId, action: 'token_issue', changes: { via } }, manager);
  return token;
}
