import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource } from 'typeorm';
import { MAX_INGEST_BATCH, type AttachAck, type IngestBatchAck } from '@kilocycle/common/events';
import type { DialUnit, IngestAck, ReadingInput } from '@kilocycle/common/types';
import type { BenchIdentity } from '../benches/benches.service.js';
import { ReadingsWriter, refusalReason, type RunWriteContext } from '../readings/readings-writer.service.js';
import { IngestException, payloadObject, runIdOf } from './ingest.exception.js';

const BATCH_EXAMPLE = '{runId, readings: [{seq, t?, dial?, frequency, aux?}, …]}';

/**
 * The bench protocol without the socket: attach to a run, then store batches through the shared
 * write path. Every refusal is an IngestException with a code and a sentence for the bench operator.
 */
@Injectable()
export class IngestService {
  /**
   * The highest seq received per run in this process, counted before the commit, so a bridge that
   * attaches while another is streaming numbers after the other's batches in flight as well.
   */
  private readonly highWater = new Map<number, number>();

  constructor(
    private readonly writer: ReadingsWriter,
    @InjectDataSource() private readonly dataSource: DataSource,
  ) {}

  async attach(bench: BenchIdentity, payload: unknown): Promise<AttachAck> {
    const runId = runIdOf(payloadObject(payload, '{runId}'));
    const ctx = this.check(bench, runId, await this.writer.loadContext(runId));
    const [[range], lastSeq] = await Promise.all([
      this.dataSource.query(
        `SELECT g.label, g.dial_unit, g.dial_min, g.dial_max, g.freq_min_hz, g.freq_max_hz
           FROM runs r JOIN instrument_ranges g ON g.id = r.range_id WHERE r.id = ?`,
        [runId],
      ),
      this.writer.lastSeq(runId),
    ]);
    return {
      ok: true,
      runId,
      lastSeq: Math.max(lastSeq, this.highWater.get(runId) ?? 0),
      kind: ctx.kind,
      startedAt: ctx.startedAt.toISOString(),
      benchId: bench.id,
      benchName: bench.name,
      range: {
        label: String(range.label),
        dialUnit: range.dial_unit as DialUnit,
        dialMin: Number(range.dial_min),
        dialMax: Number(range.dial_max),
        freqMinHz: Number(range.freq_min_hz),
        freqMaxHz: Number(range.freq_max_hz),
      },
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
    let highest = 0;
    readings.forEach((reading: unknown, index) => {
      const seq = reading !== null && typeof reading === 'object' ? (reading as { seq?: unknown }).seq : undefined;
      if (reading !== null && typeof reading === 'object' && (seq === undefined || seq === null)) {
        rejected.push({ seq: null, index, field: 'seq', reason: 'seq is required from a bench: number readings after the lastSeq the attach answered' });
        return;
      }
      if (typeof seq === 'number' && Number.isInteger(seq) && seq > highest) highest = seq;
      inputs.push(reading as ReadingInput);
      indexOf.push(index);
    });
    if (highest > (this.highWater.get(runId) ?? 0)) this.highWater.set(runId, highest);
    if (inputs.length === 0) {
      return { ok: true, runId, accepted: 0, duplicates: 0, rejected, lastSeq: await this.writer.lastSeq(runId), duplicateSeqs: [] };
    }

    const result = await this.writer.append(ctx, inputs, 'bridge');
    for (const r of result.rejected) rejected.push({ ...r, index: indexOf[r.index] ?? r.index });
    rejected.sort((a, b) => a.index - b.index);
    return {
      ok: true,
      runId,
      accepted: result.accepted,
      duplicates: result.duplicates,
      rejected,
      lastSeq: result.lastSeq,
      duplicateSeqs: result.duplicates > 0 ? duplicateSeqs(inputs, result.rejected, result.stored) : [],
    };
  }

  /** The run as the bench may write to it now, or the reason it may not. */
  private check(bench: BenchIdentity, runId: number, ctx: RunWriteContext | null): RunWriteContext {
    if (!ctx) throw new IngestException('run_not_found', `there is no run ${runId}`);
    if (ctx.benchId !== bench.id) {
      throw new IngestException('not_assigned', `run ${runId} is not assigned to bench "${bench.name}"; assign the bench on the run's page first`);
    }
    const reason = refusalReason(ctx);
    if (reason) throw new IngestException(ctx.status !== 'open' ? 'run_closed' : 'job_locked', `${reason}; it takes no more readings`);
    return ctx;
  }
}

/** The seqs of valid readings that were not stored by this batch (already stored, or repeated within it). */
function duplicateSeqs(inputs: readonly ReadingInput[], rejected: IngestAck['rejected'], stored: ReadonlyArray<{ seq: number }>): number[] {
  const refused = new Set(rejected.map((r) => r.index));
  const fresh = new Set(stored.map((r) => r.seq));
  const out: number[] = [];
  inputs.forEach((input, index) => {
    if (refused.has(index) || typeof input.seq !== 'number') return;
    if (fresh.has(input.seq)) fresh.delete(input.seq);
    else out.push(input.seq);
  });
  return out;
}
