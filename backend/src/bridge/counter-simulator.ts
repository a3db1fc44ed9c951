import { createServer, type Server, type Socket } from 'node:net';
import { LcOscillator, scpiNumber, type Profile } from './oscillator-model.js';

export type CounterSimulatorOptions = {
  profile: Profile;
  /** Time compression: simulated seconds per real second. */
  speed: number;
  /** Span of the simulated oscillator's dial (a direct-reading dial in kHz). */
  freqMinHz: number;
  freqMaxHz: number;
  /** Dial setting (kHz) for warmup and stable; sweeps move across the span by themselves. */
  dialKHz?: number;
  seed?: number;
  log?: (line: string) => void;
};

export const IDN = 'Kilocycle,Simulated frequency counter,KC-SIM-0001,1.0';

/** Headers (upper case, leading colon removed) that return a frequency reading. */
const FREQUENCY_QUERY = /^(MEAS(URE)?(:SCAL(AR)?)?(:FREQ(UENCY)?(:CW)?)?|READ|FETC(H)?|INIT;FETC(H)?|:?FETC(H)?:FREQ(UENCY)?|SENS(E)?:DATA)\?$/;

/**
 * A frequency counter on a raw SCPI socket (as on port 5025 of a bench counter): answers *IDN?,
 * SYST:ERR? and the usual frequency queries (MEAS:FREQ?, READ?, FETC?), one answer line each.
 * The reading comes from an LcOscillator whose clock runs `speed` times faster than real time.
 */
export class CounterSimulator {
  private readonly server: Server;
  private readonly oscillator: LcOscillator;
  private readonly started = performance.now();
  private readonly clients = new Set<Socket>();
  private lastError = '+0,"No error"';
  private lastT = 0;
  readonly queries = { total: 0, frequency: 0 };

  constructor(private readonly options: CounterSimulatorOptions) {
    const dialMin = options.freqMinHz / 1000;
    const dialMax = options.freqMaxHz / 1000;
    this.oscillator = new LcOscillator({
      profile: options.profile,
      dialMin,
      dialMax,
      freqMinHz: options.freqMinHz,
      freqMaxHz: options.freqMaxHz,
      dial: options.dialKHz,
      seed: options.seed,
      readingsPerPoint: 5,
    });
    this.server = createServer((socket) => this.serve(socket));
  }

  listen(port: number, host = '127.0.0.1'): Promise<number> {
    return new Promise((resolve, reject) => {
      this.server.once('error', reject);
      this.server.listen(port, host, () => {
        const address = this.server.address();
        resolve(typeof address === 'object' && address ? address.port : port);
      });
    });
  }

  close(): Promise<void> {
    for (const socket of this.clients) socket.destroy();
    return new Promise((resolve) => this.server.close(() => resolve()));
  }

  /** Answers one program message (commands separated by semicolons); null when nothing is to be sent. */
  answer(message: string): string | null {
    const replies: string[] = [];
    for (const part of message.split(';')) {
      const command = part.trim();
      if (command === '') continue;
      this.queries.total++;
      const [header] = command.split(/\s+/);
      const normal = header.toUpperCase().replace(/^:/, '');
      if (normal === '*IDN?') replies.push(IDN);
      else if (normal === '*RST' || normal === '*CLS' || normal === 'INIT' || normal.startsWith('CONF') || (normal.startsWith('SENS') && !normal.endsWith('?')))
        continue;
      else if (normal === '*OPC?') replies.push('1');
      else if (normal === 'SYST:ERR?' || normal === 'SYSTEM:ERROR?' || normal === 'SYST:ERR:NEXT?') {
        replies.push(this.lastError);
        this.lastError = '+0,"No error"';
      } else if (FREQUENCY_QUERY.test(normal)) {
        this.queries.frequency++;
        replies.push(scpiNumber(this.read()));
      } else {
        this.lastError = '-113,"Undefined header"';
        this.options.log?.(`unknown command "${command}" (answered nothing; SYST:ERR? reports -113)`);
      }
    }
    return replies.length > 0 ? replies.join(';') : null;
  }

  private read(): number {
    const t = Math.max(this.lastT, ((performance.now() - this.started) / 1000) * this.options.speed);
    this.lastT = t;
    return Math.round(this.oscillator.read(t).frequency * 1000) / 1000;
  }

  private serve(socket: Socket): void {
    this.clients.add(socket);
    socket.setNoDelay(true);
    socket.setEncoding('latin1');
    let buffer = '';
    socket.on('data', (chunk: string) => {
      buffer += chunk;
      let cut = buffer.indexOf('\n');
      while (cut >= 0) {
        const reply = this.answer(buffer.slice(0, cut).replace(/\r$/, ''));
        buffer = buffer.slice(cut + 1);
        if (reply !== null) socket.write(reply + '\n');
        cut = buffer.indexOf('\n');
      }
      if (buffer.length > 65536) buffer = '';
    });
    socket.on('error', () => socket.destroy());
    socket.on('close', () => this.clients.delete(socket));
  }
}
