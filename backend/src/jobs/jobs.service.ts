import { BadRequestException, ConflictException, ForbiddenException, Inject, Injectable, NotFoundException, Optional } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { In, type DataSource, type EntityManager, type Repository } from 'typeorm';
import type { Job as JobView, JobStatus, ListResponse } from '@kilocycle/common/types';
import { AuditService } from '../audit/audit.service.js';
import { JobRunStatsSource } from '../shared/job-run-stats.js';
import { JOB_START_GATE, type JobStartGate } from '../shared/job-start-gate.js';
import { CERTIFICATE_BILLING, type CertificateBilling } from '../shared/certificate-billing.js';
import { organizationScope, type AuthUser } from '../shared/auth-user.js';
import { JobInstrumentReader } from '../instruments/job-instrument.reader.js';
import { instrumentLabel } from '../instruments/instruments.service.js';
import { dateOnly } from '../shared/dto-helpers.js';
import { paginateFlat } from '../shared/page-query.js';
import { likePattern } from '../shared/paginate.js';
import { AccountsReader } from '../users/accounts.reader.js';
import type { CreateJobDto, ListJobsQueryDto, UpdateJobDto } from './dto/job.dto.js';
import { ACTIVE_JOB_STATUSES, BUDGET_ROLES, LOCKED_JOB_STATUSES, jobTransitionRefusal } from '@kilocycle/common/rules';
import { Job } from './job.entity.js';

type JobExtras = { runCount: number; returnComment: string | null };

export function toJobView(j: Job, extras: JobExtras): JobView {
  return {
    id: j.id,
    number: j.number,
    instrumentId: j.instrumentId,
    instrumentLabel: j.instrument ? instrumentLabel(j.instrument) : '',
    organizationId: j.organizationId,
    organizationName: j.organization?.name ?? '',
    status: j.status,
    receivedDate: dateOnly(j.receivedDate) ?? '',
    conditionReceived: j.conditionReceived,
    technicianId: j.technicianId,
    technicianName: j.technician?.name ?? null,
    ambientTempC: j.ambientTempC,
    humidityPct: j.humidityPct,
    notes: j.notes,
    createdAt: j.createdAt.toISOString(),
    updatedAt: j.updatedAt.toISOString(),
    runCount: extras.runCount,
    returnComment: extras.returnComment,
  };
}

const SORTABLE = {
  id: 'j.id',
  number: 'j.number',
  status: 'j.status',
  receivedDate: 'j.receivedDate',
  createdAt: 'j.createdAt',
  updatedAt: 'j.updatedAt',
  organizationName: 'o.name',
  instrumentLabel: 'i.make',
  technicianName: 't.name',
};
const FIELDS = ['receivedDate', 'conditionReceived', 'technicianId', 'ambientTempC', 'humidityPct', 'notes'] as const;

@Injectable()
export class JobsService {
  constructor(
    @InjectRepository(Job) private readonly jobs: Repository<Job>,
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
    private readonly runStats: JobRunStatsSource,
    private readonly instruments: JobInstrumentReader,
    private readonly accounts: AccountsReader,
    @Optional() @Inject(JOB_START_GATE) private readonly startGate: JobStartGate | null = null,
    @Optional() @Inject(CERTIFICATE_BILLING) private readonly billing: CertificateBilling | null = null,
  ) {}

  /** To a client, each issued job's certificate release (held until its invoice is paid), so the portal can say why. */
  private async withReleases(actor: AuthUser, views: JobView[]): Promise<JobView[]> {
    const issued = views.filter((v) => v.status === 'issued').map((v) => v.id);
    if (!this.billing || actor.role !== 'client' || issued.length === 0) return views;
    const releases = await this.billing.releasesFor(actor, issued);
    return views.map((v) => (releases.has(v.id) ? { ...v, release: releases.get(v.id) } : v));
  }

  async list(actor: AuthUser, query: ListJobsQueryDto): Promise<ListResponse<JobView>> {
    const qb = this.baseQuery();
    const scope = organizationScope(actor);
    if (scope !== null) qb.andWhere('j.organizationId = :scope', { scope });
    if (query.organizationId !== undefined) qb.andWhere('j.organizationId = :org', { org: query.organizationId });
    if (query.instrumentId !== undefined) qb.andWhere('j.instrumentId = :instrumentId', { instrumentId: query.instrumentId });
    if (query.technicianId !== undefined) qb.andWhere('j.technicianId = :technicianId', { technicianId: query.technicianId });
    if (query.status) qb.andWhere('j.status IN (:...statuses)', { statuses: query.status.split(',') });
    if (query.q) {
      qb.andWhere('(j.number LIKE :q OR i.make LIKE :q OR i.model LIKE :q OR i.serial LIKE :q OR o.name LIKE :q)', { q: likePattern(query.q) });
    }
    const page = await paginateFlat(qb, query, SORTABLE, '-receivedDate', 'j.id', (found) => this.toViews(found));
    return { ...page, items: await this.withReleases(actor, page.items) };
  }

  /** The job if the actor may see it; 404 otherwise. */
  async findVisible(actor: AuthUser, id: number): Promise<Job> {
    const found = await this.baseQuery().where('j.id = :id', { id }).getOne();
    const scope = organizationScope(actor);
    if (!found || (scope !== null && found.organizationId !== scope)) throw new NotFoundException(`Job ${id} not found`);
    return found;
  }

  async get(actor: AuthUser, id: number): Promise<JobView> {
    const [view] = await this.withReleases(actor, await this.toViews([await this.findVisible(actor, id)]));
    return view!;
  }

  async create(actor: AuthUser, body: CreateJobDto): Promise<JobView> {
    const id = await this.dataSource.transaction(async (manager) => {
      const instrument = await this.instruments.lockForJob(body.instrumentId, manager);
      if (!instrument) throw new BadRequestException(`instrumentId: instrument ${body.instrumentId} does not exist`);
      const active = await manager.findOne(Job, { where: { instrumentId: instrument.id, status: In([...ACTIVE_JOB_STATUSES]) } });
      if (active) throw new ConflictException(`${instrument.label} already has job ${active.number} (${active.status}); finish that one first`);
      if (body.technicianId != null) await this.assertTechnician(manager, body.technicianId);
      const number = await this.nextNumber(manager, body.receivedDate);
      const result = await manager.insert(Job, {
        number,
        instrumentId: instrument.id,
        organizationId: instrument.organizationId,
        status: 'received',
        receivedDate: body.receivedDate,
        conditionReceived: body.conditionReceived ?? null,
        technicianId: body.technicianId ?? null,
        ambientTempC: body.ambientTempC ?? null,
        humidityPct: body.humidityPct ?? null,
        notes: body.notes ?? null,
      });
      const newId = result.identifiers[0].id as number;
      await this.audit.record({ actorId: actor.id, entity: 'job', entityId: newId, action: 'create', changes: { number, ...body } }, manager);
      return newId;
    });
    return this.get(actor, id);
  }

  async update(actor: AuthUser, id: number, body: UpdateJobDto): Promise<JobView> {
    await this.dataSource.transaction(async (manager) => {
      const job = await manager.findOne(Job, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!job) throw new NotFoundException(`Job ${id} not found`);
      const current = { ...job, receivedDate: dateOnly(job.receivedDate) };
      const changes: Record<string, unknown> = {};
      const patch: Partial<Job> = {};
      for (const key of FIELDS) {
        if (body[key] !== undefined && body[key] !== current[key]) {
          changes[key] = { from: current[key], to: body[key] };
          Object.assign(patch, { [key]: body[key] });
        }
      }
      if (Object.keys(patch).length > 0) {
        if (LOCKED_JOB_STATUSES.includes(job.status)) throw new ConflictException(`job ${job.number} is ${job.status}: its record can no longer change`);
        if (patch.technicianId != null) await this.assertTechnician(manager, patch.technicianId);
        await manager.update(Job, { id }, patch);
        await this.audit.record({ actorId: actor.id, entity: 'job', entityId: id, action: 'update', changes }, manager);
      }
      if (body.status !== undefined && body.status !== job.status) {
        await this.changeStatus(manager, actor, job, body.status, body.comment);
      } else if (body.comment !== undefined && body.status === undefined) {
        throw new BadRequestException('comment: a comment goes with a status change');
      }
    });
    return this.get(actor, id);
  }

  /** Moves a job along its workflow (also used when the first run opens); audited in the caller's transaction. */
  async changeStatus(
    manager: EntityManager,
    actor: Pick<AuthUser, 'id' | 'role'>,
    job: Pick<Job, 'id' | 'number' | 'status'>,
    to: JobStatus,
    comment?: string,
  ): Promise<void> {
    const refusal = jobTransitionRefusal(job.status, to, actor.role);
    if (refusal) {
      if (refusal.status === 403) throw new ForbiddenException(refusal.message);
      throw new ConflictException(`job ${job.number}: ${refusal.message}`);
    }
    if (job.status === 'received' && to === 'in_progress' && this.startGate) {
      // Work waits for what the gate's provider asks first (an accepted quote, when the customer requires one).
      const waiting = await this.startGate.startRefusal(job.id, manager);
      if (waiting) throw new ConflictException(`job ${job.number}: ${waiting}`);
    }
    if (to === 'returned' && !comment) throw new BadRequestException('comment: say what needs rework when returning a job');
    if (to === 'in_review') {
      if ((await this.runStats.readingCount(job.id, manager)) === 0) throw new ConflictException(`job ${job.number} has no readings yet: nothing to review`);
    }
    await manager.update(Job, { id: job.id }, { status: to });
    await this.audit.record(
      { actorId: actor.id, entity: 'job', entityId: job.id, action: 'status', changes: { from: job.status, to, comment: comment ?? null } },
      manager,
    );
    job.status = to;
  }

  private baseQuery() {
    return this.jobs
      .createQueryBuilder('j')
      .innerJoinAndSelect('j.instrument', 'i')
      .innerJoinAndSelect('j.organization', 'o')
      .leftJoinAndSelect('j.technician', 't');
  }

  private async toViews(found: Job[]): Promise<JobView[]> {
    if (found.length === 0) return [];
    const ids = found.map((j) => j.id);
    const counts = await this.runStats.runCounts(ids);
    const returned = found.filter((j) => j.status === 'returned').map((j) => String(j.id));
    const comments = new Map<number, string | null>();
    // Newest first: a returned job's comment is the one its latest return carried.
    for (const event of await this.audit.latest('job', 'status', returned)) {
      const changes = event.changes as { to?: string; comment?: string | null } | null;
      const jobId = Number(event.entityId);
      if (!comments.has(jobId) && changes?.to === 'returned') comments.set(jobId, changes.comment ?? null);
    }
    return found.map((j) => toJobView(j, { runCount: counts.get(j.id) ?? 0, returnComment: comments.get(j.id) ?? null }));
  }

  private async assertTechnician(manager: EntityManager, userId: number): Promise<void> {
    const user = await this.accounts.byId(userId, manager);
    if (!user || !user.active || !BUDGET_ROLES.includes(user.role)) {
      throw new BadRequestException(`technicianId: user ${userId} is not an active technician or lead`);
    }
  }

  /** J<year>-<nnnn>, counting up within the year the instrument was received. */
  private async nextNumber(manager: EntityManager, receivedDate: string): Promise<string> {
    const prefix = `J${receivedDate.slice(0, 4)}-`;
    const [last] = await manager.query('SELECT number FROM jobs WHERE number LIKE ? ORDER BY LENGTH(number) DESC, number DESC LIMIT 1 FOR UPDATE', [
      `${prefix}%`,
    ]);
    const next = last ? Number(String(last.number).slice(prefix.length)) + 1 : 1;
    return `${prefix}${String(next).padStart(4, '0')}`;
  }
}
