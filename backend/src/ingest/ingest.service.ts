import { Injectable } from '@nestjs/common';
import { MAX_INGEST_BATCH, type AttachAck, type IngestBatchAck } from '@kilocycle/common/events';
import type { IngestAck, ReadingInput } from '@kilocycle/common/types';
import { parseFrequency, parseNumber, parseTimeInterval } from '@kilocycle/common/units';
import type { BenchIdentity } from '../benches/benches.service.js';
import { runRefusalReason } from '@kilocycle/common/rules';
import { ReadingsWriter, type RunWriteContext } from '../readings/readings-writer.service.js';
import { RunReadingsReader } from '../readings/run-readings.reader.js';
import { RunContextReader } from '../runs/run-context.reader.js';
import { CounterCaptureService } from './counter-capture.service.js';
import { IngestException, payloadObject, runIdOf } from '../shared/socket-refusal.js';

const BATCH_EXAMPLE = '{runId, readings: [{seq, t?, dial?, frequency, aux?}, …]}';

/**
 * The bench protocol without the socket: attach to a run, then store batches through the shared
 * write path. Every refusal is an IngestException with a code and a sentence for the bench operator.
 *
 * Nothing here outlives a request, so any app node can take any bridge: which runs a connection attached to
 * lives on its socket (a bridge that reconnects, on this node or another, attaches again), the lastSeq an
 * attach answers is the run's counter in MariaDB (runs.last_seq, moved in each batch's own transaction), and a
 * batch sent again after a lost acknowledgement is kept out by UNIQUE(run_id, seq) with INSERT IGNORE and
 * answered as duplicates (duplicateSeqs) by comparing with the stored rows.
 */
@Injectable()
export class IngestService {
  constructor(
    private readonly writer: ReadingsWriter,
    private readonly readings: RunReadingsReader,
    private readonly runs: RunContextReader,
    private readonly captures: CounterCaptureService,
  ) {}

  async attach(bench: BenchIdentity, payload: unknown): Promise<AttachAck> {
    const runId = runIdOf(payloadObject(payload, '{runId}'));
    const ctx = this.check(bench, runId, await this.writer.loadContext(runId));
    // From MariaDB, not from this process: the batches a bridge sent through another node count too.
    const [range, lastSeq] = await Promise.all([this.runs.range(runId), this.writer.lastSeq(runId)]);
    if (!range) throw new IngestException('run_not_found', `there is no run ${runId}`);
    return {
      ok: true,
      runId,
      lastSeq,
      kind: ctx.kind,
      dataKind: ctx.dataKind,
      startedAt: ctx.startedAt.toISOString(),
      benchId: bench.id,
      benchName: bench.name,
      range,
    };
  }

  /** Validates and stores one batch; resolves only after the commit. */
  async ingest(bench: BenchIdentity, attached: ReadonlySet<number>, payload: unknown): Promise<IngestBatchAck> {
    const body = payloadObject(payload, BATCH_EXAMPLE);
    const runId = runIdOf(body);
    const readings = body.readings;
    if (!Array.isArray(readings)) throw new IngestException('bad_request', `readings must be a list: ${BATCH_EXAMPLE}`);
    if (readings.length > MAX_INGEST_BATCH) {
      throw new IngestException(
        'batch_too_large',
        `a batch may hold at most ${MAX_INGEST_BATCH} readings and this one has ${readings.length}; nothing was stored, send it in smaller batches`,
      );
    }
    if (!attached.has(runId)) throw new IngestException('not_attached', `attach to run ${runId} before sending its readings`);
    const ctx = this.check(bench, runId, await this.writer.loadContext(runId));

    // A bench must number its readings: the seq is what makes a resent batch harmless.
    const inputs: ReadingInput[] = [];
    const indexOf: number[] = [];
    const rejected: IngestAck['rejected'] = [];
    readings.forEach((reading: unknown, index) => {
      const seq = reading !== null && typeof reading === 'object' ? (reading as { seq?: unknown }).seq : undefined;
      if (reading !== null && typeof reading === 'object' && (seq === undefined || seq === null)) {
        rejected.push({ seq: null, index, field: 'seq', reason: 'seq is required from a bench: number readings after the lastSeq the attach answered' });
        return;
      }
      inputs.push(reading as ReadingInput);
      indexOf.push(index);
    });
    if (inputs.length === 0) {
      return { ok: true, runId, accepted: 0, duplicates: 0, rejected, lastSeq: await this.writer.lastSeq(runId), duplicateSeqs: [], conflictSeqs: [] };
    }

    const result = await this.appendRetrying(bench, ctx, inputs);
    for (const r of result.rejected) rejected.push({ ...r, index: indexOf[r.index] ?? r.index });
    rejected.sort((a, b) => a.index - b.index);
    const { same, taken } =
      result.duplicates > 0 ? await this.sortDuplicates(runId, notStored(inputs, result.rejected, result.stored)) : { same: [], taken: [] };
    return {
      ok: true,
      runId,
      accepted: result.accepted,
      duplicates: same.length,
      rejected,
      lastSeq: result.lastSeq,
      duplicateSeqs: same,
      conflictSeqs: taken,
    };
  }

  /**
   * Two benches writing the same run can deadlock on the (run, seq) index; the loser's transaction (its
   * INSERT and audit event) is rolled back whole, so running it again is safe and saves the bridge a round of resending.
   */
  private async appendRetrying(bench: BenchIdentity, ctx: RunWriteContext, inputs: readonly ReadingInput[]) {
    for (let attempt = 1; ; attempt++) {
      try {
        // While a setting waits for the counter, a reading without a dial is a counter reading for it.
        const counterReadings = this.captures.isWaiting(ctx.runId);
        return await this.writer.append(ctx, inputs, 'bridge', { kind: 'bench', id: bench.id, name: bench.name }, { counterReadings });
      } catch (error) {
        const errno = (error as { driverError?: { errno?: number }; errno?: number }).driverError?.errno ?? (error as { errno?: number }).errno;
        if (attempt >= 4 || (errno !== ER_LOCK_DEADLOCK && errno !== ER_LOCK_WAIT_TIMEOUT)) throw error;
        await new Promise((resolve) => setTimeout(resolve, 5 * attempt));
      }
    }
  }

  /**
   * Splits seqs that were not stored into true duplicates (the stored reading is this one: a resend)
   * and conflicts (another reading holds the seq, e.g. from a second bridge on the run), by comparing
   * t, dial and frequency with the stored row.
   */
  private async sortDuplicates(runId: number, candidates: ReadonlyArray<{ seq: number; input: ReadingInput }>): Promise<{ same: number[]; taken: number[] }> {
    if (candidates.length === 0) return { same: [], taken: [] };
    const rows = await this.readings.atSeqs(
      runId,
      candidates.map((c) => c.seq),
    );
    const bySeq = new Map(rows.map((r) => [Number(r.seq), r]));
    const same: number[] = [];
    const taken: number[] = [];
    for (const { seq, input } of candidates) {
      const row = bySeq.get(seq);
      (row && sameReading(row, input) ? same : taken).push(seq);
    }
    return { same, taken };
  }

  /** The run as the bench may write to it now, or the reason it may not. */
  private check(bench: BenchIdentity, runId: number, ctx: RunWriteContext | null): RunWriteContext {
    if (!ctx) throw new IngestException('run_not_found', `there is no run ${runId}`);
    if (ctx.benchId !== bench.id) {
      throw new IngestException('not_assigned', `run ${runId} is not assigned to bench "${bench.name}"; assign the bench on the run's page first`);
    }
    const reason = runRefusalReason(ctx);
    if (reason) throw new IngestException(ctx.status !== 'open' ? 'run_closed' : 'job_locked', `${reason}; it takes no more readings`);
    return ctx;
  }
}

const ER_LOCK_WAIT_TIMEOUT = 1205;
const ER_LOCK_DEADLOCK = 1213;

/** The valid readings this batch did not store (already stored, or repeated within the batch). */
function notStored(
  inputs: readonly ReadingInput[],
  rejected: IngestAck['rejected'],
  stored: ReadonlyArray<{ seq: number }>,
): Array<{ seq: number; input: ReadingInput }> {
  const refused = new Set(rejected.map((r) => r.index));
  const fresh = new Set(stored.map((r) => r.seq));
  const out: Array<{ seq: number; input: ReadingInput }> = [];
  inputs.forEach((input, index) => {
    if (refused.has(index) || typeof input.seq !== 'number') return;
    if (fresh.has(input.seq)) fresh.delete(input.seq);
    else out.push({ seq: input.seq, input });
  });
  return out;
}

/** Whether a stored row is this (already validated) reading: same t, dial and value. */
function sameReading(row: { t_s: number; dial: number | null; frequency_hz: number }, input: ReadingInput): boolean {
  // The value as stored: a phase reading's time interval (s), else its frequency (Hz); the writer has checked which it gives.
  const frequency =
    input.timeInterval !== undefined && input.timeInterval !== null
      ? parseTimeInterval(input.timeInterval)
      : typeof input.frequency === 'number'
        ? input.frequency
        : parseFrequency(input.frequency!, 'Hz');
  const dial =
    input.dial === undefined || input.dial === null || input.dial === '' ? null : typeof input.dial === 'number' ? input.dial : parseNumber(input.dial);
  const close = (a: number, b: number) => a === b || Math.abs(a - b) <= 1e-12 * Math.max(Math.abs(a), Math.abs(b));
  return (
    close(Number(row.frequency_hz), frequency) &&
    (row.dial === null ? dial === null : dial !== null && close(Number(row.dial), dial)) &&
    (input.t === undefined || close(Number(row.t_s), input.t))
  );
}
