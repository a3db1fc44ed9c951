import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { In, type DataSource, type EntityManager, type Repository } from 'typeorm';
import type { Instrument as InstrumentView, ListResponse } from '@kilocycle/common/types';
import { AuditService } from '../audit/audit.service.js';
import { organizationScope, type AuthUser } from '../shared/auth-user.js';
import { OrganizationsReader } from '../organizations/organizations.reader.js';
import { dateOnly, todayIso } from '../shared/dto-helpers.js';
import { paginateFlat } from '../shared/page-query.js';
import { RangeUseSource } from '../shared/range-use.js';
import { likePattern } from '../shared/paginate.js';
import type { CreateInstrumentDto, ListInstrumentsQueryDto, RangeInputDto, UpdateInstrumentDto } from './dto/instrument.dto.js';
import { InstrumentRange } from './instrument-range.entity.js';
import { Instrument } from './instrument.entity.js';
import { assertRanges, measurementFieldsDiffer } from './range-rules.js';
import { rangeColumns, toRangeView } from './range-view.js';

export { toRangeView };

export function toInstrumentView(i: Instrument, ranges: InstrumentRange[]): InstrumentView {
  return {
    id: i.id,
    organizationId: i.organizationId,
    organizationName: i.organization?.name ?? '',
    make: i.make,
    model: i.model,
    serial: i.serial,
    assetTag: i.assetTag,
    description: i.description,
    recallIntervalMonths: i.recallIntervalMonths,
    nextDueDate: dateOnly(i.nextDueDate),
    ranges: [...ranges].sort((a, b) => a.position - b.position).map(toRangeView),
    createdAt: i.createdAt.toISOString(),
  };
}

/** How an instrument is named in job and run lists. */
export function instrumentLabel(i: Pick<Instrument, 'make' | 'model' | 'serial'>): string {
  return `${i.make} ${i.model} s/n ${i.serial}`;
}

const SORTABLE = {
  id: 'i.id',
  make: 'i.make',
  model: 'i.model',
  serial: 'i.serial',
  assetTag: 'i.assetTag',
  nextDueDate: 'i.nextDueDate',
  recallIntervalMonths: 'i.recallIntervalMonths',
  createdAt: 'i.createdAt',
  organizationName: 'o.name',
};
const FIELDS = ['make', 'model', 'serial', 'assetTag', 'description', 'recallIntervalMonths', 'nextDueDate'] as const;

@Injectable()
export class InstrumentsService {
  constructor(
    @InjectRepository(Instrument) private readonly instruments: Repository<Instrument>,
    @InjectRepository(InstrumentRange) private readonly ranges: Repository<InstrumentRange>,
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
    private readonly rangeUse: RangeUseSource,
    private readonly organizations: OrganizationsReader,
  ) {}

  list(actor: AuthUser, query: ListInstrumentsQueryDto): Promise<ListResponse<InstrumentView>> {
    const qb = this.instruments.createQueryBuilder('i').innerJoinAndSelect('i.organization', 'o');
    const scope = organizationScope(actor);
    if (scope !== null) qb.andWhere('i.organizationId = :scope', { scope });
    if (query.organizationId !== undefined) qb.andWhere('i.organizationId = :org', { org: query.organizationId });
    if (query.dueBefore) qb.andWhere('i.nextDueDate <= :dueBefore', { dueBefore: query.dueBefore });
    if (query.overdue === true) qb.andWhere('i.nextDueDate < :today', { today: todayIso() });
    if (query.overdue === false) qb.andWhere('(i.nextDueDate IS NULL OR i.nextDueDate >= :today)', { today: todayIso() });
    if (query.q) {
      qb.andWhere('(i.make LIKE :q OR i.model LIKE :q OR i.serial LIKE :q OR i.assetTag LIKE :q OR o.name LIKE :q)', { q: likePattern(query.q) });
    }
    return paginateFlat(qb, query, SORTABLE, 'make', 'i.id', async (found) => {
      const ranges = found.length === 0 ? [] : await this.ranges.find({ where: { instrumentId: In(found.map((i) => i.id)) } });
      return found.map((i) =>
        toInstrumentView(
          i,
          ranges.filter((r) => r.instrumentId === i.id),
        ),
      );
    });
  }

  /** The instrument if the actor may see it; 404 otherwise (another organisation's record does not exist for a client). */
  async findVisible(actor: AuthUser, id: number, manager?: EntityManager): Promise<Instrument> {
    const repo = manager ? manager.getRepository(Instrument) : this.instruments;
    const found = await repo.findOne({ where: { id }, relations: { organization: true, ranges: true } });
    const scope = organizationScope(actor);
    if (!found || (scope !== null && found.organizationId !== scope)) throw new NotFoundException(`Instrument ${id} not found`);
    return found;
  }

  async get(actor: AuthUser, id: number): Promise<InstrumentView> {
    const found = await this.findVisible(actor, id);
    return toInstrumentView(found, found.ranges);
  }

  async create(actor: AuthUser, body: CreateInstrumentDto): Promise<InstrumentView> {
    const ranges = body.ranges ?? [];
    assertRanges(ranges);
    if (ranges.some((r) => r.id !== undefined)) throw new BadRequestException("ranges: a new instrument's ranges have no id yet");
    const id = await this.dataSource.transaction(async (manager) => {
      const organization = await this.organizations.byId(body.organizationId, manager);
      if (!organization) throw new BadRequestException(`organizationId: organisation ${body.organizationId} does not exist`);
      if (!organization.active) throw new BadRequestException(`organizationId: organisation "${organization.name}" is deactivated`);
      await this.assertUniqueIdentity(manager, body.make, body.model, body.serial);
      const result = await manager.insert(Instrument, {
        organizationId: body.organizationId,
        make: body.make,
        model: body.model,
        serial: body.serial,
        assetTag: body.assetTag ?? null,
        description: body.description ?? null,
        recallIntervalMonths: body.recallIntervalMonths ?? 12,
        nextDueDate: body.nextDueDate ?? null,
      });
      const newId = result.identifiers[0].id as number;
      if (ranges.length > 0) {
        await manager.insert(
          InstrumentRange,
          ranges.map((r, index) => ({ ...rangeColumns(r), instrumentId: newId, position: index + 1 })),
        );
      }
      const { ranges: _ranges, ...fields } = body;
      await this.audit.record(
        { actorId: actor.id, entity: 'instrument', entityId: newId, action: 'create', changes: { ...fields, ranges: ranges.map((r) => r.label) } },
        manager,
      );
      return newId;
    });
    return this.get(actor, id);
  }

  async update(actor: AuthUser, id: number, body: UpdateInstrumentDto): Promise<InstrumentView> {
    if (body.ranges) assertRanges(body.ranges);
    await this.dataSource.transaction(async (manager) => {
      const found = await manager.findOne(Instrument, { where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!found) throw new NotFoundException(`Instrument ${id} not found`);
      const current = { ...found, nextDueDate: dateOnly(found.nextDueDate) };
      const changes: Record<string, unknown> = {};
      const patch: Partial<Instrument> = {};
      for (const key of FIELDS) {
        if (body[key] !== undefined && body[key] !== current[key]) {
          changes[key] = { from: current[key], to: body[key] };
          Object.assign(patch, { [key]: body[key] });
        }
      }
      if (patch.make !== undefined || patch.model !== undefined || patch.serial !== undefined) {
        await this.assertUniqueIdentity(manager, patch.make ?? found.make, patch.model ?? found.model, patch.serial ?? found.serial, id);
      }
      if (Object.keys(patch).length > 0) await manager.update(Instrument, { id }, patch);
      if (body.ranges) {
        const rangeChanges = await this.replaceRanges(manager, id, body.ranges);
        if (rangeChanges) changes.ranges = rangeChanges;
      }
      if (Object.keys(changes).length > 0) {
        await this.audit.record({ actorId: actor.id, entity: 'instrument', entityId: id, action: 'update', changes }, manager);
      }
    });
    return this.get(actor, id);
  }

  private async assertUniqueIdentity(manager: EntityManager, make: string, model: string, serial: string, exceptId?: number): Promise<void> {
    const clash = await manager.findOneBy(Instrument, { make, model, serial });
    if (clash && clash.id !== exceptId) {
      throw new ConflictException(`An instrument ${make} ${model} with serial ${serial} is already recorded (id ${clash.id})`);
    }
  }

  /**
   * Makes the instrument's ranges the given list, in order. A range a run uses cannot be removed, nor
   * can its dial law, dial span or tolerance change (its readings would mean something else).
   */
  private async replaceRanges(manager: EntityManager, instrumentId: number, wanted: RangeInputDto[]): Promise<Record<string, string[]> | null> {
    const existing = await manager.find(InstrumentRange, { where: { instrumentId } });
    const byId = new Map(existing.map((r) => [r.id, r]));
    const keptIds = new Set<number>();
    wanted.forEach((r, index) => {
      if (r.id === undefined) return;
      if (!byId.has(r.id)) throw new BadRequestException(`ranges[${index}].id: range ${r.id} is not one of this instrument's ranges`);
      if (keptIds.has(r.id)) throw new BadRequestException(`ranges[${index}].id: range ${r.id} is listed twice`);
      keptIds.add(r.id);
    });
    const used = await this.rangeUse.rangesWithRuns(
      existing.map((r) => r.id),
      manager,
    );
    const removed = existing.filter((r) => !keptIds.has(r.id));
    const blocked = removed.filter((r) => used.has(r.id));
    if (blocked.length > 0) {
      throw new ConflictException(
        `ranges: ${blocked.map((r) => `"${r.label}"`).join(', ')} already ${blocked.length === 1 ? 'has' : 'have'} runs and cannot be removed`,
      );
    }
    const changed: string[] = [];
    wanted.forEach((r, index) => {
      if (r.id === undefined) return;
      const before = byId.get(r.id)!;
      const differs = measurementFieldsDiffer(toRangeView(before), r);
      if (differs.length > 0 && used.has(r.id)) {
        throw new ConflictException(
          `ranges[${index}]: range "${before.label}" already has runs, so its ${differs.join(', ')} cannot change; add a new range instead`,
        );
      }
      if (
        differs.length > 0 ||
        before.label !== r.label ||
        before.position !== index + 1 ||
        canonicalList(before.multipliers) !== canonicalList(r.multipliers) ||
        before.freqMinHz !== r.freqMinHz ||
        before.freqMaxHz !== r.freqMaxHz
      ) {
        changed.push(r.label);
      }
    });
    const added = wanted.filter((r) => r.id === undefined);
    if (removed.length === 0 && added.length === 0 && changed.length === 0) return null;

    // Park the kept ranges out of the way so the (instrument, position) key never clashes mid-way.
    await manager.query('UPDATE instrument_ranges SET position = position + 100000 WHERE instrument_id = ?', [instrumentId]);
    if (removed.length > 0) await manager.delete(InstrumentRange, { id: In(removed.map((r) => r.id)) });
    for (const [index, r] of wanted.entries()) {
      if (r.id !== undefined) await manager.update(InstrumentRange, { id: r.id }, { ...rangeColumns(r), position: index + 1 });
    }
    const inserts = wanted.flatMap((r, index) => (r.id === undefined ? [{ ...rangeColumns(r), instrumentId, position: index + 1 }] : []));
    if (inserts.length > 0) await manager.insert(InstrumentRange, inserts);
    return { added: added.map((r) => r.label), removed: removed.map((r) => r.label), changed };
  }
}

function canonicalList(values: readonly number[]): string {
  return values.join(',');
}
