import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Redis } from 'ioredis';

export type PrivateRedis = { url: string; port: number; stop: () => Promise<void>; kill: () => void };

async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as { port: number };
  await new Promise((resolve) => server.close(resolve));
  return port;
}

/**
 * Debian's redis-server on a free loopback port, nothing saved to disk, for one test file (installed by
 * bin/kilocycle test). stop() ends it and removes its directory.
 */
export async function startPrivateRedis(port?: number): Promise<PrivateRedis> {
  const chosen = port ?? (await freePort());
  const dir = mkdtempSync(join(tmpdir(), 'kc-redis-'));
  const child: ChildProcess = spawn('redis-server', ['--port', String(chosen), '--bind', '127.0.0.1', '--save', '', '--appendonly', 'no', '--dir', dir], {
    stdio: 'ignore',
  });
  const url = `redis://127.0.0.1:${chosen}`;
  const probe = new Redis(url, { lazyConnect: true, retryStrategy: () => null, maxRetriesPerRequest: 0 });
  probe.on('error', () => undefined);
  for (let attempt = 0; ; attempt++) {
    try {
      await probe.connect();
      await probe.ping();
      break;
    } catch (error) {
      if (attempt > 50 || child.exitCode !== null) throw new Error(`redis-server did not start on port ${chosen}: ${String(error)}`, { cause: error });
      await new Promise((resolve) => setTimeout(resolve, 100));
    }
  }
  probe.disconnect();
  const exited = new Promise<void>((resolve) => (child.exitCode !== null ? resolve() : child.once('exit', () => resolve())));
  return {
    url,
    port: chosen,
    kill: () => child.kill('SIGKILL'),
    stop: async () => {
      child.kill('SIGTERM');
      await exited;
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
