import { BadRequestException, ConflictException, Injectable, NotFoundException, UnprocessableEntityException } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource } from 'typeorm';
import type { AppendReadingsResponse, ListResponse, Reading as ReadingView, ReadingInput } from '@kilocycle/common/types';
import { AuditService } from '../audit/audit.service.js';
import { RunContextReader } from '../runs/run-context.reader.js';
import { RunCountersWriter } from '../runs/run-counters.writer.js';
import { organizationScope, type AuthUser } from '../shared/auth-user.js';
import { runRefusalReason } from '@kilocycle/common/rules';
import { assertMayWriteRun } from '../shared/run-write-guard.js';
import { sortColumn } from '../shared/page-query.js';
import type { ListReadingsQueryDto } from './dto/readings.dto.js';
import { AUTHOR_COLUMNS, AUTHOR_JOINS, ReadingsWriter, toReadingView, type RunWriteContext } from './readings-writer.service.js';
import { replicaQuery } from '../shared/replica-read.js';

const SORTABLE = { seq: 'r.seq', t: 'r.t_s', dial: 'r.dial', frequency: 'r.frequency_hz', id: 'r.id' };
const READING_KEYS = ['seq', 'dial', 'frequency', 'timeInterval', 't', 'aux', 'confirmed'];

@Injectable()
export class ReadingsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writer: ReadingsWriter,
    private readonly audit: AuditService,
    private readonly counters: RunCountersWriter,
    private readonly runs: RunContextReader,
  ) {}

  /** The run's write context if the actor may see the run; 404 otherwise. */
  async visibleRun(actor: AuthUser, runId: number): Promise<RunWriteContext> {
    const ctx = await this.writer.loadContext(runId);
    const scope = organizationScope(actor);
    if (!ctx || (scope !== null && ctx.organizationId !== scope)) throw new NotFoundException(`Run ${runId} not found`);
    return ctx;
  }

  async list(actor: AuthUser, runId: number, query: ListReadingsQueryDto): Promise<ListResponse<ReadingView>> {
    await this.visibleRun(actor, runId);
    const page = query.page ?? 1;
    const pageSize = query.pageSize ?? 100;
    const { column, direction } = sortColumn(query.sort ?? 'seq', SORTABLE);
    const filter = query.excluded === true ? ' AND x.reading_id IS NOT NULL' : query.excluded === false ? ' AND x.reading_id IS NULL' : '';
    // The total comes from the run's counters, kept with every batch and exclusion: nothing is counted here.
    const counters = await this.runs.counters(runId);
    const all = counters?.readingCount ?? 0;
    const excluded = counters?.excludedCount ?? 0;
    const total = query.excluded === true ? excluded : query.excluded === false ? all - excluded : all;
    const offset = (page - 1) * pageSize;
    if (offset >= total) return { items: [], total };
    // A page past the middle is read from the other end (the index serves both directions), so the last page
    // of a million-reading run skips a few rows instead of a million; its rows are put back in order after.
    const fromEnd = offset > total / 2;
    const flip = (d: 'ASC' | 'DESC') => (fromEnd ? (d === 'ASC' ? 'DESC' : 'ASC') : d);
    const limit = fromEnd ? Math.min(pageSize, total - offset) : pageSize;
    const skip = fromEnd ? Math.max(0, total - offset - pageSize) : offset;
    // Ties break on the row id, which the (run_id, frequency_hz) and (run_id, t_s) indexes carry: no sort step.
    const order = column === 'r.seq' || column === 'r.id' ? `${column} ${flip(direction)}` : `${column} ${flip(direction)}, r.id ${flip(direction)}`;
    const exclusionJoin = filter === '' ? '' : ' LEFT JOIN reading_exclusions x ON x.reading_id = r.id';
    // Deferred join: the page's ids come from the (run_id, seq) index alone; only those rows are read whole.
    const rows = await replicaQuery<Array<Record<string, unknown>>>(
      this.dataSource,
      `SELECT r.id, r.seq, r.t_s, r.dial, r.frequency_hz, r.aux, r.source, r.received_at, x.reason AS excluded_reason, ${AUTHOR_COLUMNS}
         FROM (SELECT r.id FROM readings r${exclusionJoin} WHERE r.run_id = ?${filter} ORDER BY ${order} LIMIT ? OFFSET ?) page
         JOIN readings r ON r.id = page.id
         LEFT JOIN reading_exclusions x ON x.reading_id = r.id
         ${AUTHOR_JOINS}
        ORDER BY ${order}`,
      [runId, limit, skip],
    );
    if (fromEnd) rows.reverse();
    return { items: rows.map((row) => toReadingView(row)), total };
  }

  /**
   * Stores typed readings through the shared write path. All or nothing: if any reading is refused,
   * 400 names each refused field as `readings[i].field` and nothing is written; 422 when the only
   * problem is a frequency outside the range's span (stored when sent again with `confirmed: true`).
   */
  async append(actor: AuthUser, runId: number, inputs: ReadingInput[]): Promise<AppendReadingsResponse> {
    const ctx = await this.visibleRun(actor, runId);
    assertMayWriteRun(actor.role, ctx.kind);
    const refusal = runRefusalReason(ctx);
    if (refusal) throw new ConflictException(refusal);
    const problems: AppendReadingsResponse['rejected'] = [];
    inputs.forEach((input, index) => {
      if (input !== null && typeof input === 'object' && !Array.isArray(input)) {
        for (const key of Object.keys(input)) {
          if (!READING_KEYS.includes(key))
            problems.push({ seq: null, index, field: key, reason: `${key} is not a reading field (use ${READING_KEYS.join(', ')})` });
        }
      }
    });
    problems.push(...this.writer.validate(ctx, inputs, Date.now(), 'each').rejected);
    if (problems.length > 0) {
      problems.sort((a, b) => a.index - b.index);
      // Only readings outside the range's span: 422, and sent again with confirmed: true they are stored.
      if (problems.every((p) => p.confirmable)) {
        throw new UnprocessableEntityException({
          statusCode: 422,
          error: 'Unprocessable Entity',
          message: problems.map((p) => `readings[${p.index}].${p.field}: ${p.reason}`),
          rejected: problems,
          hint: 'nothing was stored; if the reading is right as given, send it again with confirmed: true',
        });
      }
      throw new BadRequestException({
        statusCode: 400,
        error: 'Bad Request',
        message: problems.map((p) => `readings[${p.index}].${p.field}: ${p.reason}`),
        rejected: problems,
      });
    }
    const author = { kind: 'user' as const, id: actor.id, name: actor.name };
    const { stored, ...ack } = await this.writer.append(ctx, inputs, 'manual', author);
    return { ...ack, stored: stored.map((r) => ({ ...r, author })) };
  }

  /** Marks a reading as excluded, with the reason; the reading itself never changes. */
  async exclude(actor: AuthUser, runId: number, readingId: number, reason: string): Promise<ReadingView> {
    const ctx = await this.visibleRun(actor, runId);
    assertMayWriteRun(actor.role, ctx.kind);
    const refusal = runRefusalReason(ctx);
    if (refusal) throw new ConflictException(refusal);
    await this.dataSource.transaction(async (manager) => {
      const [reading] = await manager.query(
        `SELECT r.id, r.seq, x.reading_id AS excluded FROM readings r LEFT JOIN reading_exclusions x ON x.reading_id = r.id
          WHERE r.id = ? AND r.run_id = ? FOR UPDATE`,
        [readingId, runId],
      );
      if (!reading) throw new NotFoundException(`Reading ${readingId} not found in run ${runId}`);
      if (reading.excluded !== null) throw new ConflictException(`reading ${readingId} (seq ${reading.seq}) is already excluded`);
      await manager.query('INSERT INTO reading_exclusions (reading_id, run_id, reason, excluded_by) VALUES (?, ?, ?, ?)', [readingId, runId, reason, actor.id]);
      await this.counters.addExclusion(runId, manager);
      await this.audit.record(
        { actorId: actor.id, entity: 'reading', entityId: readingId, action: 'exclude', changes: { runId, seq: Number(reading.seq), reason } },
        manager,
      );
    });
    const [row] = await this.dataSource.query(
      `SELECT r.id, r.seq, r.t_s, r.dial, r.frequency_hz, r.aux, r.source, r.received_at, x.reason AS excluded_reason, ${AUTHOR_COLUMNS}
         FROM readings r JOIN reading_exclusions x ON x.reading_id = r.id ${AUTHOR_JOINS} WHERE r.id = ?`,
      [readingId],
    );
    const view = toReadingView(row);
    this.writer.excluded$.next({ runId, reading: view });
    return view;
  }
}
