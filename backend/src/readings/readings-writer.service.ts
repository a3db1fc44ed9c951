import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { Subject } from 'rxjs';
import type { DataSource, EntityManager } from 'typeorm';
import {
  CALIBRATION_RUN_KINDS,
  type IngestAck,
  type Reading as ReadingView,
  type ReadingAuthor,
  type ReadingInput,
  type ReadingSource,
} from '@kilocycle/common/types';
import { outsideSpan, parseFrequency, parseNumber, parseTimeInterval, SPAN_MARGIN, spanLimits } from '@kilocycle/common/units';
import { mixedRunRefusal } from '@kilocycle/common/rules';
import { AuditService } from '../audit/audit.service.js';
import { RunContextReader, type RunWriteContext } from '../runs/run-context.reader.js';
import { RunCountersWriter } from '../runs/run-counters.writer.js';

export type { RunWriteContext };

export const MAX_BATCH = 1000;
/** Frequencies above this are refused as implausible for the equipment a lab of this kind measures. */
export const MAX_FREQUENCY_HZ = 1e11;
/** A reading's time since the run started may be at most 31 days. */
export const MAX_T_SECONDS = 31 * 86400;
const DIAL_MARGIN = 0.1;

/**
 * Which readings outside the range's span (by more than SPAN_MARGIN of it) are stored as given:
 * 'each' those marked `confirmed: true` (typed through the API), 'all' every one (an import the person
 * confirmed), 'none' none (a bench: the bridge has no one to confirm, so such readings are refused).
 */
export type SpanConfirmation = 'each' | 'all' | 'none';

/** A stored reading as the writer knows it: the batch's author is kept once, beside the readings. */
export type StoredReading = Omit<ReadingView, 'author'>;
export type StoredBatch = { runId: number; author: ReadingAuthor; readings: StoredReading[] };
export type ExcludedReading = { runId: number; reading: ReadingView };
export type AppendResult = IngestAck & { stored: StoredReading[] };
/** For callers that write many batches as one (CSV import). */
export type AppendOptions = {
  /** Write inside this transaction instead of one of its own; the caller commits (and pushes to stored$ if it wants). */
  manager?: EntityManager;
  /** Do not read the stored readings back (`stored` is then empty): bulk writes that need only the counts. */
  skipReadBack?: boolean;
  /** The caller records one audit event for all its batches (CSV import); the writer records none. */
  callerAudits?: boolean;
  /** Default: 'each' for typed readings (source manual), 'none' otherwise. */
  confirm?: SpanConfirmation;
  /**
   * A counter-assisted setting is waiting on this run: a bridge reading without a dial is a counter reading
   * for it and is stored without one (a calibration run otherwise needs a dial on every reading).
   */
  counterReadings?: boolean;
};

type Row = { seq: number | null; t: number; dial: number | null; frequency: number; aux: number | null };

/** The author columns of a stored reading: a user for typed and imported readings, a bench for the bridge's. */
function authorColumns(source: ReadingSource, author: ReadingAuthor): { enteredBy: number | null; benchId: number | null } {
  if (!Number.isInteger(author.id) || author.id < 1) throw new Error('ReadingsWriter: an author needs a whole-number id');
  if ((source === 'bridge') !== (author.kind === 'bench')) throw new Error(`ReadingsWriter: a ${source} reading cannot be entered by a ${author.kind}`);
  return author.kind === 'bench' ? { enteredBy: null, benchId: author.id } : { enteredBy: author.id, benchId: null };
}

/**
 * The one write path for readings: the bench page, CSV import and the bridge all come through here.
 * Each reading is validated on its own; the valid ones are stored with one multi-row INSERT IGNORE,
 * so a (run, seq) pair is stored exactly once however often it is sent.
 */
@Injectable()
export class ReadingsWriter {
  /** Every batch that stored at least one reading; the live gateway pushes these to browsers. */
  readonly stored$ = new Subject<StoredBatch>();
  /** Every reading excluded (by ReadingsService), for the same listeners. */
  readonly excluded$ = new Subject<ExcludedReading>();

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
    private readonly runs: RunContextReader,
    private readonly counters: RunCountersWriter,
  ) {}

  /** The run as the write path needs it (from the runs module), or null when there is no such run. */
  loadContext(runId: number): Promise<RunWriteContext | null> {
    return this.runs.writeContext(runId);
  }

  /**
   * Checks every reading; returns the rows to store and the refused ones, each with its reason. A
   * frequency outside the range's span by more than SPAN_MARGIN of it (a unit slip, usually) is refused
   * with what it was read as and what was probably meant, unless `confirm` lets it through.
   */
  validate(
    ctx: RunWriteContext,
    inputs: readonly ReadingInput[],
    now = Date.now(),
    confirm: SpanConfirmation = 'none',
    counterReadings = false,
  ): { rows: Row[]; rejected: IngestAck['rejected'] } {
    const rows: Row[] = [];
    const rejected: IngestAck['rejected'] = [];
    const needsDial = CALIBRATION_RUN_KINDS.includes(ctx.kind) && !counterReadings;
    const phase = ctx.dataKind === 'phase';
    const span = ctx.dialMax - ctx.dialMin;
    const dialLow = ctx.dialMin - DIAL_MARGIN * span;
    const dialHigh = ctx.dialMax + DIAL_MARGIN * span;
    // Once per batch; each reading then costs two comparisons (the ingest path allocates nothing more).
    const limits = spanLimits(ctx.freqMinHz, ctx.freqMaxHz, SPAN_MARGIN);
    const freqLow = limits.low;
    const freqHigh = limits.high;
    inputs.forEach((input, index) => {
      const rawSeq = (input as { seq?: unknown } | null)?.seq;
      const seq = Number.isInteger(rawSeq) ? (rawSeq as number) : null;
      const refuse = (field: string, reason: string) => rejected.push({ seq, index, field, reason });
      if (input === null || typeof input !== 'object') return refuse('reading', 'each reading must be an object');
      if (rawSeq !== undefined && (seq === null || seq < 1 || seq > 2_147_483_647)) {
        return refuse('seq', 'seq must be a whole number from 1 to 2147483647');
      }
      // A run holds one kind of reading: a reading of the other kind (or of both) would make it a mixed run.
      const given = input.timeInterval !== undefined && input.timeInterval !== null ? 'phase' : 'frequency';
      const mixed =
        given === 'phase' && input.frequency !== undefined && input.frequency !== null
          ? 'a reading gives either frequency or timeInterval, not both (a run holds one kind)'
          : mixedRunRefusal(ctx.runId, ctx.dataKind, given);
      if (mixed) return refuse(given === 'phase' ? 'timeInterval' : 'frequency', mixed);
      let frequency: number;
      if (phase) {
        try {
          frequency = parseTimeInterval(input.timeInterval!);
        } catch (error) {
          return refuse('timeInterval', error instanceof Error ? error.message : String(error));
        }
      } else {
        try {
          if (typeof input.frequency !== 'number' && typeof input.frequency !== 'string')
            throw new Error('frequency is required (a number in Hz or text such as "1.735 MHz")');
          frequency = parseFrequency(input.frequency, 'Hz');
        } catch (error) {
          return refuse('frequency', error instanceof Error ? error.message : String(error));
        }
        if (frequency > MAX_FREQUENCY_HZ) return refuse('frequency', `frequency ${frequency} Hz is above the ${MAX_FREQUENCY_HZ} Hz limit`);
      }
      let dial: number | null = null;
      if (input.dial !== undefined && input.dial !== null && input.dial !== '') {
        try {
          dial = parseNumber(input.dial);
        } catch (error) {
          return refuse('dial', error instanceof Error ? error.message : String(error));
        }
        if (dial < dialLow || dial > dialHigh) {
          return refuse('dial', `dial ${dial} is outside the range's dial span ${ctx.dialMin} to ${ctx.dialMax} by more than 10 %`);
        }
      } else if (needsDial) {
        return refuse('dial', `a dial setting is required in an ${ctx.kind} run`);
      }
      let t: number;
      if (input.t === undefined || input.t === null) {
        t = Math.max(0, (now - ctx.startedAt.getTime()) / 1000);
      } else if (typeof input.t !== 'number' || !Number.isFinite(input.t) || input.t < 0 || input.t > MAX_T_SECONDS) {
        return refuse('t', `t must be seconds since the run started, from 0 to ${MAX_T_SECONDS}`);
      } else {
        t = input.t;
      }
      let aux: number | null = null;
      if (input.aux !== undefined && input.aux !== null) {
        if (typeof input.aux !== 'number' || !Number.isFinite(input.aux)) return refuse('aux', 'aux must be a finite number');
        aux = input.aux;
      }
      // Last, so that a reading with a plain error is refused for that (it cannot be confirmed away).
      if (confirm === 'each' && input.confirmed !== undefined && typeof input.confirmed !== 'boolean')
        return refuse('confirmed', 'confirmed must be true or false');
      // A phase reading is a time interval, not a frequency: the range's span does not bound it.
      if (!phase && (frequency < freqLow || frequency > freqHigh) && confirm !== 'all' && !(confirm === 'each' && input.confirmed === true)) {
        const { message } = outsideSpan(input.frequency!, frequency, ctx.freqMinHz, ctx.freqMaxHz, SPAN_MARGIN, limits);
        if (confirm === 'each') return rejected.push({ seq, index, field: 'frequency', reason: message, confirmable: true });
        return refuse('frequency', confirm === 'none' && input.confirmed === true ? `${message} (a bench cannot confirm a reading outside the span)` : message);
      }
      rows.push({ seq, t, dial, frequency, aux });
    });
    return { rows, rejected };
  }

  /**
   * Validates and stores a batch, each reading with its author (the user, or the bench for the bridge).
   * Every batch first locks its run's row and reads the run's last seq there (writers of one run take turns):
   * readings without a seq (typed at the bench) are numbered after it, and the run's counters (readings, last
   * seq) move in the same transaction as the INSERT, so the answer's lastSeq is exact. A batch that stores anything writes one
   * audit event (entity run, action readings: counts, seq range, source, author) in the same
   * transaction as its INSERT, so the answer, sent after the commit, covers both.
   * With `options.manager` the batch joins the caller's transaction (a CSV import commits many
   * batches at once) and nothing is pushed to stored$: only the caller knows when it commits.
   */
  async append(
    ctx: RunWriteContext,
    inputs: readonly ReadingInput[],
    source: ReadingSource,
    author: ReadingAuthor,
    options: AppendOptions = {},
  ): Promise<AppendResult> {
    const columns = authorColumns(source, author);
    const { rows, rejected } = this.validate(
      ctx,
      inputs,
      Date.now(),
      options.confirm ?? (source === 'manual' ? 'each' : 'none'),
      options.counterReadings === true && source === 'bridge',
    );
    if (rows.length === 0) {
      return { accepted: 0, duplicates: 0, rejected, lastSeq: await this.lastSeq(ctx.runId, options.manager), stored: [] };
    }
    const write = async (manager: EntityManager): Promise<{ inserted: number; stored: StoredReading[]; lastSeq: number }> => {
      // The receipt time is set here rather than by the column default, so the views pushed to the
      // browsers carry exactly what is stored without reading the rows back.
      const receivedAt = new Date();
      const received = receivedAt.toISOString().replace('T', ' ').slice(0, 23);
      const insertSql = () =>
        `INSERT IGNORE INTO readings (run_id, seq, t_s, dial, frequency_hz, aux, source, received_at, ${columns.benchId === null ? 'entered_by' : 'bench_id'}) VALUES ${valuesList(ctx.runId, rows, source, received, columns)}`;
      type InsertResult = { affectedRows?: number; insertId?: number | string };
      let last: number | null;
      let result: InsertResult;
      if (rows.every((r) => r.seq !== null)) {
        // Numbered by the sender (a bench): the lock and the INSERT are queued on the connection together, so the
        // INSERT goes the moment the lock is granted instead of after this process's next turn (other batches'
        // work) while the run's other writers wait on the lock.
        [last, result] = await Promise.all([this.counters.lockLastSeq(ctx.runId, manager), manager.query(insertSql()) as Promise<InsertResult>]);
      } else {
        last = await this.counters.lockLastSeq(ctx.runId, manager);
        let next = last ?? 0;
        for (const row of rows) if (row.seq === null) row.seq = ++next;
        result = (await manager.query(insertSql())) as InsertResult;
      }
      if (last === null) throw new Error(`ReadingsWriter: run ${ctx.runId} is gone`);
      let topSeq = last;
      for (const row of rows) if (row.seq! > topSeq) topSeq = row.seq!;
      const insertedRows = Number(result.affectedRows ?? 0);
      if (options.skipReadBack) {
        await Promise.all([
          this.counters.addReadings(ctx.runId, insertedRows, topSeq, manager),
          !options.callerAudits && insertedRows > 0
            ? this.recordBatch(manager, ctx.runId, source, author, {
                accepted: insertedRows,
                duplicates: rows.length - insertedRows,
                rejected: rejected.length,
                firstSeq: null,
                lastSeq: null,
              })
            : null,
        ]);
        return { inserted: insertedRows, stored: [], lastSeq: topSeq };
      }
      const returned = await this.storedIds(manager, ctx.runId, rows, insertedRows, Number(result.insertId ?? 0));
      const bySeq = new Map<number, Row>();
      for (const r of rows) if (!bySeq.has(r.seq!)) bySeq.set(r.seq!, r);
      const iso = receivedAt.toISOString();
      const stored = returned
        .map(({ id, seq }): StoredReading => {
          const r = bySeq.get(Number(seq))!;
          // No author on each reading: the fan-out would encode it thousands of times a second.
          return {
            id: Number(id),
            seq: Number(seq),
            t: r.t,
            dial: r.dial,
            frequency: r.frequency,
            aux: r.aux,
            source,
            receivedAt: iso,
            excluded: false,
            excludedReason: null,
          };
        })
        .sort((a, b) => a.seq - b.seq);
      // The counters and the audit event, queued together on the connection (see above).
      await Promise.all([
        this.counters.addReadings(ctx.runId, stored.length, topSeq, manager),
        !options.callerAudits && stored.length > 0
          ? this.recordBatch(manager, ctx.runId, source, author, {
              accepted: stored.length,
              duplicates: rows.length - stored.length,
              rejected: rejected.length,
              firstSeq: stored[0]!.seq,
              lastSeq: stored[stored.length - 1]!.seq,
            })
          : null,
      ]);
      // A valid reading not stored now was stored before, at or below the run's last seq: so this is the run's last seq.
      return { inserted: stored.length, stored, lastSeq: topSeq };
    };
    // The INSERT and its audit event commit together; a batch that stores nothing writes no event.
    const { inserted, stored, lastSeq } = options.manager ? await write(options.manager) : await this.dataSource.transaction(write);
    if (!options.manager && stored.length > 0) this.stored$.next({ runId: ctx.runId, author, readings: stored });
    return { accepted: inserted, duplicates: rows.length - inserted, rejected, lastSeq, stored };
  }

  /**
   * The id and seq of each row the INSERT IGNORE just stored. The batch holds its run's row lock (lockLastSeq), so
   * no other statement stores readings in this run until it commits: every reading of the run with an id from the
   * statement's first one on is this statement's. When every row was stored and the server hands a multi-row
   * INSERT one block of ids (innodb_autoinc_lock_mode 0 or 1, MariaDB's default 1), the ids are that block in
   * row order and nothing is read back; otherwise (a duplicate was skipped, or lock mode 2) they are read back
   * by that rule. Before, RETURNING sent every stored row back: a result set of a thousand rows per batch for
   * the server to build and the app to parse.
   */
  private async storedIds(
    manager: EntityManager,
    runId: number,
    rows: readonly Row[],
    inserted: number,
    firstId: number,
  ): Promise<Array<{ id: number | string; seq: number }>> {
    if (inserted === 0) return [];
    if (inserted === rows.length && (await this.consecutiveIds())) return rows.map((r, i) => ({ id: firstId + i, seq: r.seq! }));
    return manager.query('SELECT id, seq FROM readings WHERE run_id = ? AND id >= ?', [runId, firstId]);
  }

  private blockIds: Promise<boolean> | null = null;
  /** Whether the database gives a multi-row INSERT consecutive ids (asked once per process). */
  private consecutiveIds(): Promise<boolean> {
    this.blockIds ??= this.dataSource
      .query('SELECT @@innodb_autoinc_lock_mode AS mode')
      .then(([row]: Array<{ mode: number | string }>) => Number(row.mode) !== 2)
      .catch(() => false);
    return this.blockIds;
  }

  /** One audit event for one stored batch (not one per reading: a bench may send thousands a second). */
  private recordBatch(
    manager: EntityManager,
    runId: number,
    source: ReadingSource,
    author: ReadingAuthor,
    counts: { accepted: number; duplicates: number; rejected: number; firstSeq: number | null; lastSeq: number | null },
  ): Promise<void> {
    return this.audit.record(
      {
        actorId: author.kind === 'user' ? author.id : null,
        entity: 'run',
        entityId: runId,
        action: 'readings',
        changes: { source, ...counts, author: { kind: author.kind, id: author.id, name: author.name } },
      },
      manager,
    );
  }

  /** The run's last stored seq, from its counters (0 before its first reading or when there is no such run). */
  async lastSeq(runId: number, manager?: EntityManager): Promise<number> {
    return (await this.runs.counters(runId, manager))?.lastSeq ?? 0;
  }
}

const SQL_SAFE_SOURCE = /^[a-z]+$/;
const SQL_SAFE_TIME = /^\d{4}-\d{2}-\d{2} \d{2}:\d{2}:\d{2}\.\d{3}$/;

/**
 * The VALUES list of a batch, written directly: every field is a validated finite number, null, the
 * source (one of three words) or our own time stamp, so nothing needs escaping. A driver's generic
 * escaping of 8,000 values a batch was a measurable share of the server's time on the ingest path.
 */
function valuesList(
  runId: number,
  rows: readonly Row[],
  source: ReadingSource,
  received: string,
  author: { enteredBy: number | null; benchId: number | null },
): string {
  if (!Number.isInteger(runId) || !SQL_SAFE_SOURCE.test(source) || !SQL_SAFE_TIME.test(received))
    throw new Error('valuesList: unexpected run id, source or time');
  const id = (x: number | null) => {
    if (x === null) return 'NULL';
    if (!Number.isInteger(x)) throw new Error('valuesList: an author id is not a whole number');
    return String(x);
  };
  const num = (x: number | null) => {
    if (x === null) return 'NULL';
    if (typeof x !== 'number' || !Number.isFinite(x)) throw new Error('valuesList: a value is not a finite number');
    return String(x);
  };
  // One author column: the other (entered_by for a bench, bench_id for a user) keeps its NULL default, a value
  // fewer on every row of a thousand-reading batch.
  const tail = `,'${source}','${received}',${author.benchId === null ? id(author.enteredBy) : id(author.benchId)})`;
  let sql = '';
  for (let i = 0; i < rows.length; i++) {
    const r = rows[i];
    sql += `${i === 0 ? '' : ','}(${runId},${num(r.seq)},${num(r.t)},${num(r.dial)},${num(r.frequency)},${num(r.aux)}${tail}`;
  }
  return sql;
}

/**
 * The author columns for a readings query: join `users eu` and `benches eb` as AUTHOR_JOINS does.
 * Only the page being listed is joined, so the cost is a primary-key lookup per row shown.
 */
export const AUTHOR_COLUMNS = 'r.entered_by, eu.name AS entered_by_name, r.bench_id, eb.name AS bench_name';
export const AUTHOR_JOINS = 'LEFT JOIN users eu ON eu.id = r.entered_by LEFT JOIN benches eb ON eb.id = r.bench_id';

function authorOf(row: Record<string, unknown>): ReadingAuthor | null {
  if (row.bench_id !== null && row.bench_id !== undefined)
    return { kind: 'bench', id: Number(row.bench_id), name: String(row.bench_name ?? `bench ${row.bench_id}`) };
  if (row.entered_by !== null && row.entered_by !== undefined)
    return { kind: 'user', id: Number(row.entered_by), name: String(row.entered_by_name ?? `user ${row.entered_by}`) };
  return null;
}

export function toReadingView(row: Record<string, unknown>, exclusion?: { reason: string } | null): ReadingView {
  return {
    id: Number(row.id),
    seq: Number(row.seq),
    t: Number(row.t_s),
    dial: row.dial === null ? null : Number(row.dial),
    frequency: Number(row.frequency_hz),
    aux: row.aux === null || row.aux === undefined ? null : Number(row.aux),
    source: row.source as ReadingSource,
    receivedAt: new Date(row.received_at as string).toISOString(),
    excluded: Boolean(exclusion ?? row.excluded_reason),
    excludedReason: exclusion?.reason ?? (row.excluded_reason as string | null) ?? null,
    author: authorOf(row),
  };
}
