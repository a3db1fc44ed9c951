import { join, resolve } from 'node:path';
import { MAX_INGEST_BATCH } from '@kilocycle/common/events';
import { Bridge } from './bridge.js';
import { numberOption, parseArgs, UsageError } from './command-line.js';
import { PROFILES, type Profile } from './oscillator-model.js';
import type { CounterSource } from './sources/counter-source.js';
import { parseScpiAddress, ScpiSource } from './sources/scpi-source.js';
import { parseSerialAddress, SerialSource } from './sources/serial-source.js';
import { SimulateSource } from './sources/simulate-source.js';
import { StdinSource } from './sources/stdin-source.js';

export const DEFAULT_QUERY = 'MEAS:FREQ?';

const USAGE = `Usage: bin/kilocycle bridge --server URL --token TOKEN --run RUN_ID --source SOURCE [options]

Reads a frequency counter and streams its readings into a Kilocycle run, live. The run must be open
and assigned to the bench whose token you give (an admin issues tokens on the Benches page or with
bin/kilocycle bench token "<bench name>"). Readings are numbered after the run's last sequence
number, so a second bridge on the same run carries on where the first stopped. Every batch is kept
until the server acknowledges it; while the server is unreachable readings go to an append-only
spool file and are sent again on reconnect, so each reading is stored exactly once.

Caution: the equipment under test often holds hundreds of volts, also after switch-off. Follow your
local electrical codes and licensed practice; Kilocycle does not judge whether a procedure is safe.

Sources:
  scpi://HOST[:PORT]        a counter on a raw SCPI socket (port 5025 if left out); the bridge
                            sends --query every --interval and reads one answer line
  serial:DEVICE?baud=9600   a counter on a serial line (also bits=, parity=none|even|odd, stop=,
                            query=); without a query it listens for readings the counter sends
  stdin                     standard input, one reading a line: "frequency" or "dial,frequency"
                            (a unit may follow the frequency: 7.050 MHz; # starts a comment);
                            the bridge exits once the input ends and every reading is acknowledged
  simulate:warmup|sweep|stable
                            a simulated LC oscillator on the run's range: exponential warm-up, dial
                            error, white and flicker frequency noise; readings carry t = simulated
                            seconds since power-on

Options:
  --server URL              the Kilocycle server, e.g. http://127.0.0.1:5180
  --token TOKEN             the bench's token
  --run RUN_ID              the run to stream into
  --source SOURCE           see above
  --query TEXT              the counter's measurement query (default ${DEFAULT_QUERY}; READ? or FETC?
                            for counters set up to measure continuously)
  --setup TEXT              a command sent once after connecting to a SCPI counter (e.g. "*RST;CONF:FREQ")
  --dial VALUE              a fixed dial setting to attach to every reading (scpi, serial, simulate)
  --interval MS             time between readings (default 1000; fractions allowed for simulate)
  --speed N                 simulate: simulated seconds per real second (default 1)
  --seed N                  simulate: noise seed
  --count N                 stop after N readings
  --time-zero run|now       what t = 0 is for scpi, serial and stdin readings: the run's start
                            (default) or the moment this bridge starts reading (a warm-up begun by
                            switching on as the bridge starts; a second bridge would start at 0 again)
  --batch N                 most readings a batch (default 200, at most ${MAX_INGEST_BATCH})
  --window N                batches sent and not yet acknowledged, at most (default 4)
  --spool FILE              the spool file (default $KC_VAR_DIR/spool/run-RUN_ID.jsonl, or ./spool/)
  --timeout MS              how long to wait for a counter's answer or the server's acknowledgement
                            (default 10000)
  --status-every MS         when stderr is not a terminal, print the status line this often (default 5000)
  --help                    this text

The status line on stderr shows sent, acknowledged, spooled and the rate. Ctrl-C stops reading and
waits up to 10 s for the last acknowledgements (a second Ctrl-C stops at once); whatever is not
acknowledged stays in the spool for the next start.

Exit status: 0 every reading acknowledged and stored; 1 bad options or a start-up failure; 2 the
server refused the bench or the run (wrong or revoked token, run closed or not on this bench);
3 finished, but the server refused some readings or some input lines held none (reasons on stderr);
4 stopped before everything read was sent and acknowledged (what was read is kept in the spool).

Example: bin/kilocycle bridge --server http://127.0.0.1:5180 --token kcb_… --run 12 \\
           --source scpi://127.0.0.1:5025 --interval 1000`;

function buildSource(source: string, args: ReturnType<typeof parseArgs>): CounterSource {
  const timeoutMs = numberOption(args, 'timeout', 10000, { min: 100, max: 600000, integer: true });
  const dial = args.values.has('dial') ? numberOption(args, 'dial', 0, { min: -1e12, max: 1e12 }) : undefined;
  if (source === 'stdin' || source === '-') return new StdinSource();
  if (source.startsWith('simulate:')) {
    const profile = source.slice('simulate:'.length) as Profile;
    if (!PROFILES.includes(profile)) throw new UsageError(`simulate: needs one of ${PROFILES.join(', ')} (got "${profile}")`);
    return new SimulateSource({
      profile,
      intervalMs: numberOption(args, 'interval', 1000, { min: 0.01, max: 3_600_000 }),
      speed: numberOption(args, 'speed', 1, { min: 0.001, max: 100000 }),
      seed: args.values.has('seed') ? numberOption(args, 'seed', 0, { min: 0, max: 2 ** 32 - 1, integer: true }) : undefined,
      dial,
    });
  }
  const intervalMs = numberOption(args, 'interval', 1000, { min: 0, max: 3_600_000, integer: true });
  if (source.startsWith('scpi://')) {
    const { host, port } = parseScpiAddress(source);
    return new ScpiSource({ host, port, query: args.values.get('query') ?? DEFAULT_QUERY, setup: args.values.get('setup'), intervalMs, timeoutMs, dial });
  }
  if (source.startsWith('serial:')) {
    const address = parseSerialAddress(source);
    if (args.values.has('query')) address.query = args.values.get('query')!;
    return new SerialSource(address, { intervalMs, timeoutMs, dial });
  }
  throw new UsageError(`unknown source "${source}": use scpi://host:5025, serial:/dev/ttyUSB0?baud=9600, stdin or simulate:warmup|sweep|stable`);
}

async function main(argv: string[]): Promise<number> {
  const args = parseArgs(
    argv,
    [
      'server',
      'token',
      'run',
      'source',
      'query',
      'setup',
      'dial',
      'interval',
      'speed',
      'seed',
      'count',
      'time-zero',
      'batch',
      'window',
      'spool',
      'timeout',
      'status-every',
    ],
    ['help'],
  );
  if (args.flags.has('help')) {
    console.log(USAGE);
    return 0;
  }
  if (args.positional.length > 0) throw new UsageError(`unexpected argument "${args.positional[0]}"`);
  const missing = ['server', 'token', 'run', 'source'].filter((name) => !args.values.has(name));
  if (missing.length > 0) throw new UsageError(`missing ${missing.map((m) => `--${m}`).join(', ')} (see --help)`);
  const server = args.values.get('server')!;
  if (!/^https?:\/\/[^/]+/.test(server)) throw new UsageError(`--server must be an http:// or https:// address (got "${server}")`);
  const runId = numberOption(args, 'run', 0, { min: 1, max: 2_147_483_647, integer: true });
  const source = buildSource(args.values.get('source')!, args);
  const timeZero = args.values.get('time-zero') ?? 'run';
  if (timeZero !== 'run' && timeZero !== 'now') throw new UsageError('--time-zero must be run or now');
  const spoolPath = resolve(args.values.get('spool') ?? join(process.env.KC_VAR_DIR ?? '.', 'spool', `run-${runId}.jsonl`));
  const bridge = new Bridge({
    server,
    token: args.values.get('token')!,
    runId,
    source,
    spoolPath,
    batchSize: numberOption(args, 'batch', 200, { min: 1, max: MAX_INGEST_BATCH, integer: true }),
    window: numberOption(args, 'window', 4, { min: 1, max: 64, integer: true }),
    count: args.values.has('count') ? numberOption(args, 'count', 0, { min: 1, max: 1e9, integer: true }) : undefined,
    timeZero,
    ackTimeoutMs: numberOption(args, 'timeout', 10000, { min: 100, max: 600000, integer: true }),
    flushTimeoutMs: 10000,
    statusEveryMs: numberOption(args, 'status-every', 5000, { min: 100, max: 3_600_000, integer: true }),
    stderr: process.stderr,
  });
  let interrupts = 0;
  const interrupt = () => {
    interrupts++;
    if (interrupts === 1) {
      process.stderr.write('\nStopping: sending what is held (Ctrl-C again to stop at once) …\n');
      bridge.stop();
    } else {
      bridge.abort();
    }
  };
  process.on('SIGINT', interrupt);
  process.on('SIGTERM', interrupt);
  const outcome = await bridge.run();
  process.stderr.write(`${outcome.message}\n`);
  return outcome.exitCode;
}

main(process.argv.slice(2)).then(
  (code) => process.exit(code),
  (error: unknown) => {
    process.stderr.write(`kilocycle bridge: ${error instanceof Error ? error.message : String(error)}\n`);
    process.exit(1);
  },
);
