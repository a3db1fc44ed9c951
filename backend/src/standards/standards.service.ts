import { ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import type { DataSource, Repository } from 'typeorm';
import type { ListResponse, ReferenceStandard } from '@kilocycle/common/types';
import { AuditService } from '../audit/audit.service.js';
import type { AuthUser } from '../shared/auth-user.js';
import { dateOnly, todayIso } from '../shared/dto-helpers.js';
import { likePattern, paginate } from '../shared/paginate.js';
import type { CreateStandardDto, ListStandardsQueryDto, UpdateStandardDto } from './dto/standard.dto.js';
import { recordStandardVersion } from './standard-versions.js';
import { Standard } from './standard.entity.js';

export function toStandardView(s: Standard, today = todayIso()): ReferenceStandard {
  const dueDate = dateOnly(s.dueDate) ?? '';
  return {
    id: s.id,
    name: s.name,
    kind: s.kind,
    makeModel: s.makeModel,
    serial: s.serial,
    certificateNumber: s.certificateNumber,
    dueDate,
    timebaseAccuracyPpm: s.timebaseAccuracyPpm,
    resolutionHz: s.resolutionHz,
    calibrationUPpm: s.calibrationUPpm,
    calibrationK: s.calibrationK,
    active: s.active,
    overdue: dueDate < today,
    version: s.version,
  };
}

const SORTABLE = {
  id: 's.id',
  name: 's.name',
  kind: 's.kind',
  makeModel: 's.makeModel',
  serial: 's.serial',
  certificateNumber: 's.certificateNumber',
  dueDate: 's.dueDate',
  active: 's.active',
};
const EDITABLE = [
  'name',
  'kind',
  'makeModel',
  'serial',
  'certificateNumber',
  'dueDate',
  'timebaseAccuracyPpm',
  'resolutionHz',
  'calibrationUPpm',
  'calibrationK',
  'active',
] as const;

@Injectable()
export class StandardsService {
  constructor(
    @InjectRepository(Standard) private readonly standards: Repository<Standard>,
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
  ) {}

  list(query: ListStandardsQueryDto): Promise<ListResponse<ReferenceStandard>> {
    const qb = this.standards.createQueryBuilder('s');
    const today = todayIso();
    if (query.kind) qb.andWhere('s.kind = :kind', { kind: query.kind });
    if (query.active !== undefined) qb.andWhere('s.active = :active', { active: query.active });
    if (query.overdue === true) qb.andWhere('s.dueDate < :today', { today });
    if (query.overdue === false) qb.andWhere('s.dueDate >= :today', { today });
    if (query.dueBefore) qb.andWhere('s.dueDate <= :dueBefore', { dueBefore: query.dueBefore });
    if (query.q) {
      qb.andWhere('(s.name LIKE :q OR s.makeModel LIKE :q OR s.serial LIKE :q OR s.certificateNumber LIKE :q)', { q: likePattern(query.q) });
    }
    return paginate(qb, query, SORTABLE, 'name', (s) => toStandardView(s, today));
  }

  async get(id: number): Promise<ReferenceStandard> {
    const found = await this.standards.findOneBy({ id });
    if (!found) throw new NotFoundException(`Standard ${id} not found`);
    return toStandardView(found);
  }

  async create(actor: AuthUser, body: CreateStandardDto): Promise<ReferenceStandard> {
    const id = await this.dataSource.transaction(async (manager) => {
      if (await manager.existsBy(Standard, { name: body.name })) {
        throw new ConflictException(`A standard named "${body.name}" already exists`);
      }
      const result = await manager.insert(Standard, { ...body, active: true });
      const newId = result.identifiers[0].id as number;
      await recordStandardVersion(manager, newId, actor.id);
      await this.audit.record({ actorId: actor.id, entity: 'standard', entityId: newId, action: 'create', changes: { ...body, version: 1 } }, manager);
      return newId;
    });
    return this.get(id);
  }

  async update(actor: AuthUser, id: number, body: UpdateStandardDto): Promise<ReferenceStandard> {
    await this.dataSource.transaction(async (manager) => {
      const found = await manager.findOne(Standard, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!found) throw new NotFoundException(`Standard ${id} not found`);
      if (body.name && body.name !== found.name && (await manager.existsBy(Standard, { name: body.name }))) {
        throw new ConflictException(`A standard named "${body.name}" already exists`);
      }
      const current = { ...found, dueDate: dateOnly(found.dueDate) };
      const changes: Record<string, unknown> = {};
      const patch: Partial<Standard> = {};
      for (const key of EDITABLE) {
        if (body[key] !== undefined && body[key] !== current[key]) {
          changes[key] = { from: current[key], to: body[key] };
          Object.assign(patch, { [key]: body[key] });
        }
      }
      if (Object.keys(patch).length === 0) return;
      // An edit is a new version: jobs signed earlier keep the version they were signed with.
      const version = found.version + 1;
      await manager.update(Standard, { id }, { ...patch, version });
      await recordStandardVersion(manager, id, actor.id);
      await this.audit.record(
        { actorId: actor.id, entity: 'standard', entityId: id, action: 'update', changes: { ...changes, version: { from: found.version, to: version } } },
        manager,
      );
    });
    return this.get(id);
  }
}
