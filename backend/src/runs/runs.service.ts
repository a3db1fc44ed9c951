import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import type { DataSource, Repository } from 'typeorm';
import type { ListResponse, Run as RunView } from '@kilocycle/common/types';
import { AuditService } from '../audit/audit.service.js';
import { organizationScope, type AuthUser } from '../auth/auth-user.js';
import { Bench } from '../benches/bench.entity.js';
import { InstrumentRange } from '../instruments/instrument-range.entity.js';
import { instrumentLabel } from '../instruments/instruments.service.js';
import { OPEN_JOB_STATUSES, LOCKED_JOB_STATUSES } from '../jobs/job-status-rules.js';
import { Job } from '../jobs/job.entity.js';
import { JobsService } from '../jobs/jobs.service.js';
import { refusalReason } from '../readings/readings-writer.service.js';
import { dateOnly, todayIso } from '../shared/dto-helpers.js';
import { paginateFlat } from '../shared/page-query.js';
import { likePattern } from '../shared/paginate.js';
import { Standard } from '../standards/standard.entity.js';
import type { CreateRunDto, ListRunsQueryDto, UpdateRunDto } from './dto/run.dto.js';
import { assertMayWriteRun } from './run-rules.js';
import { Run } from './run.entity.js';

type RunCounts = { readingCount: number; excludedCount: number; lastSeq: number };

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
    refusal: r.job ? refusalReason({ runId: r.id, status: r.status, jobStatus: r.job.status }) : null,
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
      qb.andWhere('(j.number LIKE :q OR g.label LIKE :q OR i.make LIKE :q OR i.model LIKE :q OR i.serial LIKE :q OR r.notes LIKE :q OR r.configuration LIKE :q)', {
        q: likePattern(query.q),
      });
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
    const id = await this.dataSource.transaction(async (manager) => {
      const job = await manager.findOne(Job, { where: { id: jobId }, lock: { mode: 'pessimistic_write' } });
      if (!job) throw new NotFoundException(`Job ${jobId} not found`);
      if (!OPEN_JOB_STATUSES.includes(job.status)) throw new ConflictException(`job ${job.number} is ${job.status}: no new runs`);
      const range = await manager.findOneBy(InstrumentRange, { id: body.rangeId });
      if (!range || range.instrumentId !== job.instrumentId) {
        throw new BadRequestException(`rangeId: range ${body.rangeId} is not a range of this job's instrument`);
      }
      let standardId = body.standardId ?? null;
      if (body.benchId != null) {
        const bench = await manager.findOneBy(Bench, { id: body.benchId });
        if (!bench || !bench.active) throw new BadRequestException(`benchId: bench ${body.benchId} does not exist or is out of use`);
        const [busy] = await manager.query("SELECT id FROM runs WHERE bench_id = ? AND status = 'open' LIMIT 1 FOR UPDATE", [bench.id]);
        if (busy) throw new ConflictException(`bench "${bench.name}" already has run ${busy.id} open; close it first`);
        standardId ??= bench.defaultStandardId;
      }
      let overrideReason: string | null = null;
      let standard: Standard | null = null;
      if (standardId !== null) {
        standard = await manager.findOneBy(Standard, { id: standardId });
        if (!standard || !standard.active) throw new BadRequestException(`standardId: standard ${standardId} does not exist or is out of use`);
        const due = dateOnly(standard.dueDate)!;
        if (due < todayIso()) {
          const base = `standard "${standard.name}" was due for calibration on ${due}`;
          if (actor.role !== 'lead') throw new ConflictException(`${base}; only a lead can override, with a written reason`);
          if (!body.standardOverrideReason) throw new ConflictException(`${base}; give standardOverrideReason to use it anyway`);
          overrideReason = body.standardOverrideReason;
        }
      }
      const result = await manager.insert(Run, {
        jobId: job.id,
        rangeId: range.id,
        kind: body.kind,
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
          changes: { jobId: job.id, rangeId: range.id, rangeLabel: range.label, kind: body.kind, benchId: body.benchId ?? null, standardId },
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
            changes: { standardId: standard.id, standardName: standard.name, dueDate: dateOnly(standard.dueDate), reason: overrideReason },
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

  async update(actor: AuthUser, id: number, body: UpdateRunDto): Promise<RunView> {
    await this.dataSource.transaction(async (manager) => {
      const run = await manager.findOne(Run, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!run) throw new NotFoundException(`Run ${id} not found`);
      run.job = await manager.findOneByOrFail(Job, { id: run.jobId });
      assertMayWriteRun(actor.role, run.kind);
      if (run.status === 'closed') throw new ConflictException(`run ${id} is closed: it no longer changes`);
      if (LOCKED_JOB_STATUSES.includes(run.job.status)) throw new ConflictException(`run ${id} belongs to job ${run.job.number}, which is ${run.job.status}`);
      const changes: Record<string, unknown> = {};
      const patch: Partial<Run> = {};
      for (const key of ['supplyVoltage', 'configuration', 'notes'] as const) {
        if (body[key] !== undefined && body[key] !== run[key]) {
          changes[key] = { from: run[key], to: body[key] };
          Object.assign(patch, { [key]: body[key] });
        }
      }
      if (Object.keys(patch).length > 0) {
        await manager.update(Run, { id }, patch);
        await this.audit.record({ actorId: actor.id, entity: 'run', entityId: id, action: 'update', changes }, manager);
      }
      if (body.status === 'closed') {
        await manager.update(Run, { id }, { status: 'closed', endedAt: new Date() });
        await this.audit.record({ actorId: actor.id, entity: 'run', entityId: id, action: 'status', changes: { from: 'open', to: 'closed' } }, manager);
      }
    });
    return this.get(actor, id);
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
    const ids = found.map((r) => r.id);
    const [readings, exclusions]: [Array<{ run_id: number; n: string | number; last: number | null }>, Array<{ run_id: number; n: string | number }>] =
      await Promise.all([
        this.dataSource.query('SELECT run_id, COUNT(*) AS n, MAX(seq) AS last FROM readings WHERE run_id IN (?) GROUP BY run_id', [ids]),
        this.dataSource.query('SELECT run_id, COUNT(*) AS n FROM reading_exclusions WHERE run_id IN (?) GROUP BY run_id', [ids]),
      ]);
    const readingBy = new Map(readings.map((row) => [Number(row.run_id), row]));
    const excludedBy = new Map(exclusions.map((row) => [Number(row.run_id), Number(row.n)]));
    return found.map((r) => {
      const row = readingBy.get(r.id);
      return toRunView(r, { readingCount: row ? Number(row.n) : 0, excludedCount: excludedBy.get(r.id) ?? 0, lastSeq: row?.last ? Number(row.last) : 0 });
    });
  }
}
