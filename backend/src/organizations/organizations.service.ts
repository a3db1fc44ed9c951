import { BadRequestException, ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import type { DataSource, Repository } from 'typeorm';
import type { ListResponse, Organization as OrganizationView } from '@kilocycle/common/types';
import { AuditService } from '../audit/audit.service.js';
import { organizationScope, type AuthUser } from '../shared/auth-user.js';
import { AccountSessions } from '../shared/account-sessions.js';
import { likePattern, paginate } from '../shared/paginate.js';
import type { CreateOrganizationDto, ListOrganizationsQueryDto, UpdateOrganizationDto } from './dto/organization.dto.js';
import { Organization } from './organization.entity.js';

export function toOrganizationView(o: Organization): OrganizationView {
  return { id: o.id, name: o.name, kind: o.kind, contactEmail: o.contactEmail, active: o.active, createdAt: o.createdAt.toISOString() };
}

const SORTABLE = { id: 'o.id', name: 'o.name', kind: 'o.kind', createdAt: 'o.createdAt' };

@Injectable()
export class OrganizationsService {
  constructor(
    @InjectRepository(Organization) private readonly organizations: Repository<Organization>,
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
    private readonly sessions: AccountSessions,
  ) {}

  list(actor: AuthUser, query: ListOrganizationsQueryDto): Promise<ListResponse<OrganizationView>> {
    const qb = this.organizations.createQueryBuilder('o');
    const scope = organizationScope(actor);
    if (scope !== null) qb.andWhere('o.id = :scope', { scope });
    if (query.kind) qb.andWhere('o.kind = :kind', { kind: query.kind });
    if (query.active !== undefined) qb.andWhere('o.active = :active', { active: query.active });
    if (query.q) qb.andWhere('o.name LIKE :q', { q: likePattern(query.q) });
    return paginate(qb, query, SORTABLE, 'name', toOrganizationView);
  }

  async get(actor: AuthUser, id: number): Promise<OrganizationView> {
    const scope = organizationScope(actor);
    const found = await this.organizations.findOneBy({ id });
    if (!found || (scope !== null && found.id !== scope)) throw new NotFoundException(`Organisation ${id} not found`);
    return toOrganizationView(found);
  }

  async create(actor: AuthUser, body: CreateOrganizationDto): Promise<OrganizationView> {
    const id = await this.dataSource.transaction(async (manager) => {
      if (await manager.existsBy(Organization, { name: body.name })) {
        throw new ConflictException(`An organisation named "${body.name}" already exists`);
      }
      if (body.kind === 'lab' && (await manager.existsBy(Organization, { kind: 'lab' }))) {
        throw new BadRequestException('kind: there is already a lab organisation; new organisations are customers');
      }
      const result = await manager.insert(Organization, { name: body.name, kind: body.kind, contactEmail: body.contactEmail ?? null });
      const newId = result.identifiers[0].id as number;
      await this.audit.record({ actorId: actor.id, entity: 'organization', entityId: newId, action: 'create', changes: { ...body } }, manager);
      return newId;
    });
    return this.get(actor, id);
  }

  async update(actor: AuthUser, id: number, body: UpdateOrganizationDto): Promise<OrganizationView> {
    const ended = await this.dataSource.transaction(async (manager): Promise<number[]> => {
      const found = await manager.findOneBy(Organization, { id });
      if (!found) throw new NotFoundException(`Organisation ${id} not found`);
      if (found.kind === 'lab' && body.active === false) throw new BadRequestException('the lab organisation cannot be deactivated');
      if (body.name && body.name !== found.name && (await manager.existsBy(Organization, { name: body.name }))) {
        throw new ConflictException(`An organisation named "${body.name}" already exists`);
      }
      const changes: Record<string, unknown> = {};
      const patch: Partial<Organization> = {};
      for (const key of ['name', 'contactEmail', 'active'] as const) {
        if (body[key] !== undefined && body[key] !== found[key]) {
          changes[key] = { from: found[key], to: body[key] };
          Object.assign(patch, { [key]: body[key] });
        }
      }
      if (Object.keys(patch).length === 0) return [];
      await manager.update(Organization, { id }, patch);
      // Deactivating an organisation ends the sessions of all its users at once.
      const userIds = patch.active === false ? await this.sessions.endOrganizationSessions(manager, id) : [];
      await this.audit.record({ actorId: actor.id, entity: 'organization', entityId: id, action: 'update', changes }, manager);
      return userIds;
    });
    this.sessions.announce({ kind: 'users', userIds: ended });
    return this.get(actor, id);
  }
}
