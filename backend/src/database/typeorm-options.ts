import { Logger } from '@nestjs/common';
import mysql2, { type PoolCluster, type PoolClusterOptions, type PoolConnection, type PoolOptions } from 'mysql2';
import type { DataSourceOptions } from 'typeorm';

type MariaDbOptions = Extract<DataSourceOptions, { type: 'mysql' | 'mariadb' }>;
import type { AppConfig } from '../config/app-config.js';
import { MIGRATIONS } from './migrations/index.js';

/** Connection options shared by Nest, the CLI data source and the tests. `synchronize` is always off. */
export function typeormOptions(config: AppConfig): MariaDbOptions {
  const base = {
    type: 'mariadb',
    charset: 'utf8mb4_unicode_ci',
    timezone: 'Z',
    synchronize: false,
    migrationsRun: false,
    migrations: MIGRATIONS,
    migrationsTableName: 'kc_migrations',
    extra: { connectionLimit: 10, connectTimeout: 5000 },
    logging: ['error'],
  } satisfies Partial<MariaDbOptions>;
  const primary = { host: config.db.host, port: config.db.port, username: config.db.user, password: config.db.password, database: config.db.name };
  if (!config.db.replica) return { ...base, ...primary };
  // Reads through a replica: TypeORM sends writes, transactions and raw `query()` calls to the primary ("master"),
  // and SELECTs built by a query builder or a repository outside a transaction to the replica ("slave").
  return {
    ...base,
    replication: {
      master: primary,
      slaves: [{ ...primary, host: config.db.replica.host, port: config.db.replica.port }],
      // mysql2's PoolCluster: the first failed connection takes the replica out for REPLICA_REST_MS, then it is tried again.
      canRetry: true,
      removeNodeErrorCount: 1,
      restoreNodeTimeout: REPLICA_REST_MS,
      selector: 'ORDER',
    },
    driver: replicaAwareMysql(),
  };
}

// ---- reads from the replica, without stale answers and without waiting on a dead replica ----------------

/** A replica that refused a connection, failed a query or fell behind is left alone this long, then tried again. */
export const REPLICA_REST_MS = 5000;
/** A connection to the replica that takes longer than this counts as failed (a stopped host answers nothing). */
export const REPLICA_CONNECT_TIMEOUT_MS = 1000;
/** How long a read waits for the replica to apply what the primary had committed when the read began. */
export const REPLICA_CATCH_UP_SECONDS = 0.5;

type ConnectionCallback = (error: NodeJS.ErrnoException | null, connection?: PoolConnection) => void;

/**
 * mysql2 as TypeORM's driver package (its `driver` option), with one change to the pool cluster TypeORM builds
 * for replication: a connection for reads ("SLAVE*") is handed out only once the replica has applied every
 * transaction the primary had committed when the read began (MariaDB's MASTER_GTID_WAIT on the primary's
 * @@gtid_binlog_pos, at most REPLICA_CATCH_UP_SECONDS), so a page read right after a write, on this node or
 * another, sees that write. A replica that is down, fails the check or is behind is skipped: the read goes to
 * the primary at once, and the replica is tried again after REPLICA_REST_MS.
 */
function replicaAwareMysql(): typeof mysql2 {
  return { ...mysql2, createPoolCluster: (options?: PoolClusterOptions) => replicaAware(mysql2.createPoolCluster(options)) };
}

function replicaAware(cluster: PoolCluster): PoolCluster {
  const logger = new Logger('ReplicaReads');
  const add = cluster.add.bind(cluster) as (id: string, config: PoolOptions) => void;
  const getConnection = cluster.getConnection.bind(cluster) as (pattern: string, callback: ConnectionCallback) => void;
  let restingUntil = 0;
  let resting = false;

  cluster.add = ((id: string, config: PoolOptions) =>
    add(id, id.startsWith('SLAVE') ? { ...config, connectTimeout: REPLICA_CONNECT_TIMEOUT_MS } : config)) as PoolCluster['add'];

  const rest = (why: string) => {
    restingUntil = Date.now() + REPLICA_REST_MS;
    if (!resting) logger.warn(`the replica ${why}: reads go to the primary, and the replica is tried again every ${REPLICA_REST_MS / 1000} s`);
    resting = true;
  };
  const primary = (done: ConnectionCallback) => getConnection('MASTER', done);

  const forReads = (done: ConnectionCallback) => {
    if (Date.now() < restingUntil) return primary(done);
    getConnection('SLAVE*', (error, replica) => {
      if (error || !replica) {
        rest(`does not answer (${error?.message ?? 'no connection'})`);
        return primary(done);
      }
      cluster.of('MASTER').query('SELECT @@gtid_binlog_pos AS pos', (positionError: Error | null, rows: unknown) => {
        // The primary away: the replica's copy is the best there is (writes fail on their own).
        if (positionError) return done(null, replica);
        const position = (rows as Array<{ pos: string | null }>)[0]?.pos ?? '';
        replica.query('SELECT MASTER_GTID_WAIT(?, ?) AS waited', [position, REPLICA_CATCH_UP_SECONDS], (waitError: Error | null, result: unknown) => {
          if (waitError) {
            replica.destroy();
            rest(`failed a query (${waitError.message})`);
            return primary(done);
          }
          if (Number((result as Array<{ waited: number | string }>)[0]?.waited) !== 0) {
            replica.release();
            rest(`is more than ${REPLICA_CATCH_UP_SECONDS} s behind the primary (replication stopped or slow)`);
            return primary(done);
          }
          if (resting) logger.log('the replica answers and has caught up: reads go to it again');
          resting = false;
          done(null, replica);
        });
      });
    });
  };

  cluster.getConnection = ((pattern: unknown, selectorOrDone: unknown, maybeDone?: unknown) => {
    const done = (typeof selectorOrDone === 'function' ? selectorOrDone : maybeDone) as ConnectionCallback;
    if (pattern === 'SLAVE*') return forReads(done);
    return getConnection(pattern as string, done);
  }) as PoolCluster['getConnection'];
  return cluster;
}
