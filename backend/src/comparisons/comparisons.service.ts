import { Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource } from 'typeorm';
import type { ComparisonResult, InstrumentSensitivity, ListResponse, SavedComparison } from '@kilocycle/common/types';
import { AuditService } from '../audit/audit.service.js';
import type { AuthUser } from '../shared/auth-user.js';
import { instrumentLabel } from '../instruments/instruments.service.js';
import { paginateFlat } from '../shared/page-query.js';
import { likePattern } from '../shared/paginate.js';
import { ComparisonEngine } from './comparison-engine.service.js';
import { Comparison } from './comparison.entity.js';
import type { ComputeComparisonDto, CreateComparisonDto, ListComparisonsQueryDto, UpdateComparisonDto } from './dto/comparison.dto.js';
import { jsonColumn } from '../shared/json-column.js';

const SORTABLE = { id: 'c.id', title: 'c.title', createdAt: 'c.createdAt', updatedAt: 'c.updatedAt' };

export function toSavedComparison(c: Comparison): SavedComparison {
  return {
    id: c.id,
    title: c.title,
    notes: c.notes,
    instrumentId: c.instrumentId,
    instrumentLabel: c.instrument ? instrumentLabel(c.instrument) : '',
    kind: c.kind,
    runIds: jsonColumn<number[]>(c.runIds),
    labels: jsonColumn<string[]>(c.labels),
    withinHz: c.withinHz,
    windowSeconds: c.windowSeconds,
    createdById: c.createdById,
    createdByName: c.createdBy?.name ?? '',
    createdAt: c.createdAt.toISOString(),
    updatedAt: c.updatedAt.toISOString(),
  };
}

/** Saved comparisons (lab staff only: a comparison may mix customers' study runs with the lab's notes). */
@Injectable()
export class ComparisonsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly engine: ComparisonEngine,
    private readonly audit: AuditService,
  ) {}

  compute(body: ComputeComparisonDto): Promise<ComparisonResult> {
    return this.engine.compute(body);
  }

  async sensitivity(instrumentId: number): Promise<InstrumentSensitivity> {
    return this.engine.sensitivity(instrumentId);
  }

  list(query: ListComparisonsQueryDto): Promise<ListResponse<SavedComparison>> {
    const qb = this.baseQuery();
    if (query.instrumentId !== undefined) qb.andWhere('c.instrumentId = :instrumentId', { instrumentId: query.instrumentId });
    if (query.q) qb.andWhere('(c.title LIKE :q OR c.notes LIKE :q)', { q: likePattern(query.q) });
    return paginateFlat(qb, query, SORTABLE, '-createdAt', 'c.id', (found) => found.map(toSavedComparison));
  }

  async get(id: number): Promise<SavedComparison> {
    return toSavedComparison(await this.find(id));
  }

  async result(id: number): Promise<{ saved: SavedComparison; result: ComparisonResult }> {
    const saved = await this.get(id);
    const result = await this.engine.compute({
      runIds: saved.runIds,
      labels: saved.labels,
      ...(saved.withinHz !== null ? { withinHz: saved.withinHz } : {}),
      ...(saved.windowSeconds !== null ? { windowSeconds: saved.windowSeconds } : {}),
    });
    return { saved, result };
  }

  async create(actor: AuthUser, body: CreateComparisonDto): Promise<SavedComparison> {
    const checked = await this.engine.validateRuns(body.runIds, body.labels);
    const id = await this.dataSource.transaction(async (manager) => {
      const result = await manager.insert(Comparison, {
        title: body.title,
        notes: body.notes ?? null,
        instrumentId: checked.instrumentId,
        kind: checked.kind,
        runIds: body.runIds,
        labels: checked.labels,
        withinHz: body.withinHz ?? null,
        windowSeconds: body.windowSeconds ?? null,
        createdById: actor.id,
      });
      const newId = result.identifiers[0]!.id as number;
      await this.audit.record(
        { actorId: actor.id, entity: 'comparison', entityId: newId, action: 'create', changes: { title: body.title, runIds: body.runIds } },
        manager,
      );
      return newId;
    });
    return this.get(id);
  }

  async update(actor: AuthUser, id: number, body: UpdateComparisonDto): Promise<SavedComparison> {
    const current = await this.get(id);
    const runIds = body.runIds ?? current.runIds;
    // New runs without new labels start from "run <id>"; the same runs keep their labels.
    const labels = body.labels ?? (body.runIds ? undefined : current.labels);
    const checked = await this.engine.validateRuns(runIds, labels);
    const patch: Partial<Comparison> = {};
    const changes: Record<string, unknown> = {};
    const set = <K extends keyof Comparison>(key: K, value: Comparison[K], before: unknown) => {
      if (JSON.stringify(value) === JSON.stringify(before)) return;
      patch[key] = value;
      changes[key] = { from: before, to: value };
    };
    if (body.title !== undefined) set('title', body.title, current.title);
    if (body.notes !== undefined) set('notes', body.notes ?? null, current.notes);
    set('runIds', runIds, current.runIds);
    set('labels', checked.labels, current.labels);
    set('instrumentId', checked.instrumentId, current.instrumentId);
    set('kind', checked.kind, current.kind);
    if (body.withinHz !== undefined) set('withinHz', body.withinHz ?? null, current.withinHz);
    if (body.windowSeconds !== undefined) set('windowSeconds', body.windowSeconds ?? null, current.windowSeconds);
    if (Object.keys(patch).length > 0) {
      await this.dataSource.transaction(async (manager) => {
        await manager.update(Comparison, { id }, patch);
        await this.audit.record({ actorId: actor.id, entity: 'comparison', entityId: id, action: 'update', changes }, manager);
      });
    }
    return this.get(id);
  }

  async remove(actor: AuthUser, id: number): Promise<void> {
    const current = await this.get(id);
    await this.dataSource.transaction(async (manager) => {
      await manager.delete(Comparison, { id });
      await this.audit.record(
        {
          actorId: actor.id,
          entity: 'comparison',
          entityId: id,
          action: 'delete',
          changes: { title: current.title, runIds: current.runIds, labels: current.labels },
        },
        manager,
      );
    });
  }

  private async find(id: number): Promise<Comparison> {
    const found = await this.baseQuery().where('c.id = :id', { id }).getOne();
    if (!found) throw new NotFoundException(`Comparison ${id} not found`);
    return found;
  }

  private baseQuery() {
    return this.dataSource.getRepository(Comparison).createQueryBuilder('c').innerJoinAndSelect('c.instrument', 'i').innerJoinAndSelect('c.createdBy', 'u');
  }
}
