import type { Duplex } from 'node:stream';

/** Request/answer over a byte stream of text lines (a TCP socket or a serial port). */
export class LineChannel {
  private buffer = '';
  private readonly lines: string[] = [];
  private waiter: ((line: string | null) => void) | null = null;
  private closed = false;

  constructor(private readonly stream: Duplex) {
    stream.setEncoding('latin1');
    stream.on('data', (chunk: string) => {
      this.buffer += chunk;
      let cut = this.buffer.search(/\r?\n/);
      while (cut >= 0) {
        const line = this.buffer.slice(0, cut);
        this.buffer = this.buffer.slice(this.buffer[cut] === '\r' ? cut + 2 : cut + 1);
        this.push(line);
        cut = this.buffer.search(/\r?\n/);
      }
      // Guard against a device that never ends its lines.
      if (this.buffer.length > 65536) this.buffer = '';
    });
    const end = () => {
      this.closed = true;
      this.waiter?.(null);
      this.waiter = null;
    };
    stream.once('close', end);
    stream.once('end', end);
    stream.on('error', end);
  }

  get isClosed(): boolean {
    return this.closed;
  }

  /** Sends one line (the terminator is added). */
  send(text: string): void {
    this.stream.write(text + '\n');
  }

  /** The next line, or null when the stream closed or nothing came within timeoutMs. */
  next(timeoutMs: number): Promise<string | null> {
    if (this.lines.length > 0) return Promise.resolve(this.lines.shift()!);
    if (this.closed) return Promise.resolve(null);
    return new Promise((resolve) => {
      const timer = setTimeout(() => {
        this.waiter = null;
        resolve(null);
      }, timeoutMs);
      this.waiter = (line) => {
        clearTimeout(timer);
        resolve(line);
      };
    });
  }

  /** Forgets lines nobody asked for (a late answer after a timeout). */
  drain(): void {
    this.lines.length = 0;
  }

  private push(line: string): void {
    if (this.waiter) {
      const w = this.waiter;
      this.waiter = null;
      w(line);
    } else {
      this.lines.push(line);
    }
  }
}
