import { io, type Socket } from 'socket.io-client';
import {
  INGEST_EVENTS,
  MAX_INGEST_BATCH,
  NAMESPACES,
  type AttachAck,
  type AttachReply,
  type ConnectRefusal,
  type IngestBatchReply,
  type Refusal,
} from '@kilocycle/common/events';
import type { Captured, CounterSource } from './sources/counter-source.js';
import { Spool, type BridgeReading } from './spool.js';

export type BridgeOptions = {
  server: string;
  token: string;
  runId: number;
  source: CounterSource;
  spoolPath: string;
  /** Most readings a batch (≤ 1000). */
  batchSize: number;
  /** Batches sent and not yet acknowledged, at most. */
  window: number;
  /** Stop after this many readings. */
  count?: number;
  /** What t = 0 is for readings the source does not time itself: the run's start, or this bridge's start. */
  timeZero: 'run' | 'now';
  ackTimeoutMs: number;
  /** How long Ctrl-C waits for the last acknowledgements before leaving the rest in the spool. */
  flushTimeoutMs: number;
  /** Status line: redrawn in place on a terminal, else one line every `statusEveryMs`. */
  statusEveryMs: number;
  stderr: NodeJS.WritableStream & { isTTY?: boolean };
};

export type BridgeStats = {
  captured: number;
  sent: number;
  resent: number;
  stored: number;
  duplicates: number;
  rejected: number;
  renumbered: number;
  skipped: number;
  spooled: number;
  lastSeq: number;
};

export type BridgeOutcome = { exitCode: number; message: string; stats: BridgeStats };

/** A reading on its way, with what the bridge knows about it. */
type Held = {
  reading: BridgeReading;
  /** Written to the spool file and not yet acknowledged. */
  spooled: boolean;
  sentOnce: boolean;
};

const plural = (n: number, noun: string) => `${n} ${noun}${n === 1 ? '' : 's'}`;

const FATAL_CONNECT: ReadonlyArray<ConnectRefusal['code']> = ['no_token', 'bad_token', 'bench_inactive'];
const MAX_REJECTION_LINES = 20;

/**
 * The bench side of live ingest. Numbers readings after the run's last seq (from the attach answer),
 * sends them in batches, keeps each until it is acknowledged, spools to an append-only file while
 * the server is unreachable and sends everything again on reconnect. Because every reading carries
 * its seq, a repeat is stored once; a reading is only forgotten once the server has answered for it.
 */
export class Bridge {
  readonly stats: BridgeStats = { captured: 0, sent: 0, resent: 0, stored: 0, duplicates: 0, rejected: 0, renumbered: 0, skipped: 0, spooled: 0, lastSeq: 0 };
  private readonly spool: Spool;
  private socket: Socket | null = null;
  private attach: AttachAck | null = null;
  private online = false;
  private nextSeq: number | null = null;
  private highestHeld = 0;
  private queue: Held[] = [];
  private readonly inflight = new Map<number, Held[]>();
  private batchNo = 0;
  private toSpool: Held[] = [];
  private spoolTimer: NodeJS.Timeout | null = null;
  private pumpScheduled = false;
  private retryTimer: NodeJS.Timeout | null = null;
  private statusTimer: NodeJS.Timeout | null = null;
  private rates: Array<{ at: number; acked: number }> = [];
  private rejectionLines = 0;
  private sourceStopped = false;
  private finishing: ((outcome: BridgeOutcome) => void) | null = null;
  private outcome: BridgeOutcome | null = null;
  private idleWaiters: Array<() => void> = [];
  private lastStatus = '';
  private state = 'connecting';

  constructor(private readonly options: BridgeOptions) {
    if (options.batchSize < 1 || options.batchSize > MAX_INGEST_BATCH) throw new Error(`--batch must be from 1 to ${MAX_INGEST_BATCH}`);
    this.spool = new Spool(options.spoolPath, options.runId);
  }

  /** Runs until the source ends (or stop()) and everything is acknowledged, or until the server refuses. */
  async run(): Promise<BridgeOutcome> {
    const left = await this.spool.open();
    for (const reading of left) {
      this.queue.push({ reading, spooled: true, sentOnce: true });
      this.highestHeld = Math.max(this.highestHeld, reading.seq);
    }
    this.stats.spooled = left.length;
    if (left.length > 0) this.say(`${plural(left.length, 'reading')} left in ${this.options.spoolPath} by an earlier bridge will be sent first`);
    const done = new Promise<BridgeOutcome>((resolve) => (this.finishing = resolve));
    this.startStatus();
    this.connect();
    const attached = await Promise.race([this.firstAttach(), done.then(() => null)]);
    if (attached) {
      this.say(
        `attached to run ${attached.runId} (${attached.kind}, ${attached.range.label}) as bench "${attached.benchName}"; numbering from seq ${this.nextSeq}; reading ${this.options.source.label}`,
      );
      void this.runSource(attached).then(() => this.drainThenFinish());
    }
    return done;
  }

  /** Ctrl-C: stop reading, send what is held, wait up to flushTimeoutMs for the acknowledgements. */
  stop(): void {
    if (this.outcome) return;
    this.stopSource();
    const timer = setTimeout(() => void this.finish(4, 'stopped before everything was acknowledged'), this.options.flushTimeoutMs);
    timer.unref();
    void this.drainThenFinish();
  }

  /** A second Ctrl-C: spool what is unacknowledged and stop now. */
  abort(): void {
    void this.finish(4, 'interrupted');
  }

  // ---- connection ---------------------------------------------------------------------------

  private connect(): void {
    const socket = io(this.options.server.replace(/\/$/, '') + NAMESPACES.ingest, {
      auth: { token: this.options.token },
      transports: ['websocket'],
      reconnection: true,
      reconnectionDelay: 200,
      reconnectionDelayMax: 2000,
      randomizationFactor: 0.3,
      timeout: 5000,
    });
    this.socket = socket;
    socket.on('connect', () => void this.onConnect(socket));
    socket.on('disconnect', (reason) => {
      this.onOffline(`disconnected (${reason})`);
      // The server ended the session itself (a restart, a replaced token): socket.io does not retry that alone.
      if (reason === 'io server disconnect' && !this.outcome) setTimeout(() => socket.connect(), 300).unref();
    });
    socket.on('connect_error', (error: Error & { data?: ConnectRefusal }) => {
      const code = error.data?.code;
      if (code && FATAL_CONNECT.includes(code)) {
        void this.finish(2, `the server refused the bench: ${error.message}`);
        return;
      }
      this.onOffline(`server unreachable (${error.message})`);
    });
  }

  private async onConnect(socket: Socket): Promise<void> {
    this.state = 'attaching';
    let reply: AttachReply;
    try {
      reply = (await socket.timeout(this.options.ackTimeoutMs).emitWithAck(INGEST_EVENTS.attach, { runId: this.options.runId })) as AttachReply;
    } catch {
      if (socket.connected) socket.disconnect().connect();
      return;
    }
    if (!socket.connected || this.outcome) return;
    if (!reply.ok) {
      if (reply.code === 'server_error') {
        this.say(`attach failed: ${reply.error}`);
        setTimeout(() => socket.connected && void this.onConnect(socket), 1000).unref();
      } else {
        void this.finish(2, `the server refused run ${this.options.runId}: ${reply.error}`);
      }
      return;
    }
    this.attach = reply;
    // A new process continues after the run's last seq (and after anything left in its own spool);
    // after a reconnect it keeps its own numbering unless another bridge has gone further meanwhile.
    this.nextSeq = Math.max(this.nextSeq ?? 0, reply.lastSeq + 1, this.highestHeld + 1);
    this.online = true;
    this.state = 'online';
    if (this.toSpool.length > 0) this.flushSpool();
    this.maybeClearSpool();
    this.schedulePump();
    for (const waiter of this.attachWaiters.splice(0)) waiter(reply);
  }

  private readonly attachWaiters: Array<(ack: AttachAck) => void> = [];
  private firstAttach(): Promise<AttachAck> {
    if (this.attach) return Promise.resolve(this.attach);
    return new Promise((resolve) => this.attachWaiters.push(resolve));
  }

  private onOffline(state: string): void {
    if (this.outcome) return;
    this.state = state;
    if (!this.online && this.inflight.size === 0) return this.spoolHeld();
    this.online = false;
    // Everything in flight may or may not have arrived: it goes back to the front, to be sent again.
    const back: Held[] = [];
    for (const batch of this.inflight.values()) for (const held of batch) back.push(held);
    this.inflight.clear();
    back.sort((a, b) => a.reading.seq - b.reading.seq);
    this.queue = back.concat(this.queue);
    this.spoolHeld();
  }

  // ---- readings -------------------------------------------------------------------------------

  private async runSource(attach: AttachAck): Promise<void> {
    const startedAt = this.options.timeZero === 'now' ? Date.now() : Date.parse(attach.startedAt);
    const emit = (captured: Captured) => {
      if (this.sourceStopped || this.nextSeq === null) return;
      if (this.options.count !== undefined && this.stats.captured >= this.options.count) return this.stopSource();
      const t = captured.t ?? Math.max(0, Math.round(Date.now() - startedAt) / 1000);
      const reading: BridgeReading =
        captured.timeInterval !== undefined
          ? { seq: this.nextSeq++, t, timeInterval: captured.timeInterval }
          : { seq: this.nextSeq++, t, frequency: captured.frequency! };
      if (captured.dial !== undefined && captured.dial !== null) reading.dial = captured.dial;
      const held: Held = { reading, spooled: false, sentOnce: false };
      this.highestHeld = Math.max(this.highestHeld, reading.seq);
      this.stats.captured++;
      this.queue.push(held);
      if (this.online) this.schedulePump();
      else this.spoolLater(held);
      if (this.options.count !== undefined && this.stats.captured >= this.options.count) this.stopSource();
    };
    try {
      await this.options.source.run(emit, { attach, warn: (message) => this.say(message) });
    } catch (error) {
      this.say(`the source stopped: ${error instanceof Error ? error.message : String(error)}`);
    }
    this.stats.skipped = this.options.source.skipped;
    this.sourceStopped = true;
  }

  private stopSource(): void {
    if (this.sourceStopped) return;
    this.sourceStopped = true;
    this.options.source.stop();
  }

  private schedulePump(): void {
    if (this.pumpScheduled) return;
    this.pumpScheduled = true;
    setImmediate(() => {
      this.pumpScheduled = false;
      this.pump();
    });
  }

  private pump(): void {
    const socket = this.socket;
    while (socket && this.online && socket.connected && this.inflight.size < this.options.window && this.queue.length > 0 && !this.outcome) {
      // In seq order: two writers on one run then take index locks in the same order (fewer deadlocks).
      const batch = this.queue.splice(0, this.options.batchSize).sort((a, b) => a.reading.seq - b.reading.seq);
      const id = ++this.batchNo;
      this.inflight.set(id, batch);
      for (const held of batch) {
        if (held.sentOnce) this.stats.resent++;
        else this.stats.sent++;
        held.sentOnce = true;
      }
      socket
        .timeout(this.options.ackTimeoutMs)
        .emit(INGEST_EVENTS.readings, { runId: this.options.runId, readings: batch.map((h) => h.reading) }, (error: Error | null, reply: IngestBatchReply) =>
          this.onAck(id, error, reply),
        );
    }
  }

  private onAck(id: number, error: Error | null, reply: IngestBatchReply | undefined): void {
    const batch = this.inflight.get(id);
    if (!batch) return; // already put back when the connection dropped
    this.inflight.delete(id);
    if (error || !reply) {
      this.say(`no acknowledgement within ${this.options.ackTimeoutMs} ms; sending again`);
      return this.putBack(batch);
    }
    if (!reply.ok) return this.onRefused(batch, reply);
    const conflict = new Set(reply.conflictSeqs);
    const renumbered: Held[] = [];
    for (const held of batch) {
      if (conflict.has(held.reading.seq)) {
        // Another reading holds this seq (a second bridge on the run got there first): number it afresh.
        held.reading = { ...held.reading, seq: Math.max(this.nextSeq ?? 0, reply.lastSeq + 1) };
        this.nextSeq = held.reading.seq + 1;
        this.highestHeld = Math.max(this.highestHeld, held.reading.seq);
        held.sentOnce = false;
        renumbered.push(held);
        this.stats.renumbered++;
        continue;
      }
      if (held.spooled) this.stats.spooled--;
    }
    this.stats.stored += reply.accepted;
    this.stats.duplicates += reply.duplicates;
    this.stats.rejected += reply.rejected.length;
    this.stats.lastSeq = Math.max(this.stats.lastSeq, reply.lastSeq);
    for (const r of reply.rejected) {
      if (this.rejectionLines++ < MAX_REJECTION_LINES) this.say(`seq ${r.seq ?? '?'} refused (${r.field}): ${r.reason}`);
      else if (this.rejectionLines === MAX_REJECTION_LINES + 1) this.say('more readings refused; the count is in the status line');
    }
    if (renumbered.length > 0) this.queue = renumbered.concat(this.queue);
    this.maybeClearSpool();
    this.schedulePump();
    this.checkIdle();
  }

  private onRefused(batch: Held[], refusal: Refusal): void {
    this.putBack(batch);
    if (refusal.code === 'server_error') {
      this.say(`the server could not store a batch: ${refusal.error}`);
      this.online = false;
      if (!this.retryTimer) {
        this.retryTimer = setTimeout(() => {
          this.retryTimer = null;
          if (this.socket?.connected) {
            this.online = true;
            this.schedulePump();
          }
        }, 1000);
      }
      return;
    }
    if (refusal.code === 'not_attached' && this.socket) {
      this.online = false;
      void this.onConnect(this.socket);
      return;
    }
    void this.finish(2, `the server refused the readings: ${refusal.error}`);
  }

  private putBack(batch: Held[]): void {
    this.queue = batch.concat(this.queue);
    this.schedulePump();
  }

  // ---- spool ----------------------------------------------------------------------------------

  private spoolLater(held: Held): void {
    this.toSpool.push(held);
    if (!this.spoolTimer) this.spoolTimer = setTimeout(() => this.flushSpool(), 100);
  }

  /** Everything held and not yet in the spool goes into it (the server is unreachable). */
  private spoolHeld(): void {
    for (const held of this.queue) if (!held.spooled) this.toSpool.push(held);
    this.flushSpool();
  }

  private flushSpool(): void {
    if (this.spoolTimer) clearTimeout(this.spoolTimer);
    this.spoolTimer = null;
    const fresh = this.toSpool.filter((h) => !h.spooled);
    this.toSpool = [];
    if (fresh.length === 0) return;
    for (const held of fresh) held.spooled = true;
    this.stats.spooled += fresh.length;
    this.spool.append(fresh.map((h) => h.reading)).catch((error: unknown) => this.say(`cannot write the spool ${this.options.spoolPath}: ${String(error)}`));
  }

  private maybeClearSpool(): void {
    if (this.stats.spooled <= 0 && this.spool.size > 0 && this.online) {
      // Held readings keep their `spooled` mark until acknowledged, so none is lost if this races a write.
      void this.spool.clear();
    }
  }

  // ---- finishing -----------------------------------------------------------------------------

  private checkIdle(): void {
    if (this.queue.length === 0 && this.inflight.size === 0) for (const waiter of this.idleWaiters.splice(0)) waiter();
  }

  private async drainThenFinish(): Promise<void> {
    while (!this.sourceStopped) await new Promise((r) => setTimeout(r, 50));
    if (!this.attach) return this.finish(4, 'stopped before the server answered: nothing was read');
    if (this.queue.length > 0 || this.inflight.size > 0) await new Promise<void>((resolve) => this.idleWaiters.push(resolve));
    const problems = this.stats.rejected + this.stats.skipped;
    await this.finish(
      problems > 0 ? 3 : 0,
      problems > 0
        ? `finished; ${plural(this.stats.rejected, 'reading')} refused by the server, ${plural(this.stats.skipped, 'input line')} skipped`
        : `finished; every reading acknowledged (${plural(this.stats.captured, 'reading')} read, last seq ${this.stats.lastSeq})`,
    );
  }

  private async finish(exitCode: number, message: string): Promise<void> {
    if (this.outcome) return;
    this.stopSource();
    this.outcome = { exitCode, message, stats: this.stats };
    this.state = exitCode === 0 ? 'done' : 'stopped';
    for (const batch of this.inflight.values()) this.queue.push(...batch);
    this.inflight.clear();
    const unacknowledged = this.queue.length;
    for (const held of this.queue) if (!held.spooled) this.toSpool.push(held);
    this.flushSpool();
    if (unacknowledged === 0) await this.spool.clear();
    await this.spool.close();
    this.socket?.disconnect();
    if (this.retryTimer) clearTimeout(this.retryTimer);
    if (this.statusTimer) clearInterval(this.statusTimer);
    this.drawStatus(true);
    if (unacknowledged > 0) {
      this.outcome = {
        exitCode: exitCode === 0 || exitCode === 3 ? 4 : exitCode,
        stats: this.stats,
        message: `${message}; ${plural(unacknowledged, 'reading')} not acknowledged ${unacknowledged === 1 ? 'is' : 'are'} kept in ${this.options.spoolPath}: run the bridge again on run ${this.options.runId} to send them`,
      };
    }
    this.finishing?.(this.outcome);
  }

  // ---- status ---------------------------------------------------------------------------------

  private startStatus(): void {
    const tty = Boolean(this.options.stderr.isTTY);
    this.statusTimer = setInterval(() => this.drawStatus(false), tty ? 250 : this.options.statusEveryMs);
    this.statusTimer.unref();
  }

  private statusText(): string {
    const now = Date.now();
    const acked = this.stats.stored + this.stats.duplicates + this.stats.rejected;
    this.rates.push({ at: now, acked });
    while (this.rates.length > 2 && now - this.rates[0].at > 5000) this.rates.shift();
    const first = this.rates[0];
    const rate = now - first.at > 0 ? ((acked - first.acked) * 1000) / (now - first.at) : 0;
    const n = (x: number) => x.toLocaleString('en-GB').replace(/,/g, ' ');
    return `run ${this.options.runId} · ${this.state} · sent ${n(this.stats.sent)} · acknowledged ${n(acked)} · spooled ${n(Math.max(0, this.stats.spooled))} · ${rate.toFixed(1)} readings/s · last seq ${n(this.stats.lastSeq)}`;
  }

  private drawStatus(final: boolean): void {
    const line = this.statusText();
    if (this.options.stderr.isTTY) {
      this.options.stderr.write(`\r\x1b[K${line}${final ? '\n' : ''}`);
      this.lastStatus = final ? '' : line;
    } else {
      this.options.stderr.write(line + '\n');
    }
  }

  /** A message above the status line. */
  private say(message: string): void {
    if (this.options.stderr.isTTY) this.options.stderr.write(`\r\x1b[K${message}\n${this.lastStatus}`);
    else this.options.stderr.write(message + '\n');
  }
}
