import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';
import type { JobResults, ListResponse, Procedure as ProcedureView, RunBudget as RunBudgetView } from '@kilocycle/common/types';
import { CAPTURE_DEFAULTS } from '@kilocycle/common/types';
import { AuditService } from '../audit/audit.service.js';
import { RangeResultsReader } from '../instruments/range-results.reader.js';
import { JobScopeReader, type JobScope } from '../jobs/job-scope.reader.js';
import { RunContextReader } from '../runs/run-context.reader.js';
import { ActorDirectory } from '../shared/actor-directory.js';
import type { AuthUser } from '../shared/auth-user.js';
import { assertJobEditable, isJobSigned } from '../shared/job-guards.js';
import { likePattern, paginate } from '../shared/paginate.js';
import { SignedResultsSource } from '../shared/signed-results.js';
import type { CreateProcedureDto, ListProceduresQueryDto, UpdateProcedureDto, UpdateRunBudgetDto } from './dto/budget.dto.js';
import { JobProcedure } from './job-procedure.entity.js';
import { effectiveFigures, JobResultsService } from './job-results.service.js';
import { recordProcedureVersion } from './procedure-versions.js';
import { Procedure } from './procedure.entity.js';
import { RunBudget } from './run-budget.entity.js';

export function toProcedureView(p: Procedure): ProcedureView {
  return {
    id: p.id,
    name: p.name,
    method: p.method,
    decisionRule: p.decisionRule,
    dialHalfDivisionPercentOfSpan: p.dialHalfDivisionPercentOfSpan,
    driftPpm: p.driftPpm,
    driftHz: p.driftHz,
    extraComponents: p.extraComponents ?? [],
    captureSettleCount: p.captureSettleCount,
    captureToleranceHz: p.captureToleranceHz,
    captureTimeoutS: p.captureTimeoutS,
    dialMarks: p.dialMarks ?? [],
    isDefault: p.isDefault,
    active: p.active,
    updatedAt: p.updatedAt.toISOString(),
    version: p.version,
  };
}

const SORTABLE = { id: 'p.id', name: 'p.name', decisionRule: 'p.decisionRule', updatedAt: 'p.updatedAt' };
const CAPTURE_SETTING_KEYS: readonly string[] = Object.keys(CAPTURE_DEFAULTS);

@Injectable()
export class BudgetsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
    private readonly jobResults: JobResultsService,
    private readonly signedResults: SignedResultsSource,
    private readonly jobScopes: JobScopeReader,
    private readonly runs: RunContextReader,
    private readonly ranges: RangeResultsReader,
    private readonly actors: ActorDirectory,
  ) {}

  listProcedures(query: ListProceduresQueryDto): Promise<ListResponse<ProcedureView>> {
    const qb = this.dataSource.getRepository(Procedure).createQueryBuilder('p');
    if (query.active !== undefined) qb.andWhere('p.active = :active', { active: query.active });
    if (query.q) qb.andWhere('p.name LIKE :q', { q: likePattern(query.q) });
    return paginate(qb, query, SORTABLE, 'name', toProcedureView);
  }

  async getProcedure(id: number): Promise<ProcedureView> {
    const found = await this.dataSource.getRepository(Procedure).findOneBy({ id });
    if (!found) throw new NotFoundException(`Procedure ${id} not found`);
    return toProcedureView(found);
  }

  async createProcedure(actor: AuthUser, body: CreateProcedureDto): Promise<ProcedureView> {
    const id = await this.dataSource.transaction(async (manager) => {
      if (await manager.existsBy(Procedure, { name: body.name })) throw new ConflictException(`A procedure named "${body.name}" already exists`);
      if (body.isDefault) await manager.update(Procedure, { isDefault: true }, { isDefault: false });
      const result = await manager.insert(Procedure, {
        ...body,
        extraComponents: body.extraComponents.map((c) => ({ ...c })),
        isDefault: body.isDefault ?? false,
      });
      const newId = result.identifiers[0].id as number;
      await recordProcedureVersion(manager, newId, actor.id);
      await this.audit.record({ actorId: actor.id, entity: 'procedure', entityId: newId, action: 'create', changes: { ...body, version: 1 } }, manager);
      return newId;
    });
    return this.getProcedure(id);
  }

  async updateProcedure(actor: AuthUser, id: number, body: UpdateProcedureDto): Promise<ProcedureView> {
    await this.dataSource.transaction(async (manager) => {
      const found = await manager.findOne(Procedure, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!found) throw new NotFoundException(`Procedure ${id} not found`);
      if (body.name && body.name !== found.name && (await manager.existsBy(Procedure, { name: body.name }))) {
        throw new ConflictException(`A procedure named "${body.name}" already exists`);
      }
      if (body.isDefault === false && found.isDefault) throw new BadRequestException('isDefault: make another procedure the default instead');
      if (body.active === false && (body.isDefault ?? found.isDefault)) throw new BadRequestException('active: the default procedure cannot be deactivated');
      if (body.isDefault) await manager.update(Procedure, { isDefault: true }, { isDefault: false });
      const patch: Partial<Procedure> = {};
      const changes: Record<string, unknown> = {};
      for (const [key, value] of Object.entries(body) as Array<[keyof UpdateProcedureDto, unknown]>) {
        if (value === undefined) continue;
        Object.assign(patch, { [key]: key === 'extraComponents' ? (value as object[]).map((c) => ({ ...c })) : value });
        changes[key] = { from: found[key as keyof Procedure], to: value };
      }
      if (Object.keys(patch).length === 0) return;
      // A change to what the procedure computes or prints is a new version: jobs signed earlier keep theirs.
      // Which procedure is the default, or whether it is offered, is not part of a version.
      // Nor are the counter-assisted capture settings: they change how readings are taken, not what is computed.
      const versioned = Object.keys(patch).some((key) => key !== 'isDefault' && key !== 'active' && !CAPTURE_SETTING_KEYS.includes(key));
      const version = versioned ? found.version + 1 : found.version;
      await manager.update(Procedure, { id }, { ...patch, version });
      if (versioned) {
        await recordProcedureVersion(manager, id, actor.id);
        changes.version = { from: found.version, to: version };
      }
      await this.audit.record({ actorId: actor.id, entity: 'procedure', entityId: id, action: 'update', changes }, manager);
    });
    return this.getProcedure(id);
  }

  async jobProcedure(user: AuthUser, jobId: number): Promise<ProcedureView> {
    await this.jobScopes.visible(user, jobId);
    const figures = await this.jobResults.procedure(jobId);
    return this.getProcedure(figures.id);
  }

  async setJobProcedure(actor: AuthUser, jobId: number, procedureId: number): Promise<ProcedureView> {
    await this.dataSource.transaction(async (manager) => {
      const job = await this.jobScopes.visible(actor, jobId, manager, true);
      assertJobEditable(job.status, `job ${job.number}'s procedure`);
      const procedure = await manager.findOneBy(Procedure, { id: procedureId });
      if (!procedure || !procedure.active) throw new BadRequestException(`procedureId: no active procedure ${procedureId}`);
      const before = await manager.findOneBy(JobProcedure, { jobId });
      await manager.upsert(JobProcedure, { jobId, procedureId }, ['jobId']);
      await this.audit.record(
        { actorId: actor.id, entity: 'job', entityId: jobId, action: 'procedure', changes: { from: before?.procedureId ?? null, to: procedureId } },
        manager,
      );
    });
    return this.getProcedure(procedureId);
  }

  async runBudget(user: AuthUser, runId: number, manager: EntityManager = this.dataSource.manager): Promise<RunBudgetView> {
    const { job, dialSpan } = await this.scopedRun(user, runId, manager);
    const procedure = await this.jobResults.procedure(job.id, manager);
    const row = await manager.findOneBy(RunBudget, { runId });
    const overrides = row
      ? {
          dialHalfDivision: row.dialHalfDivision,
          driftPpm: row.driftPpm,
          driftHz: row.driftHz,
          counterResolutionHz: row.counterResolutionHz,
          extraComponents: row.extraComponents,
          note: row.note,
        }
      : { dialHalfDivision: null, driftPpm: null, driftHz: null, counterResolutionHz: null, extraComponents: null, note: null };
    const effective = effectiveFigures(procedure, overrides, dialSpan);
    const updatedByName = row?.updatedById ? ((await this.actors.namesOf([row.updatedById])).get(row.updatedById) ?? null) : null;
    return {
      runId,
      ...overrides,
      effective: { procedureId: procedure.id, procedureName: procedure.name, ...effective },
      updatedAt: row ? row.updatedAt.toISOString() : null,
      updatedByName,
      editable: !isJobSigned(job.status),
    };
  }

  async updateRunBudget(actor: AuthUser, runId: number, body: UpdateRunBudgetDto): Promise<RunBudgetView> {
    await this.dataSource.transaction(async (manager) => {
      const { job } = await this.scopedRun(actor, runId, manager);
      const locked = await this.jobScopes.visible(actor, job.id, manager, true);
      assertJobEditable(locked.status, `the budget of run ${runId}`);
      const before = await manager.findOneBy(RunBudget, { runId });
      const patch = Object.fromEntries(Object.entries(body).filter(([, v]) => v !== undefined));
      if (Object.keys(patch).length === 0) return;
      if (patch.extraComponents) patch.extraComponents = (patch.extraComponents as object[]).map((c) => ({ ...c }));
      if (before) await manager.update(RunBudget, { runId }, { ...patch, updatedById: actor.id });
      else await manager.insert(RunBudget, { runId, ...patch, updatedById: actor.id });
      const changes: Record<string, unknown> = {};
      for (const [key, value] of Object.entries(patch)) changes[key] = { from: before ? before[key as keyof RunBudget] : null, to: value };
      // The event names the job as well as the run: the no-self-sign rule and the job's history read it.
      await this.audit.record(
        { actorId: actor.id, entity: 'run', entityId: runId, action: 'budget', changes: { jobId: job.id, jobNumber: locked.number, ...changes } },
        manager,
      );
    });
    return this.runBudget(actor, runId);
  }

  /** A signed job's results are the ones it was signed with; an open job's are computed now. */
  async results(user: AuthUser, jobId: number): Promise<JobResults> {
    await this.jobScopes.visible(user, jobId);
    const signed = await this.signedResults.signedResults(jobId);
    return signed ?? this.jobResults.compute(jobId);
  }

  /** A run the user may see, with its job and its range's dial span; another organisation's run answers 404 as if it did not exist. */
  private async scopedRun(
    user: Pick<AuthUser, 'role' | 'organizationId'>,
    runId: number,
    manager: EntityManager,
  ): Promise<{ job: JobScope; dialSpan: number }> {
    const place = await this.runs.place(runId, manager);
    if (!place) throw new NotFoundException(`Run ${runId} not found`);
    let job: JobScope;
    try {
      job = await this.jobScopes.visible(user, place.jobId, manager);
    } catch {
      throw new NotFoundException(`Run ${runId} not found`);
    }
    const range = await this.ranges.range(place.rangeId, manager);
    if (!range) throw new NotFoundException(`Run ${runId} not found`);
    return { job, dialSpan: range.dialMax - range.dialMin };
  }
}
