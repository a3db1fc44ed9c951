import type { AddressInfo } from 'node:net';
import { SMTPServer } from 'smtp-server';

export type CapturedMail = { raw: string; from: string; to: string[] };

/**
 * The local mail fake: an SMTP server on 127.0.0.1 that accepts every message and hands it to
 * `onMessage` (which stores it) before answering 250, so a sender that got its OK finds the row there.
 */
export class SmtpFake {
  private server: SMTPServer | null = null;
  port = 0;

  constructor(private readonly onMessage: (mail: CapturedMail) => Promise<void>) {}

  /** Listens on `port` (0 = any free one); when the port is taken, falls back to a free one. */
  async start(port: number, onFallback?: (wanted: number, got: number) => void): Promise<number> {
    try {
      this.port = await this.listen(port);
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code !== 'EADDRINUSE' || port === 0) throw error;
      this.port = await this.listen(0);
      onFallback?.(port, this.port);
    }
    return this.port;
  }

  private listen(port: number): Promise<number> {
    const server = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS', 'AUTH'],
      banner: 'Kilocycle local mail fake',
      logger: false,
      size: 30 * 1024 * 1024,
      onData: (stream, session, callback) => {
        const chunks: Buffer[] = [];
        stream.on('data', (chunk: Buffer) => chunks.push(chunk));
        stream.on('end', () => {
          const from = session.envelope.mailFrom ? session.envelope.mailFrom.address : '';
          const to = session.envelope.rcptTo.map((r) => r.address);
          this.onMessage({ raw: Buffer.concat(chunks).toString('utf8'), from, to }).then(
            () => callback(),
            (error: unknown) => callback(error instanceof Error ? error : new Error(String(error))),
          );
        });
      },
    });
    return new Promise((resolve, reject) => {
      const onError = (error: Error) => reject(error);
      server.once('error', onError);
      server.listen(port, '127.0.0.1', () => {
        server.off('error', onError);
        server.on('error', () => undefined);
        this.server = server;
        resolve((server.server.address() as AddressInfo).port);
      });
    });
  }

  async stop(): Promise<void> {
    const server = this.server;
    this.server = null;
    if (server) await new Promise<void>((resolve) => server.close(() => resolve()));
  }
}
