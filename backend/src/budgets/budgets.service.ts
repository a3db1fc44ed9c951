import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';
import type {
  JobResults,
  ListResponse,
  Procedure as ProcedureView,
  RunBudget as RunBudgetView,
} from '@kilocycle/common/types';
import { CAPTURE_DEFAULTS } from '@kilocycle/common/types';
import { AuditService } from '../audit/audit.service.js';
import type { AuthUser } from '../shared/auth-user.js';
import { assertJobEditable, isJobSigned } from '../shared/job-guards.js';
import { likePattern, paginate } from '../shared/paginate.js';
import { SignedResultsSource } from '../shared/signed-results.js';
import { User } from '../users/user.entity.js';
import type { CreateProcedureDto, ListProceduresQueryDto, UpdateProcedureDto, UpdateRunBudgetDto } from './dto/budget.dto.js';
import { findScopedJob, findScopedRun } from './job-access.js';
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
      const result = await manager.insert(Procedure, { ...body, extraComponents: body.extraComponents.map((c) => ({ ...c })), isDefault: body.isDefault ?? false });
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
    await findScopedJob(this.dataSource.manager, user, jobId);
    const figures = await this.jobResults.procedure(jobId);
    return this.getProcedure(figures.id);
  }

  async setJobProcedure(actor: AuthUser, jobId: number, procedureId: number): Promise<ProcedureView> {
    await this.dataSource.transaction(async (manager) => {
      const job = await findScopedJob(manager, actor, jobId, true);
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
    const { run, job } = await findScopedRun(manager, user, runId);
    const procedure = await this.jobResults.procedure(job.id, manager);
    const row = await manager.findOneBy(RunBudget, { runId });
    const overrides = row
      ? { dialHalfDivision: row.dialHalfDivision, driftPpm: row.driftPpm, driftHz: row.driftHz, counterResolutionHz: row.counterResolutionHz, extraComponents: row.extraComponents, note: row.note }
      : { dialHalfDivision: null, driftPpm: null, driftHz: null, counterResolutionHz: null, extraComponents: null, note: null };
    const effective = effectiveFigures(procedure, overrides, run.range.dialMax - run.range.dialMin);
    const updatedBy = row?.updatedById ? await manager.findOneBy(User, { id: row.updatedById }) : null;
    return {
      runId,
      ...overrides,
      effective: { procedureId: procedure.id, procedureName: procedure.name, ...effective },
      updatedAt: row ? row.updatedAt.toISOString() : null,
      updatedByName: updatedBy?.name ?? null,
      editable: !isJobSigned(job.status),
    };
  }

  async updateRunBudget(actor: AuthUser, runId: number, body: UpdateRunBudgetDto): Promise<RunBudgetView> {
    await this.dataSource.transaction(async (manager) => {
      const { job } = await findScopedRun(manager, actor, runId);
      const locked = await findScopedJob(manager, actor, job.id, true);
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
      await this.audit.record({ actorId: actor.id, entity: 'run', entityId: runId, action: 'budget', changes: { jobId: job.id, jobNumber: locked.number, ...changes } }, manager);
    });
    return this.runBudget(actor, runId);
  }

  /** A signed job's results are the ones it was signed with; an open job's are computed now. */
  async results(user: AuthUser, jobId: number): Promise<JobResults> {
    await findScopedJob(this.dataSource.manager, user, jobId);
    const signed = await this.signedResults.signedResults(jobId);
    return signed ?? this.jobResults.compute(jobId);
  }
}
