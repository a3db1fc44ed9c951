import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { Subject } from 'rxjs';
import type { DataSource, EntityManager, Repository } from 'typeorm';
import type { Bench as BenchView, BenchTokenResponse, ListResponse } from '@kilocycle/common/types';
import { AuditService } from '../audit/audit.service.js';
import type { AuthUser } from '../shared/auth-user.js';
import { likePattern, paginate } from '../shared/paginate.js';
import { StandardResultsReader } from '../standards/standard-results.reader.js';
import { Bench } from './bench.entity.js';
import { hashBenchToken, issueBenchToken } from './bench-token.js';
import type { CreateBenchDto, ListBenchesQueryDto, UpdateBenchDto } from './dto/bench.dto.js';

export function toBenchView(b: Bench): BenchView {
  return {
    id: b.id,
    name: b.name,
    location: b.location,
    defaultStandardId: b.defaultStandardId,
    defaultStandardName: b.defaultStandard?.name ?? null,
    hasToken: b.tokenHash !== null,
    tokenIssuedAt: b.tokenIssuedAt ? b.tokenIssuedAt.toISOString() : null,
    active: b.active,
  };
}

/** The bench a connecting bridge proved to be, by its token. */
export type BenchIdentity = { id: number; name: string; active: boolean };

const SORTABLE = { id: 'b.id', name: 'b.name', location: 'b.location', active: 'b.active' };

@Injectable()
export class BenchesService {
  /** Bench ids whose bridges must be disconnected now (token revoked or replaced, bench deactivated). */
  readonly credentialsChanged$ = new Subject<number>();

  constructor(
    @InjectRepository(Bench) private readonly benches: Repository<Bench>,
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
    private readonly standards: StandardResultsReader,
  ) {}

  list(query: ListBenchesQueryDto): Promise<ListResponse<BenchView>> {
    const qb = this.benches.createQueryBuilder('b').leftJoinAndSelect('b.defaultStandard', 's');
    if (query.active !== undefined) qb.andWhere('b.active = :active', { active: query.active });
    if (query.q) qb.andWhere('(b.name LIKE :q OR b.location LIKE :q)', { q: likePattern(query.q) });
    return paginate(qb, query, SORTABLE, 'name', toBenchView);
  }

  async get(id: number): Promise<BenchView> {
    const found = await this.benches.findOne({ where: { id }, relations: { defaultStandard: true } });
    if (!found) throw new NotFoundException(`Bench ${id} not found`);
    return toBenchView(found);
  }

  async create(actor: AuthUser, body: CreateBenchDto): Promise<BenchView> {
    const id = await this.dataSource.transaction(async (manager) => {
      if (await manager.existsBy(Bench, { name: body.name })) throw new ConflictException(`A bench named "${body.name}" already exists`);
      await this.checkStandard(manager, body.defaultStandardId);
      const result = await manager.insert(Bench, { name: body.name, location: body.location ?? null, defaultStandardId: body.defaultStandardId ?? null });
      const newId = result.identifiers[0].id as number;
      await this.audit.record({ actorId: actor.id, entity: 'bench', entityId: newId, action: 'create', changes: { ...body } }, manager);
      return newId;
    });
    return this.get(id);
  }

  async update(actor: AuthUser, id: number, body: UpdateBenchDto): Promise<BenchView> {
    let deactivated = false;
    await this.dataSource.transaction(async (manager) => {
      const found = await manager.findOneBy(Bench, { id });
      if (!found) throw new NotFoundException(`Bench ${id} not found`);
      if (body.name && body.name !== found.name && (await manager.existsBy(Bench, { name: body.name }))) {
        throw new ConflictException(`A bench named "${body.name}" already exists`);
      }
      if (body.defaultStandardId !== undefined) await this.checkStandard(manager, body.defaultStandardId);
      const changes: Record<string, unknown> = {};
      const patch: Partial<Bench> = {};
      for (const key of ['name', 'location', 'defaultStandardId', 'active'] as const) {
        if (body[key] !== undefined && body[key] !== found[key]) {
          changes[key] = { from: found[key], to: body[key] };
          Object.assign(patch, { [key]: body[key] });
        }
      }
      if (Object.keys(patch).length === 0) return;
      await manager.update(Bench, { id }, patch);
      await this.audit.record({ actorId: actor.id, entity: 'bench', entityId: id, action: 'update', changes }, manager);
      deactivated = found.active && body.active === false;
    });
    if (deactivated) this.credentialsChanged$.next(id);
    return this.get(id);
  }

  /** Issues a fresh token (the previous one stops working) and returns it; only its hash is kept. */
  async issueToken(actor: AuthUser, id: number): Promise<BenchTokenResponse> {
    const token = await this.dataSource.transaction(async (manager) => {
      const found = await manager.findOneBy(Bench, { id });
      if (!found) throw new NotFoundException(`Bench ${id} not found`);
      return issueBenchToken(manager, id, actor.id, 'api');
    });
    this.credentialsChanged$.next(id);
    return { benchId: id, token };
  }

  async revokeToken(actor: AuthUser, id: number): Promise<BenchView> {
    await this.dataSource.transaction(async (manager) => {
      const found = await manager.findOneBy(Bench, { id });
      if (!found) throw new NotFoundException(`Bench ${id} not found`);
      if (found.tokenHash === null) return;
      await manager.update(Bench, { id }, { tokenHash: null, tokenIssuedAt: null });
      await this.audit.record({ actorId: actor.id, entity: 'bench', entityId: id, action: 'token_revoke' }, manager);
    });
    this.credentialsChanged$.next(id);
    return this.get(id);
  }

  /** The bench holding this token, or null; one indexed lookup, done at each bridge handshake. */
  async findByToken(token: string): Promise<BenchIdentity | null> {
    const [row] = await this.dataSource.query('SELECT id, name, active FROM benches WHERE token_hash = ?', [hashBenchToken(token)]);
    return row ? { id: Number(row.id), name: String(row.name), active: Boolean(Number(row.active)) } : null;
  }

  private async checkStandard(manager: EntityManager, standardId: number | null | undefined): Promise<void> {
    if (standardId === undefined || standardId === null) return;
    if (!(await this.standards.references([standardId], manager)).has(standardId)) {
      throw new BadRequestException(`defaultStandardId: there is no reference standard ${standardId}`);
    }
  }
}
