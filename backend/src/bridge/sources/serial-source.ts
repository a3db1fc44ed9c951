import type { Duplex } from 'node:stream';
import { parseScpiNumber } from '../oscillator-model.js';
import { numberReading, parseReadingLine, sleep, type Captured, type CounterSource, type SourceContext } from './counter-source.js';
import { LineChannel } from './line-channel.js';

/** What the source needs of a serial port: a duplex byte stream that opens on request. */
export type SerialPortLike = Duplex & { open(callback: (error: Error | null) => void): void };
export type SerialPortFactory = (address: SerialAddress) => Promise<SerialPortLike>;

/** The real port, through the serialport package (loaded only when a serial source is used). */
const openSerialPort: SerialPortFactory = async (address) => {
  const { SerialPort } = await import('serialport');
  return new SerialPort({
    path: address.path,
    baudRate: address.baudRate,
    dataBits: address.dataBits,
    parity: address.parity,
    stopBits: address.stopBits,
    autoOpen: false,
  });
};

export type SerialAddress = { path: string; baudRate: number; dataBits: 5 | 6 | 7 | 8; parity: 'none' | 'even' | 'odd'; stopBits: 1 | 2; query: string | null };

/** Parses `serial:/dev/ttyUSB0?baud=9600[&bits=8&parity=none&stop=1&query=FETC?]`. */
export function parseSerialAddress(source: string): SerialAddress {
  const match = /^serial:([^?]+)(?:\?(.*))?$/.exec(source);
  if (!match) throw new Error(`"${source}" is not a serial address; write serial:/dev/ttyUSB0?baud=9600`);
  const params = new URLSearchParams(match[2] ?? '');
  const known = new Set(['baud', 'bits', 'parity', 'stop', 'query']);
  for (const key of params.keys()) if (!known.has(key)) throw new Error(`unknown serial setting "${key}" (known: ${[...known].join(', ')})`);
  const baudRate = Number(params.get('baud') ?? 9600);
  const dataBits = Number(params.get('bits') ?? 8);
  const parity = params.get('parity') ?? 'none';
  const stopBits = Number(params.get('stop') ?? 1);
  if (!Number.isInteger(baudRate) || baudRate < 50 || baudRate > 4_000_000) throw new Error(`baud=${params.get('baud')} is not a baud rate`);
  if (![5, 6, 7, 8].includes(dataBits)) throw new Error('bits must be 5, 6, 7 or 8');
  if (parity !== 'none' && parity !== 'even' && parity !== 'odd') throw new Error('parity must be none, even or odd');
  if (stopBits !== 1 && stopBits !== 2) throw new Error('stop must be 1 or 2');
  return { path: match[1], baudRate, dataBits: dataBits as SerialAddress['dataBits'], parity, stopBits, query: params.get('query') };
}

/**
 * A counter on a serial line, through the serialport package. With a query (from the address or
 * --query) the bridge asks for each reading; without one it listens to a counter that sends readings
 * by itself, one a line.
 */
export class SerialSource implements CounterSource {
  readonly label: string;
  skipped = 0;
  private readonly abort = new AbortController();
  private port: Duplex | null = null;

  constructor(
    private readonly address: SerialAddress,
    private readonly options: { intervalMs: number; timeoutMs: number; dial?: number },
    private readonly openPort: SerialPortFactory = openSerialPort,
  ) {
    this.label = `serial counter on ${address.path} at ${address.baudRate} baud${address.query ? ` (${address.query})` : ' (listening)'}`;
  }

  async run(emit: (reading: Captured) => void, context: SourceContext): Promise<void> {
    while (!this.abort.signal.aborted) {
      const port = await this.openPort(this.address);
      const opened = await new Promise<Error | null>((resolve) => port.open((error) => resolve(error ?? null)));
      if (opened) {
        context.warn(`cannot open ${this.address.path}: ${opened.message}; trying again`);
        await sleep(2000, this.abort.signal);
        continue;
      }
      this.port = port;
      const channel = new LineChannel(port);
      const take = (line: string) => {
        const reading = this.readLine(line, context);
        if (reading) emit(reading);
      };
      while (!this.abort.signal.aborted && !channel.isClosed) {
        if (this.address.query) {
          const asked = performance.now();
          channel.send(this.address.query);
          const answer = await channel.next(this.options.timeoutMs);
          if (answer === null && !channel.isClosed) context.warn(`the counter did not answer "${this.address.query}" within ${this.options.timeoutMs} ms`);
          if (answer !== null) take(answer);
          await sleep(Math.max(0, this.options.intervalMs - (performance.now() - asked)), this.abort.signal);
        } else {
          const line = await channel.next(1000);
          if (line !== null) take(line);
        }
      }
      port.destroy();
      if (!this.abort.signal.aborted) context.warn(`${this.address.path} closed; opening it again`);
    }
  }

  stop(): void {
    this.abort.abort();
    this.port?.destroy();
  }

  private readLine(line: string, context: SourceContext): Captured | null {
    if (line.trim() === '') return null;
    const plain = numberReading(context.attach.dataKind, parseScpiNumber(line));
    if (plain) return this.options.dial === undefined ? plain : { dial: this.options.dial, ...plain };
    try {
      const reading = parseReadingLine(line, context.attach.dataKind);
      if (reading && this.options.dial !== undefined && reading.dial === undefined) reading.dial = this.options.dial;
      return reading;
    } catch (error) {
      this.skipped++;
      context.warn(`serial line "${line.trim()}" skipped: ${error instanceof Error ? error.message : String(error)}`);
      return null;
    }
  }
}
