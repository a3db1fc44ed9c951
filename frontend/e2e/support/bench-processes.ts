import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join, resolve } from 'node:path';

// The bench bridge and the SCPI counter simulator, run as the browser tests' own child processes.
// bin/kilocycle bridge and counter-sim exec exactly these files after making sure they are built. The tests run them
// directly: `bin/kilocycle test browser` has just built them, and a set-up step that may rebuild under the running
// server has no place in the middle of a test.
const ROOT = resolve(process.cwd(), '..');
const BRIDGE_DIST = join(ROOT, 'backend', 'dist', 'bridge');
export const BRIDGE = join(BRIDGE_DIST, 'bridge-cli.js');
export const COUNTER_SIM = join(BRIDGE_DIST, 'counter-sim-cli.js');
/** The simulator's own model (its warm-up time constant), read by the tests that check a fit against it. */
export const OSCILLATOR_MODEL = join(BRIDGE_DIST, 'oscillator-model.js');

/** A missing build is a failure of the test, never a reason to skip it: a bench journey cannot be shown without it. */
export function assertBridgeBuilt(extra: string[] = []) {
  const missing = [BRIDGE, COUNTER_SIM, ...extra].filter((file) => !existsSync(file));
  if (missing.length > 0) {
    throw new Error(
      `the bridge and counter simulator are not built (missing ${missing.join(', ')}): run \`bin/kilocycle test browser\`, which builds them first, or \`npm run build\``,
    );
  }
}

export type Child = { process: ChildProcess; output: () => string };

/** Starts a built node script with its output collected (stdout and stderr together). */
export function startNode(file: string, args: string[]): Child {
  const child = spawn(process.execPath, [file, ...args], { env: { ...process.env, NODE_OPTIONS: '' }, stdio: ['ignore', 'pipe', 'pipe'] });
  let output = '';
  child.stdout!.setEncoding('utf8').on('data', (d: string) => (output += d));
  child.stderr!.setEncoding('utf8').on('data', (d: string) => (output += d));
  return { process: child, output: () => output };
}

/** Stops a child with `signal`, then SIGKILL if it has not exited within 12 s. */
export async function stopChild(child: Child | null, signal: NodeJS.Signals = 'SIGTERM') {
  if (!child || child.process.exitCode !== null || child.process.signalCode !== null) return;
  const exited = new Promise((done) => child.process.once('exit', done));
  child.process.kill(signal);
  await Promise.race([exited, new Promise((done) => setTimeout(done, 12_000))]);
  if (child.process.exitCode === null && child.process.signalCode === null) child.process.kill('SIGKILL');
}

/** Polls `check` every 100 ms until it gives a value, or fails naming what it waited for. */
export async function until<T>(what: string, check: () => T | null | undefined, timeoutMs = 15_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = check();
    if (value !== null && value !== undefined) return value;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((done) => setTimeout(done, 100));
  }
}

/** The port a counter simulator started with `--port 0` says it answers on. */
export const simulatorPort = (counter: Child) => until('the counter simulator to listen', () => /answering SCPI on [\d.]+:(\d+)/.exec(counter.output())?.[1]);
