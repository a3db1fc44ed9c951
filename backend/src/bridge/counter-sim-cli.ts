import { numberOption, parseArgs, UsageError } from './command-line.js';
import { CounterSimulator } from './counter-simulator.js';
import { PROFILES, type Profile } from './oscillator-model.js';

const USAGE = `Usage: bin/kilocycle counter-sim [--port 5025] [--profile warmup|sweep|stable] [options]

Serves a simulated frequency counter on a raw SCPI socket, so the bridge's TCP path can be tried
without a bench counter. It answers *IDN?, SYST:ERR?, *OPC? and the usual frequency queries
(MEAS:FREQ?, MEASure:FREQuency?, READ?, FETC?), one line each, in SCPI notation (+7.00012345678E+06).

The counter watches an LC oscillator: 'warmup' starts at power-on and drifts up to its settled
frequency (time constant 7 minutes of simulated time), 'stable' is already settled, 'sweep' moves the
dial across the span in 11 steps, 5 readings each. All carry white and flicker frequency noise.

Options:
  --port N            TCP port (default 5025; 0 picks a free one and prints it)
  --host ADDRESS      address to listen on (default 127.0.0.1)
  --profile NAME      warmup, sweep or stable (default warmup)
  --frequency HZ      dial setting as a frequency, for warmup and stable (default 7050000)
  --span LOW-HIGH     the oscillator's range in Hz (default 3500000-7500000)
  --speed N           simulated seconds per real second (default 1; 60 shows an hour a minute)
  --seed N            noise seed, to repeat a session exactly
  --help              this text

Stops on Ctrl-C. Example: bin/kilocycle counter-sim --port 5025 --profile warmup --speed 30`;

async function main(argv: string[]): Promise<void> {
  const args = parseArgs(argv, ['port', 'host', 'profile', 'frequency', 'span', 'speed', 'seed'], ['help']);
  if (args.flags.has('help')) {
    console.log(USAGE);
    return;
  }
  if (args.positional.length > 0) throw new UsageError(`unexpected argument "${args.positional[0]}"`);
  const profile = (args.values.get('profile') ?? 'warmup') as Profile;
  if (!PROFILES.includes(profile)) throw new UsageError(`--profile must be one of ${PROFILES.join(', ')}`);
  const spanText = args.values.get('span') ?? '3500000-7500000';
  const span = /^(\d+(?:\.\d+)?)-(\d+(?:\.\d+)?)$/.exec(spanText);
  if (!span || !(Number(span[2]) > Number(span[1])) || Number(span[1]) <= 0) throw new UsageError('--span must be LOW-HIGH in Hz, e.g. 3500000-7500000');
  const freqMinHz = Number(span[1]);
  const freqMaxHz = Number(span[2]);
  const frequency = numberOption(args, 'frequency', Math.min(freqMaxHz, Math.max(freqMinHz, 7_050_000)), { min: freqMinHz, max: freqMaxHz });
  const simulator = new CounterSimulator({
    profile,
    speed: numberOption(args, 'speed', 1, { min: 0.001, max: 100000 }),
    freqMinHz,
    freqMaxHz,
    dialKHz: frequency / 1000,
    seed: args.values.has('seed') ? numberOption(args, 'seed', 0, { min: 0, max: 2 ** 32 - 1, integer: true }) : undefined,
    log: (line) => process.stderr.write(line + '\n'),
  });
  const host = args.values.get('host') ?? '127.0.0.1';
  const wanted = numberOption(args, 'port', 5025, { min: 0, max: 65535, integer: true });
  const port = await simulator.listen(wanted, host).catch((error: NodeJS.ErrnoException) => {
    throw new Error(error.code === 'EADDRINUSE' ? `port ${wanted} is in use; pick another with --port` : error.message);
  });
  process.stderr.write(`Simulated counter (${profile}) answering SCPI on ${host}:${port}; Ctrl-C stops it\n`);
  // A closed terminal must not keep the simulator alive (EPIPE on stderr).
  process.stderr.on('error', () => undefined);
  const stop = () => {
    process.stderr.write(`Stopped after ${simulator.queries.frequency} readings\n`);
    const timer = setTimeout(() => process.exit(0), 1000);
    void simulator.close().then(() => {
      clearTimeout(timer);
      process.exit(0);
    });
  };
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
}

main(process.argv.slice(2)).catch((error: unknown) => {
  console.error(`kilocycle counter-sim: ${error instanceof Error ? error.message : String(error)}`);
  process.exit(1);
});
