import { createHash } from 'node:crypto';
import type { DataSource } from 'typeorm';

/** MariaDB's limit on a user lock's name. */
const MAX_LOCK_NAME = 64;

/**
 * The name of a lock on this database: `kc:<database>:<purpose>`. GET_LOCK names are server-wide, so the
 * database's name is part of it (two labs, or two test databases, on one MariaDB server never wait on each
 * other); a name over MariaDB's 64 characters keeps its start and ends with a hash of the whole.
 */
export function namedLockName(dataSource: DataSource, purpose: string): string {
  const database = String((dataSource.options as { database?: unknown }).database ?? '');
  const name = `kc:${database}:${purpose}`;
  if (name.length <= MAX_LOCK_NAME) return name;
  const hash = createHash('sha256').update(name).digest('hex').slice(0, 16);
  return `${name.slice(0, MAX_LOCK_NAME - hash.length - 1)}~${hash}`;
}

export type NamedLockOutcome<T> = { acquired: true; result: T } | { acquired: false };

/**
 * Runs `work` while this node holds MariaDB's named lock (GET_LOCK) `name`, on one connection of its own
 * kept for the whole run: the lock belongs to that connection, so a node that dies mid-run loses it with the
 * connection and the next run anywhere goes ahead. Waits at most `waitSeconds` (0: not at all) and answers
 * `{acquired: false}` without running anything when another connection holds it. Used for scheduled work
 * that several app nodes would otherwise all do at once; every node shares the database already, so no
 * extra service (nor a Redis lock library) is needed for it.
 */
export async function withNamedLock<T>(dataSource: DataSource, name: string, waitSeconds: number, work: () => Promise<T>): Promise<NamedLockOutcome<T>> {
  const runner = dataSource.createQueryRunner();
  await runner.connect();
  let held = false;
  try {
    const [row] = (await runner.query('SELECT GET_LOCK(?, ?) AS got', [name, waitSeconds])) as Array<{ got: number | string | null }>;
    held = Number(row?.got) === 1;
    if (!held) return { acquired: false };
    return { acquired: true, result: await work() };
  } finally {
    try {
      if (held) await runner.query('SELECT RELEASE_LOCK(?)', [name]);
    } finally {
      // Back to the pool without the lock; a connection whose RELEASE failed is broken, and MariaDB frees its locks when it closes.
      await runner.release();
    }
  }
}

/** Whether nobody holds the lock now (IS_FREE_LOCK), for checks and tests. */
export async function namedLockIsFree(dataSource: DataSource, name: string): Promise<boolean> {
  const [row] = (await dataSource.query('SELECT IS_FREE_LOCK(?) AS free', [name])) as Array<{ free: number | string | null }>;
  return Number(row?.free) === 1;
}
