import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { createServer, connect as tcpConnect, type Server, type Socket } from 'node:net';
import { join } from 'node:path';
import { REPO_ROOT } from '../../src/config/app-config.js';

/** The compiled commands the tests run as real processes (bin/kilocycle runs the same files). */
export const DIST = {
  main: join(REPO_ROOT, 'backend', 'dist', 'main.js'),
  bridge: join(REPO_ROOT, 'backend', 'dist', 'bridge', 'bridge-cli.js'),
  counterSim: join(REPO_ROOT, 'backend', 'dist', 'bridge', 'counter-sim-cli.js'),
};

export function requireBuild(): void {
  for (const file of Object.values(DIST)) {
    if (!existsSync(file)) throw new Error(`${file} is missing: build first (npm run build -w common && npm run build -w backend)`);
  }
}

export async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const address = server.address();
  await new Promise<void>((resolve) => server.close(() => resolve()));
  if (!address || typeof address !== 'object') throw new Error('no free port');
  return address.port;
}

export type Child = { process: ChildProcess; stdout: () => string; stderr: () => string; exited: Promise<number | null> };

/** Starts `node FILE ARGS` with the test's environment (KC_DB_NAME and the rest) plus `env`. */
export function startNode(file: string, args: string[], env: Record<string, string> = {}): Child {
  const child = spawn(process.execPath, [file, ...args], { env: { ...process.env, NODE_OPTIONS: '', ...env }, stdio: ['pipe', 'pipe', 'pipe'] });
  let out = '';
  let err = '';
  child.stdout!.setEncoding('utf8').on('data', (d: string) => (out += d));
  child.stderr!.setEncoding('utf8').on('data', (d: string) => (err += d));
  const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
  return { process: child, stdout: () => out, stderr: () => err, exited };
}

export async function waitFor(what: string, check: () => Promise<boolean> | boolean, timeoutMs = 30000): Promise<void> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (await check()) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`timed out waiting for ${what}`);
}

/** The app as its own process on `port` (the tests restart it). */
export async function startServer(port: number): Promise<Child> {
  const server = startNode(DIST.main, [], { KC_PORT: String(port), KC_HOST: '127.0.0.1' });
  await waitFor(
    `the server on port ${port}`,
    async () => {
      if (server.process.exitCode !== null) throw new Error(`the server exited: ${server.stderr()}`);
      try {
        return (await fetch(`http://127.0.0.1:${port}/api/health`)).ok;
      } catch {
        return false;
      }
    },
    45000,
  );
  return server;
}

export async function stop(child: Child, signal: NodeJS.Signals = 'SIGTERM'): Promise<void> {
  if (child.process.exitCode !== null || child.process.signalCode !== null) return;
  child.process.kill(signal);
  await child.exited;
}

/**
 * A TCP relay between the bridge and the server that the test can cut: `cut()` destroys every
 * connection through it at once, as a pulled network cable or a dropped Wi-Fi link would.
 */
export class CuttableLink {
  private readonly server: Server;
  private readonly pairs = new Set<[Socket, Socket]>();
  cuts = 0;

  constructor(private readonly targetPort: number) {
    this.server = createServer((client) => {
      const upstream = tcpConnect({ host: '127.0.0.1', port: this.targetPort });
      const pair: [Socket, Socket] = [client, upstream];
      this.pairs.add(pair);
      const drop = () => {
        client.destroy();
        upstream.destroy();
        this.pairs.delete(pair);
      };
      client.on('error', drop).on('close', drop);
      upstream.on('error', drop).on('close', drop);
      client.pipe(upstream);
      upstream.pipe(client);
    });
  }

  listen(port: number): Promise<void> {
    return new Promise((resolve) => this.server.listen(port, '127.0.0.1', resolve));
  }

  get open(): number {
    return this.pairs.size;
  }

  /** Cuts every open connection; returns whether there was one to cut. */
  cut(): boolean {
    if (this.pairs.size === 0) return false;
    for (const [a, b] of this.pairs) {
      a.destroy();
      b.destroy();
    }
    this.pairs.clear();
    this.cuts++;
    return true;
  }

  close(): Promise<void> {
    this.cut();
    return new Promise((resolve) => this.server.close(() => resolve()));
  }
}
