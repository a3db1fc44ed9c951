import { ThrowawayMariaDb } from './throwaway-mariadb.js';

export type ReplicatedPair = { primary: ThrowawayMariaDb; replica: ThrowawayMariaDb; destroy: () => Promise<void> };

const REPLICATION_PASSWORD = 'kc-repl-test-pw';
const CHARACTERS = ['--character-set-server=utf8mb4', '--collation-server=utf8mb4_unicode_ci'];

/**
 * Two throwaway MariaDB servers on free loopback ports: a primary with a binlog (GTID, server id 1) holding the
 * app's database `kc` and user `kc`, and a read-only replica (server id 2) replicating it with GTID from the
 * primary's first transaction, so both start empty and everything after (the app's database and user, the
 * migrations, the demo data) reaches the replica by replication.
 */
export async function startReplicatedPair(): Promise<ReplicatedPair> {
  const primary = new ThrowawayMariaDb({
    // Triggers created by the app user (the migrations) need log_bin_trust_function_creators once a binlog is on.
    args: ['--log-bin=primary-bin', '--server-id=1', '--binlog-format=ROW', '--log-bin-trust-function-creators=1', ...CHARACTERS],
    appDatabase: false,
  });
  const replica = new ThrowawayMariaDb({ args: ['--server-id=2', '--read-only=1', '--relay-log=replica-relay-bin', ...CHARACTERS], appDatabase: false });
  try {
    await primary.init();
    // The replication user first (nothing is replicated yet, so the replica never needs it), then the rest.
    primary.sql(
      `SET sql_log_bin = 0; CREATE USER 'repl'@'127.0.0.1' IDENTIFIED BY '${REPLICATION_PASSWORD}'; ` +
        "GRANT REPLICATION SLAVE ON *.* TO 'repl'@'127.0.0.1'; SET sql_log_bin = 1;",
    );
    primary.sql(
      "CREATE DATABASE kc CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci; CREATE USER 'kc'@'127.0.0.1' IDENTIFIED BY 'kc-test-pw'; GRANT ALL ON kc.* TO 'kc'@'127.0.0.1';",
    );
    await replica.init();
    replica.sql(
      `SET GLOBAL gtid_slave_pos = ''; CHANGE MASTER TO MASTER_HOST = '127.0.0.1', MASTER_PORT = ${primary.port}, MASTER_USER = 'repl', ` +
        `MASTER_PASSWORD = '${REPLICATION_PASSWORD}', MASTER_USE_GTID = slave_pos, MASTER_CONNECT_RETRY = 1; START SLAVE;`,
    );
    await caughtUp(primary, replica);
    return {
      primary,
      replica,
      destroy: async () => {
        await replica.destroy();
        await primary.destroy();
      },
    };
  } catch (error) {
    await replica.destroy();
    await primary.destroy();
    throw error;
  }
}

/** Waits until the replica has applied everything the primary has committed (MASTER_GTID_WAIT, at most `seconds`). */
export async function caughtUp(primary: ThrowawayMariaDb, replica: ThrowawayMariaDb, seconds = 20): Promise<void> {
  const position = primary.value('SELECT @@gtid_binlog_pos');
  const waited = replica.value(`SELECT MASTER_GTID_WAIT('${position}', ${seconds})`);
  if (waited !== '0') {
    const status = replica.row('SHOW SLAVE STATUS');
    throw new Error(
      `the replica did not reach ${position} in ${seconds} s: IO ${status.Slave_IO_Running}, SQL ${status.Slave_SQL_Running}, ` +
        `${status.Last_IO_Error || status.Last_SQL_Error || 'no error reported'}`,
    );
  }
}
