import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import type { DataSource, EntityManager, Repository } from 'typeorm';
import { CALIBRATION_RUN_KINDS, RUN_CORRECTABLE_FIELDS, type ListResponse, type Run as RunView, type RunBridge } from '@kilocycle/common/types';
import { AuditService } from '../audit/audit.service.js';
import { organizationScope, type AuthUser } from '../shared/auth-user.js';
import { RunBenchReader } from '../benches/run-bench.reader.js';
import { BridgePresence } from '../shared/bridge-presence.js';
import { RangeResultsReader } from '../instruments/range-results.reader.js';
import { instrumentLabel } from '../instruments/instruments.service.js';
import { OPEN_JOB_STATUSES, LOCKED_JOB_STATUSES, runDataKindRefusal, runKindWords, runRefusalReason } from '@kilocycle/common/rules';
import { JobScopeReader } from '../jobs/job-scope.reader.js';
import { JobsService } from '../jobs/jobs.service.js';
import { todayIso } from '../shared/dto-helpers.js';
import { paginateFlat } from '../shared/page-query.js';
import { likePattern } from '../shared/paginate.js';
import { StandardUseReader, type StandardUse } from '../standards/standard-use.reader.js';
import type { CreateRunDto, ListRunsQueryDto, UpdateRunDto } from './dto/run.dto.js';
import { NewestReadingSource } from '../shared/newest-reading.js';
import { assertMayWriteRun } from '../shared/run-write-guard.js';
import { Run } from './run.entity.js';

type RunCounts = { readingCount: number; excludedCount: number; lastSeq: number; bridge: RunBridge };

export function toRunView(r: Run, counts: RunCounts): RunView {
  return {
    id: r.id,
    jobId: r.jobId,
    jobNumber: r.job?.number ?? '',
    jobStatus: r.job?.status,
    organizationId: r.job?.organizationId,
    instrumentId: r.job?.instrumentId,
    instrumentLabel: r.job?.instrument ? instrumentLabel(r.job.instrument) : '',
    rangeId: r.rangeId,
    rangeLabel: r.range?.label ?? '',
    kind: r.kind,
    dataKind: r.dataKind,
    status: r.status,
    benchId: r.benchId,
    benchName: r.bench?.name ?? null,
    standardId: r.standardId,
    standardName: r.standard?.name ?? null,
    standardOverrideReason: r.standardOverrideReason,
    supplyVoltage: r.supplyVoltage,
    configuration: r.configuration,
    notes: r.notes,
    startedAt: r.startedAt.toISOString(),
    endedAt: r.endedAt ? r.endedAt.toISOString() : null,
    createdById: r.createdById,
    createdByName: r.createdBy?.name ?? '',
    ...counts,
    refusal: r.job ? runRefusalReason({ runId: r.id, status: r.status, jobStatus: r.job.status }) : null,
  };
}

const SORTABLE = {
  id: 'r.id',
  startedAt: 'r.startedAt',
  endedAt: 'r.endedAt',
  kind: 'r.kind',
  status: 'r.status',
  jobNumber: 'j.number',
  rangeLabel: 'g.label',
  instrumentLabel: 'i.make',
};

@Injectable()
export class RunsService {
  constructor(
    @InjectRepository(Run) private readonly runs: Repository<Run>,
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
    private readonly jobs: JobsService,
    private readonly presence: BridgePresence,
    private readonly newestReadings: NewestReadingSource,
    private readonly jobScopes: JobScopeReader,
    private readonly ranges: RangeResultsReader,
    private readonly benches: RunBenchReader,
    private readonly standards: StandardUseReader,
  ) {}

  list(actor: AuthUser, query: ListRunsQueryDto): Promise<ListResponse<RunView>> {
    const qb = this.baseQuery();
    const scope = organizationScope(actor);
    if (scope !== null) qb.andWhere('j.organizationId = :scope', { scope });
    if (query.organizationId !== undefined) qb.andWhere('j.organizationId = :org', { org: query.organizationId });
    if (query.instrumentId !== undefined) qb.andWhere('j.instrumentId = :instrumentId', { instrumentId: query.instrumentId });
    if (query.jobId !== undefined) qb.andWhere('r.jobId = :jobId', { jobId: query.jobId });
    if (query.rangeId !== undefined) qb.andWhere('r.rangeId = :rangeId', { rangeId: query.rangeId });
    if (query.benchId !== undefined) qb.andWhere('r.benchId = :benchId', { benchId: query.benchId });
    if (query.kind) qb.andWhere('r.kind = :kind', { kind: query.kind });
    if (query.status) qb.andWhere('r.status = :status', { status: query.status });
    if (query.q) {
      qb.andWhere(
        '(j.number LIKE :q OR g.label LIKE :q OR i.make LIKE :q OR i.model LIKE :q OR i.serial LIKE :q OR r.notes LIKE :q OR r.configuration LIKE :q)',
        {
          q: likePattern(query.q),
        },
      );
    }
    return paginateFlat(qb, query, SORTABLE, '-startedAt', 'r.id', (found) => this.toViews(found));
  }

  /** A job's runs; 404 when the job is not the actor's to see. */
  async listForJob(actor: AuthUser, jobId: number, query: ListRunsQueryDto): Promise<ListResponse<RunView>> {
    await this.jobs.findVisible(actor, jobId);
    return this.list(actor, { ...query, jobId });
  }

  /** The run with its job, if the actor may see it; 404 otherwise. */
  async findVisible(actor: AuthUser, id: number): Promise<Run> {
    const found = await this.baseQuery().where('r.id = :id', { id }).getOne();
    const scope = organizationScope(actor);
    if (!found || (scope !== null && found.job.organizationId !== scope)) throw new NotFoundException(`Run ${id} not found`);
    return found;
  }

  async get(actor: AuthUser, id: number): Promise<RunView> {
    const [view] = await this.toViews([await this.findVisible(actor, id)]);
    return view!;
  }

  /** Opens a run on one of the job's instrument's ranges (POST /api/jobs/:id/runs). */
  async open(actor: AuthUser, jobId: number, body: CreateRunDto): Promise<RunView> {
    assertMayWriteRun(actor.role, body.kind);
    const dataKind = body.dataKind ?? 'frequency';
    const dataKindRefusal = runDataKindRefusal(body.kind, dataKind);
    if (dataKindRefusal) throw new BadRequestException(`dataKind: ${dataKindRefusal}`);
    const id = await this.dataSource.transaction(async (manager) => {
      const job = await this.jobScopes.scope(jobId, manager, true);
      if (!job) throw new NotFoundException(`Job ${jobId} not found`);
      if (!OPEN_JOB_STATUSES.includes(job.status)) throw new ConflictException(`job ${job.number} is ${job.status}: no new runs`);
      // Among the instrument's own ranges: a range of another instrument is refused like one that does not exist.
      const range = (await this.ranges.ranges(job.instrumentId, manager)).find((r) => r.id === body.rangeId);
      if (!range) {
        throw new BadRequestException(`rangeId: range ${body.rangeId} is not a range of this job's instrument`);
      }
      let standardId = body.standardId ?? null;
      if (body.benchId != null) {
        const bench = await this.benches.bench(body.benchId, manager);
        if (!bench || !bench.active) throw new BadRequestException(`benchId: bench ${body.benchId} does not exist or is out of use`);
        const [busy] = await manager.query("SELECT id FROM runs WHERE bench_id = ? AND status = 'open' LIMIT 1 FOR UPDATE", [bench.id]);
        if (busy) throw new ConflictException(`bench "${bench.name}" already has run ${busy.id} open; close it first`);
        standardId ??= bench.defaultStandardId;
      }
      if (standardId === null && CALIBRATION_RUN_KINDS.includes(body.kind)) {
        const why = body.benchId != null ? ' (the bench has no default standard)' : '';
        throw new BadRequestException(
          `standardId: an ${runKindWords(body.kind)} run needs a reference standard${why}; choose the counter or reference the readings are taken with`,
        );
      }
      const { standard, overrideReason } = await this.usableStandard(manager, actor, standardId, body.standardOverrideReason);
      const result = await manager.insert(Run, {
        jobId: job.id,
        rangeId: range.id,
        kind: body.kind,
        dataKind,
        status: 'open',
        benchId: body.benchId ?? null,
        standardId,
        standardOverrideReason: overrideReason,
        supplyVoltage: body.supplyVoltage ?? null,
        configuration: body.configuration ?? null,
        notes: body.notes ?? null,
        startedAt: new Date(),
        createdById: actor.id,
      });
      const newId = result.identifiers[0].id as number;
      await this.audit.record(
        {
          actorId: actor.id,
          entity: 'run',
          entityId: newId,
          action: 'create',
          changes: { jobId: job.id, rangeId: range.id, rangeLabel: range.label, kind: body.kind, dataKind, benchId: body.benchId ?? null, standardId },
        },
        manager,
      );
      if (overrideReason !== null && standard) {
        await this.audit.record(
          {
            actorId: actor.id,
            entity: 'run',
            entityId: newId,
            action: 'standard_override',
            changes: { standardId: standard.id, standardName: standard.name, dueDate: standard.dueDate, reason: overrideReason },
          },
          manager,
        );
      }
      if (job.status === 'received' || job.status === 'returned') {
        await this.jobs.changeStatus(manager, { id: actor.id, role: 'technician' }, job, 'in_progress', `run ${newId} opened`);
      }
      return newId;
    });
    return this.get(actor, id);
  }

  /**
   * Closes a run (status closed) and corrects its details. A correction (standard, supply voltage,
   * configuration, notes) needs a reason and is made only while the job is open (received, in
   * progress or returned); it is audited with each field's from and to and the reason, in the same
   * transaction. A closed run's details can still be corrected while its job is open: closing ends
   * capture, not the record of how the readings were taken.
   */
  async update(actor: AuthUser, id: number, body: UpdateRunDto): Promise<RunView> {
    await this.dataSource.transaction(async (manager) => {
      const run = await manager.findOne(Run, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!run) throw new NotFoundException(`Run ${id} not found`);
      const job = await this.jobScopes.scope(run.jobId, manager);
      const scope = organizationScope(actor);
      if (!job || (scope !== null && job.organizationId !== scope)) throw new NotFoundException(`Run ${id} not found`);
      assertMayWriteRun(actor.role, run.kind);
      if (LOCKED_JOB_STATUSES.includes(job.status)) throw new ConflictException(`run ${id} belongs to job ${job.number}, which is ${job.status}`);
      const asked = RUN_CORRECTABLE_FIELDS.filter((key) => body[key] !== undefined);
      if (asked.length > 0) {
        if (!OPEN_JOB_STATUSES.includes(job.status)) {
          throw new ConflictException(
            `run ${id} belongs to job ${job.number}, which is ${job.status.replace('_', ' ')}: a run's details are corrected only while its job is received, in progress or returned`,
          );
        }
        await this.correct(manager, actor, run, body);
      } else if (body.status !== 'closed' && (body.reason !== undefined || body.standardOverrideReason !== undefined)) {
        throw new BadRequestException('reason: give it together with the details it explains (standardId, supplyVoltage, configuration, notes)');
      }
      if (body.status === 'closed') {
        if (run.status === 'closed') throw new ConflictException(`run ${id} is closed: it no longer changes`);
        await manager.update(Run, { id }, { status: 'closed', endedAt: new Date() });
        await this.audit.record({ actorId: actor.id, entity: 'run', entityId: id, action: 'status', changes: { from: 'open', to: 'closed' } }, manager);
      }
    });
    return this.get(actor, id);
  }

  /** Applies a correction of the run's details with its reason, and audits it (action update, with from/to per field). */
  private async correct(manager: EntityManager, actor: AuthUser, run: Run, body: UpdateRunDto): Promise<void> {
    const changes: Record<string, unknown> = {};
    const patch: Partial<Run> = {};
    for (const key of ['supplyVoltage', 'configuration', 'notes'] as const) {
      if (body[key] !== undefined && body[key] !== run[key]) {
        changes[key] = { from: run[key], to: body[key] };
        Object.assign(patch, { [key]: body[key] });
      }
    }
    let override: { standard: StandardUse; reason: string } | null = null;
    if (body.standardId !== undefined && body.standardId !== run.standardId) {
      if (body.standardId === null && CALIBRATION_RUN_KINDS.includes(run.kind)) {
        throw new BadRequestException(`standardId: an ${runKindWords(run.kind)} run needs a reference standard; choose the one the readings were taken with`);
      }
      const before = run.standardId === null ? null : await this.standards.standard(run.standardId, manager);
      const { standard, overrideReason } = await this.usableStandard(manager, actor, body.standardId, body.standardOverrideReason);
      changes.standardId = { from: run.standardId, to: body.standardId };
      changes.standardName = { from: before?.name ?? null, to: standard?.name ?? null };
      patch.standardId = body.standardId;
      patch.standardOverrideReason = overrideReason;
      if (standard && overrideReason !== null) override = { standard, reason: overrideReason };
    }
    if (Object.keys(patch).length === 0) return;
    const reason = body.reason?.trim() ?? '';
    if (reason.length < 3) throw new BadRequestException("reason: say why the run's details are corrected (at least 3 characters)");
    changes.reason = reason;
    await manager.update(Run, { id: run.id }, patch);
    await this.audit.record({ actorId: actor.id, entity: 'run', entityId: run.id, action: 'update', changes }, manager);
    if (override) {
      await this.audit.record(
        {
          actorId: actor.id,
          entity: 'run',
          entityId: run.id,
          action: 'standard_override',
          changes: { standardId: override.standard.id, standardName: override.standard.name, dueDate: override.standard.dueDate, reason: override.reason },
        },
        manager,
      );
    }
  }

  /**
   * The standard a run may use: active, and in date unless a lead overrides with a written reason
   * (400 for one that does not exist or is out of use, 409 for an overdue one without the override).
   */
  private async usableStandard(
    manager: EntityManager,
    actor: AuthUser,
    standardId: number | null,
    overrideReason: string | undefined,
  ): Promise<{ standard: StandardUse | null; overrideReason: string | null }> {
    if (standardId === null) return { standard: null, overrideReason: null };
    const standard = await this.standards.standard(standardId, manager);
    if (!standard || !standard.active) throw new BadRequestException(`standardId: standard ${standardId} does not exist or is out of use`);
    const due = standard.dueDate;
    if (due >= todayIso()) return { standard, overrideReason: null };
    const base = `standard "${standard.name}" was due for calibration on ${due}`;
    if (actor.role !== 'lead') throw new ConflictException(`${base}; only a lead can override, with a written reason`);
    if (!overrideReason) throw new ConflictException(`${base}; give standardOverrideReason to use it anyway`);
    return { standard, overrideReason };
  }

  private baseQuery() {
    return this.runs
      .createQueryBuilder('r')
      .innerJoinAndSelect('r.job', 'j')
      .innerJoinAndSelect('j.instrument', 'i')
      .innerJoinAndSelect('r.range', 'g')
      .innerJoinAndSelect('r.createdBy', 'u')
      .leftJoinAndSelect('r.bench', 'b')
      .leftJoinAndSelect('r.standard', 's');
  }

  private async toViews(found: Run[]): Promise<RunView[]> {
    if (found.length === 0) return [];
    // The counts are the run's own counters; only the newest reading (for the bridge's state) is looked up.
    const newest = await this.newestReadings.newest(found.map((r) => ({ runId: r.id, lastSeq: r.lastSeq })));
    return found.map((r) => {
      const last = newest.get(r.id);
      return toRunView(r, {
        readingCount: r.readingCount,
        excludedCount: r.excludedCount,
        lastSeq: r.lastSeq,
        bridge: this.bridgeOf(r.id, last ? { at: last.receivedAt, source: last.source } : null),
      });
    });
  }

  /**
   * Live only while a bridge is attached (this process's presence). A run no bridge has attached to since
   * the server started but whose newest reading came from a bridge shows it offline since that reading;
   * any other run shows no bridge at all (typed or imported readings only).
   */
  private bridgeOf(runId: number, last: { at: Date; source: string } | null): RunBridge {
    const lastReadingAt = last ? last.at.toISOString() : null;
    const state = this.presence.state(runId);
    if (state) return { connected: state.connected, since: state.since.toISOString(), lastReadingAt };
    if (last?.source === 'bridge') return { connected: false, since: lastReadingAt, lastReadingAt };
    return { connected: false, since: null, lastReadingAt };
  }
}
