import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** A second, private MariaDB that a test may stop and start at will (the shared one stays up). */
export class ThrowawayMariaDb {
  readonly dir = mkdtempSync(join(tmpdir(), 'kc-mariadb-'));
  readonly socket = join(this.dir, 'mysqld.sock');
  port = 0;
  private process: ChildProcess | null = null;

  async init(): Promise<void> {
    this.port = await freePort();
    execFileSync(
      'mariadb-install-db',
      ['--no-defaults', `--datadir=${join(this.dir, 'data')}`, '--user=root', '--auth-root-authentication-method=normal', '--skip-test-db'],
      { stdio: 'ignore' },
    );
    await this.start();
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
