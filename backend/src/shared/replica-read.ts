import type { DataSource } from 'typeorm';

/**
 * A raw read the replica may serve: TypeORM sends raw `query()` to the primary, and only a query runner made
 * in 'slave' mode to the replica (the primary itself when no replica is configured). The database module's
 * driver waits for the replica to have applied the primary's last write before it hands the connection
 * out, so a read right after a write still sees it.
 */
export async function replicaQuery<T>(dataSource: DataSource, sql: string, params?: unknown[]): Promise<T> {
  const runner = dataSource.createQueryRunner('slave');
  try {
    return (await runner.query(sql, params)) as T;
  } finally {
    await runner.release();
  }
}
