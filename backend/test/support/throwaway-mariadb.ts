import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** Server options added to the usual ones (a binlog, a server id …), and whether init makes the app's database and user. */
export type ThrowawayOptions = { args?: string[]; appDatabase?: boolean };

/** A second, private MariaDB that a test may stop and start at will (the shared one stays up). */
export class ThrowawayMariaDb {
  readonly dir = mkdtempSync(join(tmpdir(), 'kc-mariadb-'));
  readonly socket = join(this.dir, 'mysqld.sock');
  port = 0;
  private process: ChildProcess | null = null;

  constructor(private readonly options: ThrowawayOptions = {}) {}

  async init(): Promise<void> {
    this.port = await freePort();
    execFileSync(
      'mariadb-install-db',
      ['--no-defaults', `--datadir=${join(this.dir, 'data')}`, '--user=root', '--auth-root-authentication-method=normal', '--skip-test-db'],
      { stdio: 'ignore' },
    );
    await this.start();
    if (this.options.appDatabase === false) return;
    this.sql("CREATE DATABASE kc; CREATE USER 'kc'@'127.0.0.1' IDENTIFIED BY 'kc-test-pw'; GRANT ALL ON kc.* TO 'kc'@'127.0.0.1';");
  }

  async start(): Promise<void> {
    this.process = spawn(
      'mariadbd',
      [
        '--no-defaults',
        `--datadir=${join(this.dir, 'data')}`,
        `--socket=${this.socket}`,
        `--port=${this.port}`,
        '--bind-address=127.0.0.1',
        `--pid-file=${join(this.dir, 'pid')}`,
        `--log-error=${join(this.dir, 'err.log')}`,
        '--user=root',
        '--skip-name-resolve',
        '--innodb-buffer-pool-size=32M',
        ...(this.options.args ?? []),
      ],
      { stdio: 'ignore' },
    );
    for (let i = 0; i < 120; i += 1) {
      try {
        execFileSync('mariadb-admin', ['--no-defaults', `--socket=${this.socket}`, '-uroot', 'ping'], { stdio: 'ignore' });
        return;
      } catch {
        await new Promise((r) => setTimeout(r, 250));
      }
    }
    throw new Error('throwaway MariaDB did not start');
  }

  async stop(): Promise<void> {
    const child = this.process;
    if (!child || child.exitCode !== null) return;
    await new Promise<void>((resolve) => {
      child.once('exit', () => resolve());
      child.kill('SIGTERM');
    });
    this.process = null;
  }

  sql(statements: string): void {
    execFileSync('mariadb', ['--no-defaults', `--socket=${this.socket}`, '-uroot', '-e', statements]);
  }

  /** The first column of the first row of a query's answer, as text ('' when there is none). */
  value(statement: string): string {
    return execFileSync('mariadb', ['--no-defaults', `--socket=${this.socket}`, '-uroot', '-N', '-B', '-e', statement], { encoding: 'utf8' })
      .split('\n')[0]!
      .split('\t')[0]!;
  }

  /** A row of SHOW … \G-style status as name → value (e.g. SHOW SLAVE STATUS). */
  row(statement: string): Record<string, string> {
    const [head = '', first = ''] = execFileSync('mariadb', ['--no-defaults', `--socket=${this.socket}`, '-uroot', '-B', '-e', statement], {
      encoding: 'utf8',
    }).split('\n');
    const names = head.split('\t');
    const values = first.split('\t');
    return Object.fromEntries(names.map((name, i) => [name, values[i] ?? '']));
  }

  async destroy(): Promise<void> {
    await this.stop();
    rmSync(this.dir, { recursive: true, force: true });
  }
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      server.close(() => resolve(port));
    });
    server.on('error', reject);
  });
}
