import { BadRequestException, ConflictException, Injectable, Logger, NotFoundException, type OnModuleDestroy } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { Subject, type Subscription } from 'rxjs';
import type { DataSource } from 'typeorm';
import { counterSettled, type CounterSettle } from '@kilocycle/common/math';
import {
  CALIBRATION_RUN_KINDS,
  type CaptureSettings,
  type CaptureState,
  type CaptureStatus,
  type CounterCapture,
  type Reading as ReadingView,
  type ReadingAuthor,
} from '@kilocycle/common/types';
import { runKindWords, runRefusalReason } from '@kilocycle/common/rules';
import { parseNumber } from '@kilocycle/common/units';
import { AuditService } from '../audit/audit.service.js';
import { organizationScope, type AuthUser } from '../shared/auth-user.js';
import { ReadingsWriter, type RunWriteContext, type StoredBatch } from '../readings/readings-writer.service.js';
import { RunReadingsReader } from '../readings/run-readings.reader.js';
import { assertMayWriteRun } from '../shared/run-write-guard.js';
import { BridgePresence } from '../shared/bridge-presence.js';
import { CaptureSettingsSource } from '../shared/capture-settings.js';

/** A dial typed at most this far outside the range's dial span (as a fraction of it) is refused, as the write path does. */
const DIAL_MARGIN = 0.1;

type Sample = { id: number; frequency: number };
type Waiting = {
  runId: number;
  /** The run as it was when the dial was typed; every batch that feeds the setting passed the ingest path's own check just before. */
  ctx: RunWriteContext;
  dial: number;
  startedAt: Date;
  startedBy: number;
  settings: CaptureSettings;
  samples: Sample[];
  state: CounterSettle;
  /** The bench whose bridge sent the counter readings: the setting's reading is stored as its reading. */
  bench: ReadingAuthor | null;
  timer: NodeJS.Timeout;
  /** The settle transaction is running: later readings are stored as usual but no longer judged. */
  writing: boolean;
};

const hms = (date: Date) => date.toISOString().slice(11, 19);
const hz = (value: number | null) => (value === null ? '—' : `${Number(value.toPrecision(6))} Hz`);

/**
 * Counter-assisted capture. The technician types a dial setting; the counter readings the run's bridge
 * stores after that moment (fed here from the write path as each batch commits, so any source the
 * bridge reads works: SCPI, serial, standard input) are judged by common's counterSettled rule. When the
 * last N agree within the procedure's band, one transaction stores their mean as the setting's reading,
 * the capture (n, SD, spread, rule) and its links to those N readings, and the audit event; the live
 * socket then tells the page. Esc abandons a setting; the procedure's timeout ends it with a message.
 * The waiting settings live in this process's memory, like the bridge presence they depend on.
 */
@Injectable()
export class CounterCaptureService implements OnModuleDestroy {
  private readonly logger = new Logger('CounterCapture');
  private readonly waiting = new Map<number, Waiting>();
  private readonly subscriptions: Subscription[] = [];
  /** Every change of a setting (progress, settled, ended), for the live gateway. */
  readonly events$ = new Subject<CounterCapture>();

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writer: ReadingsWriter,
    private readonly readings: RunReadingsReader,
    private readonly presence: BridgePresence,
    private readonly audit: AuditService,
    private readonly procedures: CaptureSettingsSource,
  ) {
    this.subscriptions.push(
      this.writer.stored$.subscribe((batch) => this.feed(batch)),
      this.presence.changes$.subscribe((change) => {
        const w = this.waiting.get(change.runId);
        if (!change.connected && w && !w.writing) {
          this.end(w, 'failed', `the bridge went offline at ${hms(change.since)} UTC before the counter settled; nothing was stored for dial ${w.dial}`);
        }
      }),
    );
  }

  onModuleDestroy(): void {
    for (const s of this.subscriptions) s.unsubscribe();
    for (const w of this.waiting.values()) clearTimeout(w.timer);
    this.waiting.clear();
  }

  /** Whether a setting on the run is taking counter readings (the ingest path then stores dial-less readings). */
  isWaiting(runId: number): boolean {
    return this.waiting.has(runId);
  }

  async current(user: AuthUser, runId: number): Promise<CaptureState> {
    const ctx = await this.visibleRun(user, runId);
    const settings = await this.settings(ctx);
    const w = this.waiting.get(runId);
    return { capture: w ? this.view(w, 'waiting') : null, nextMark: await this.nextMark(ctx, settings), settings };
  }

  async start(user: AuthUser, runId: number, dialInput: unknown): Promise<CounterCapture> {
    const ctx = await this.visibleRun(user, runId);
    assertMayWriteRun(user.role, ctx.kind);
    if (!CALIBRATION_RUN_KINDS.includes(ctx.kind)) {
      throw new ConflictException(
        `counter-assisted capture takes dial settings, for as-found and as-left runs; run ${runId} is a ${runKindWords(ctx.kind)} run`,
      );
    }
    const refusal = runRefusalReason(ctx);
    if (refusal) throw new ConflictException(`${refusal}; it takes no more readings`);
    const dial = this.parseDial(ctx, dialInput);
    if (ctx.benchId === null) throw new ConflictException(`run ${runId} has no bench, so no bridge can feed it: type the counter reading beside the dial`);
    const presence = this.presence.state(runId);
    if (!presence?.connected) {
      throw new ConflictException(
        `no bridge is connected for run ${runId}${presence ? ` (offline since ${hms(presence.since)} UTC)` : ''}: start the bench's bridge on this run, or type the counter reading beside the dial`,
      );
    }
    const before = this.waiting.get(runId);
    if (before) throw new ConflictException(`dial ${before.dial} is still waiting for the counter; abandon it (Esc) before typing the next setting`);
    const settings = await this.settings(ctx);
    // Checked again after the awaits: two Enters at once must not both start.
    if (this.waiting.has(runId)) throw new ConflictException(`dial ${this.waiting.get(runId)!.dial} is still waiting for the counter; abandon it (Esc) first`);
    const w: Waiting = {
      runId,
      ctx,
      dial,
      startedAt: new Date(),
      startedBy: user.id,
      settings,
      samples: [],
      state: counterSettled([], settings.captureSettleCount, settings.captureToleranceHz),
      bench: null,
      writing: false,
      timer: setTimeout(() => this.timedOut(runId), settings.captureTimeoutS * 1000),
    };
    w.timer.unref();
    this.waiting.set(runId, w);
    const view = this.view(w, 'waiting');
    this.events$.next(view);
    return view;
  }

  async abandon(user: AuthUser, runId: number): Promise<CounterCapture> {
    const ctx = await this.visibleRun(user, runId);
    assertMayWriteRun(user.role, ctx.kind);
    const w = this.waiting.get(runId);
    if (!w) throw new ConflictException(`no setting is waiting for the counter on run ${runId}`);
    if (w.writing) throw new ConflictException(`dial ${w.dial} has just settled and is being stored; it can no longer be abandoned`);
    return this.end(w, 'abandoned', `abandoned: nothing was stored for dial ${w.dial}`);
  }

  /** Counter readings stored in a run with a setting waiting: judged as each batch commits. */
  private feed(batch: StoredBatch): void {
    const w = this.waiting.get(batch.runId);
    if (!w || w.writing) return;
    const counter = batch.readings.filter((r) => r.source === 'bridge' && r.dial === null);
    if (counter.length === 0) return;
    for (const r of counter) w.samples.push({ id: r.id, frequency: r.frequency });
    w.bench = batch.author;
    w.state = counterSettled(
      w.samples.map((s) => s.frequency),
      w.settings.captureSettleCount,
      w.settings.captureToleranceHz,
    );
    if (w.state.settled) void this.settle(w, new Date());
    else this.events$.next(this.view(w, 'waiting'));
  }

  /** One transaction: the setting's reading (the mean), the capture row, its links to the N readings, the audit event. */
  private async settle(w: Waiting, settledAt: Date): Promise<void> {
    w.writing = true;
    clearTimeout(w.timer);
    const { mean, sd, spreadHz, window } = w.state;
    const samples = w.samples.slice(-window);
    try {
      // No fresh look at the run here: the batch that settled it was accepted by the ingest path a moment ago,
      // which checks that the run is open and its job unlocked, and every round trip here delays the page.
      const ctx = w.ctx;
      const bench = w.bench!;
      const reading = await this.dataSource.transaction(async (manager) => {
        const result = await this.writer.append(ctx, [{ dial: w.dial, frequency: mean! }], 'bridge', bench, { manager, callerAudits: true });
        const stored = result.stored[0];
        if (!stored) throw new CaptureFailure(`the settled mean ${hz(mean)} was not stored: ${result.rejected[0]?.reason ?? 'refused'}`);
        const insert = (await manager.query(
          `INSERT INTO counter_captures (run_id, reading_id, dial, n, mean_hz, sd_hz, spread_hz, settle_count, tolerance_hz, started_at, settled_at, started_by)
           VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
          [
            w.runId,
            stored.id,
            w.dial,
            window,
            mean,
            sd,
            spreadHz,
            w.settings.captureSettleCount,
            w.settings.captureToleranceHz,
            w.startedAt,
            settledAt,
            w.startedBy,
          ],
        )) as { insertId: number };
        await manager.query('INSERT INTO counter_capture_samples (reading_id, capture_id) VALUES ?', [samples.map((s) => [s.id, insert.insertId])]);
        await this.audit.record(
          {
            actorId: w.startedBy,
            entity: 'run',
            entityId: w.runId,
            action: 'counter_capture',
            changes: {
              dial: w.dial,
              seq: stored.seq,
              meanHz: mean,
              n: window,
              sdHz: sd,
              spreadHz,
              rule: { settleCount: w.settings.captureSettleCount, toleranceHz: w.settings.captureToleranceHz },
              counterReadingIds: samples.map((s) => s.id),
              bench: { id: bench.id, name: bench.name },
            },
          },
          manager,
        );
        return stored;
      });
      // The page waits for this event first; then the reading goes out as any stored reading does (the write
      // path pushes only what it commits itself, and this one was committed here).
      this.end(w, 'settled', null, { ...reading, author: bench }, settledAt);
      this.writer.stored$.next({ runId: w.runId, author: bench, readings: [reading] });
    } catch (error) {
      if (!(error instanceof CaptureFailure))
        this.logger.warn(`run ${w.runId}: storing dial ${w.dial} failed: ${error instanceof Error ? error.message : String(error)}`);
      this.end(
        w,
        'failed',
        error instanceof CaptureFailure
          ? error.message
          : `the settled reading could not be stored just now; nothing was stored for dial ${w.dial}, press Enter to take it again`,
      );
    }
  }

  private timedOut(runId: number): void {
    const w = this.waiting.get(runId);
    if (!w || w.writing) return;
    const n = w.settings.captureSettleCount;
    const why =
      w.samples.length < n
        ? `only ${w.samples.length} counter reading${w.samples.length === 1 ? '' : 's'} arrived in ${w.settings.captureTimeoutS} s and ${n} are needed (is the bridge reading the counter?)`
        : `the last ${n} counter readings still spread ${hz(w.state.spreadHz)}, more than the ${hz(w.settings.captureToleranceHz)} the procedure allows`;
    this.end(w, 'timed_out', `the counter did not settle within ${w.settings.captureTimeoutS} s: ${why}; nothing was stored for dial ${w.dial}`);
  }

  private end(
    w: Waiting,
    status: Exclude<CaptureStatus, 'waiting'>,
    message: string | null,
    reading: ReadingView | null = null,
    settledAt: Date | null = null,
  ): CounterCapture {
    clearTimeout(w.timer);
    if (this.waiting.get(w.runId) === w) this.waiting.delete(w.runId);
    const view = this.view(w, status, message, reading, settledAt);
    this.events$.next(view);
    return view;
  }

  private view(
    w: Waiting,
    status: CaptureStatus,
    message: string | null = null,
    reading: ReadingView | null = null,
    settledAt: Date | null = null,
  ): CounterCapture {
    const settled = status === 'settled';
    return {
      runId: w.runId,
      dial: w.dial,
      status,
      startedAt: w.startedAt.toISOString(),
      count: w.samples.length,
      spreadHz: w.state.spreadHz,
      lastHz: w.samples.at(-1)?.frequency ?? null,
      settleCount: w.settings.captureSettleCount,
      toleranceHz: w.settings.captureToleranceHz,
      timeoutS: w.settings.captureTimeoutS,
      reading,
      mean: settled ? w.state.mean : null,
      n: settled ? w.state.window : null,
      sd: settled ? w.state.sd : null,
      settledAt: settledAt ? settledAt.toISOString() : null,
      message,
    };
  }

  private parseDial(ctx: RunWriteContext, input: unknown): number {
    if (typeof input !== 'number' && typeof input !== 'string')
      throw new BadRequestException('dial: a dial setting is required (a number, or text such as "1750")');
    if (typeof input === 'string' && input.length > 40) throw new BadRequestException('dial: at most 40 characters');
    let dial: number;
    try {
      dial = parseNumber(input);
    } catch (error) {
      throw new BadRequestException(`dial: ${error instanceof Error ? error.message : String(error)}`);
    }
    const span = ctx.dialMax - ctx.dialMin;
    if (dial < ctx.dialMin - DIAL_MARGIN * span || dial > ctx.dialMax + DIAL_MARGIN * span) {
      throw new BadRequestException(`dial: dial ${dial} is outside the range's dial span ${ctx.dialMin} to ${ctx.dialMax} by more than 10 %`);
    }
    return dial;
  }

  private async visibleRun(user: AuthUser, runId: number): Promise<RunWriteContext> {
    const ctx = await this.writer.loadContext(runId);
    const scope = organizationScope(user);
    if (!ctx || (scope !== null && ctx.organizationId !== scope)) throw new NotFoundException(`Run ${runId} not found`);
    return ctx;
  }

  /** The settings of the procedure the run's job uses (its chosen one, else the default), read from budgets, which owns procedures. */
  private settings(ctx: RunWriteContext): Promise<CaptureSettings> {
    return this.procedures.forJob(ctx.jobId);
  }

  /** The first of the procedure's dial marks (in its order, within the range's dial span) the run has no reading at yet. */
  private async nextMark(ctx: RunWriteContext, settings: CaptureSettings): Promise<number | null> {
    const marks = settings.dialMarks.filter((m) => m >= ctx.dialMin && m <= ctx.dialMax);
    if (marks.length === 0) return null;
    const taken = await this.readings.includedDials(ctx.runId);
    return marks.find((m) => !taken.has(m)) ?? null;
  }
}

/** A settle that cannot be stored for a reason the person can act on (the sentence is shown as is). */
class CaptureFailure extends Error {}
