import { connect, type Socket } from 'node:net';
import { parseScpiNumber } from '../oscillator-model.js';
import { numberReading, sleep, type Captured, type CounterSource, type SourceContext } from './counter-source.js';
import { LineChannel } from './line-channel.js';

export type ScpiOptions = { host: string; port: number; query: string; intervalMs: number; timeoutMs: number; dial?: number; setup?: string };

/** Parses `scpi://host[:port]` (port 5025, the usual raw SCPI socket, when left out). */
export function parseScpiAddress(source: string): { host: string; port: number } {
  const match = /^scpi:\/\/(\[[^\]]+\]|[^:/]+)(?::(\d+))?\/?$/.exec(source);
  if (!match) throw new Error(`"${source}" is not a SCPI address; write scpi://host:5025`);
  const port = match[2] === undefined ? 5025 : Number(match[2]);
  if (!Number.isInteger(port) || port < 1 || port > 65535) throw new Error(`port ${match[2]} is not a TCP port`);
  return { host: match[1].replace(/^\[|\]$/g, ''), port };
}

/**
 * A counter on a raw SCPI socket: asks *IDN? once per connection, then sends the query every interval
 * and reads one answer line. Reconnects by itself when the counter goes away.
 */
export class ScpiSource implements CounterSource {
  readonly label: string;
  skipped = 0;
  private readonly abort = new AbortController();
  private socket: Socket | null = null;

  constructor(private readonly options: ScpiOptions) {
    this.label = `SCPI counter at ${options.host}:${options.port} (${options.query})`;
  }

  async run(emit: (reading: Captured) => void, context: SourceContext): Promise<void> {
    let backoff = 250;
    while (!this.abort.signal.aborted) {
      const channel = await this.open().catch((error: unknown) => {
        context.warn(`counter at ${this.options.host}:${this.options.port}: ${error instanceof Error ? error.message : String(error)}; trying again`);
        return null;
      });
      if (!channel) {
        await sleep(backoff, this.abort.signal);
        backoff = Math.min(5000, backoff * 2);
        continue;
      }
      backoff = 250;
      channel.send('*IDN?');
      const idn = await channel.next(2000);
      if (idn) context.warn(`counter: ${idn.trim()}`);
      if (this.options.setup) channel.send(this.options.setup);
      while (!this.abort.signal.aborted && !channel.isClosed) {
        const asked = performance.now();
        channel.send(this.options.query);
        const answer = await channel.next(this.options.timeoutMs);
        if (answer === null) {
          if (!channel.isClosed && !this.abort.signal.aborted) {
            context.warn(`the counter did not answer "${this.options.query}" within ${this.options.timeoutMs} ms; check --query`);
            channel.drain();
          }
        } else {
          const reading = numberReading(context.attach.dataKind, parseScpiNumber(answer));
          if (reading === null) {
            this.skipped++;
            const what = context.attach.dataKind === 'phase' ? 'time interval' : 'frequency';
            context.warn(`the counter answered "${answer.trim()}", which is not a ${what}; reading skipped`);
          } else {
            emit(this.options.dial === undefined ? reading : { dial: this.options.dial, ...reading });
          }
        }
        await sleep(Math.max(0, this.options.intervalMs - (performance.now() - asked)), this.abort.signal);
      }
      this.socket?.destroy();
      if (!this.abort.signal.aborted) context.warn('the counter closed the connection; reconnecting');
    }
    this.socket?.destroy();
  }

  stop(): void {
    this.abort.abort();
    this.socket?.destroy();
  }

  private open(): Promise<LineChannel> {
    return new Promise((resolve, reject) => {
      const socket = connect({ host: this.options.host, port: this.options.port });
      socket.setNoDelay(true);
      const timer = setTimeout(() => {
        socket.destroy();
        reject(new Error('no connection within 3 s'));
      }, 3000);
      socket.once('connect', () => {
        clearTimeout(timer);
        this.socket = socket;
        resolve(new LineChannel(socket));
      });
      socket.once('error', (error) => {
        clearTimeout(timer);
        reject(error);
      });
    });
  }
}
