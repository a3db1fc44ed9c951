import { BadRequestException, ConflictException, Inject, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import bcrypt from 'bcryptjs';
import type { DataSource, Repository } from 'typeorm';
import type { ListResponse, Role, User as UserView } from '@kilocycle/common/types';
import { AuditService } from '../audit/audit.service.js';
import { organizationScope, type AuthUser } from '../shared/auth-user.js';
import { APP_CONFIG, type AppConfig } from '../config/config.module.js';
import { OrganizationsReader, type OrganizationContact } from '../organizations/organizations.reader.js';
import { likePattern, paginate } from '../shared/paginate.js';
import { SessionsService } from './sessions.service.js';
import type { CreateUserDto, ListUsersQueryDto, UpdateUserDto } from './dto/user.dto.js';
import { assertPasswordAllowed } from './password-policy.js';
import { User } from './user.entity.js';

export function toUserView(user: User): UserView {
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    organizationId: user.organizationId,
    organizationName: user.organization?.name ?? '',
    active: user.active,
    createdAt: user.createdAt.toISOString(),
  };
}

/** A client belongs to a customer organisation; every other role to the lab (POST and PATCH alike). */
function assertRoleFitsOrganization(role: Role, organization: Pick<OrganizationContact, 'kind' | 'name'>): void {
  if (role === 'client' && organization.kind !== 'customer') {
    throw new BadRequestException('a client must belong to a customer organisation');
  }
  if (role !== 'client' && organization.kind !== 'lab') {
    throw new BadRequestException(`a ${role} must belong to the lab organisation (${organization.name} is a customer)`);
  }
}

const SORTABLE = { id: 'u.id', email: 'u.email', name: 'u.name', role: 'u.role', createdAt: 'u.createdAt', organizationName: 'o.name' };

@Injectable()
export class UsersService {
  constructor(
    @InjectRepository(User) private readonly users: Repository<User>,
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly sessions: SessionsService,
    private readonly organizations: OrganizationsReader,
  ) {}

  async list(actor: AuthUser, query: ListUsersQueryDto): Promise<ListResponse<UserView>> {
    const qb = this.users.createQueryBuilder('u').innerJoinAndSelect('u.organization', 'o');
    const scope = organizationScope(actor);
    if (scope !== null) qb.andWhere('u.organizationId = :scope', { scope });
    if (query.organizationId !== undefined) qb.andWhere('u.organizationId = :org', { org: query.organizationId });
    if (query.role) qb.andWhere('u.role = :role', { role: query.role });
    if (query.active !== undefined) qb.andWhere('u.active = :active', { active: query.active });
    if (query.q) qb.andWhere('(u.email LIKE :q OR u.name LIKE :q)', { q: likePattern(query.q) });
    return paginate(qb, query, SORTABLE, 'name', toUserView);
  }

  async get(actor: AuthUser, id: number): Promise<UserView> {
    const user = await this.users.findOne({ where: { id }, relations: { organization: true } });
    const scope = organizationScope(actor);
    // A client asking for another organisation's user is told it does not exist.
    if (!user || (scope !== null && user.organizationId !== scope)) throw new NotFoundException(`User ${id} not found`);
    return toUserView(user);
  }

  async create(actor: AuthUser, body: CreateUserDto): Promise<UserView> {
    assertPasswordAllowed(body.password, body);
    const id = await this.dataSource.transaction(async (manager) => {
      const organization = await this.organizations.byId(body.organizationId, manager);
      if (!organization) throw new BadRequestException(`organizationId ${body.organizationId} does not exist`);
      assertRoleFitsOrganization(body.role, organization);
      if (await manager.existsBy(User, { email: body.email })) {
        throw new ConflictException(`A user with e-mail ${body.email} already exists`);
      }
      const passwordHash = await bcrypt.hash(body.password, this.config.bcryptCost);
      const result = await manager.insert(User, {
        email: body.email,
        name: body.name,
        role: body.role,
        organizationId: body.organizationId,
        passwordHash,
      });
      const newId = result.identifiers[0].id as number;
      await this.audit.record(
        {
          actorId: actor.id,
          entity: 'user',
          entityId: newId,
          action: 'create',
          changes: { email: body.email, role: body.role, organizationId: body.organizationId },
        },
        manager,
      );
      return newId;
    });
    return this.get(actor, id);
  }

  async update(actor: AuthUser, id: number, body: UpdateUserDto): Promise<UserView> {
    const endsSessions = await this.dataSource.transaction(async (manager) => {
      const user = await manager.findOne(User, { where: { id }, relations: { organization: true } });
      if (!user) throw new NotFoundException(`User ${id} not found`);
      // The same rule as on creation: lab roles stay in the lab, a client stays with its customer.
      if (body.role !== undefined) assertRoleFitsOrganization(body.role, user.organization);
      if (body.password) assertPasswordAllowed(body.password, { name: body.name ?? user.name, email: user.email });
      if (id === actor.id && (body.active === false || (body.role && body.role !== actor.role))) {
        throw new BadRequestException('you cannot deactivate yourself or change your own role');
      }
      const changes: Record<string, unknown> = {};
      const patch: Partial<User> = {};
      for (const key of ['name', 'role', 'active'] as const) {
        if (body[key] !== undefined && body[key] !== user[key]) {
          changes[key] = { from: user[key], to: body[key] };
          Object.assign(patch, { [key]: body[key] });
        }
      }
      if (body.password) {
        patch.passwordHash = await bcrypt.hash(body.password, this.config.bcryptCost);
        changes.password = 'changed';
      }
      if (Object.keys(patch).length === 0) return false;
      await manager.update(User, { id }, patch);
      // Deactivation, a new role or a new password ends every session the user has open.
      const ends = patch.active === false || patch.role !== undefined || patch.passwordHash !== undefined;
      if (ends) await this.sessions.endAllSessions(manager, [id]);
      await this.audit.record({ actorId: actor.id, entity: 'user', entityId: id, action: 'update', changes }, manager);
      return ends;
    });
    if (endsSessions) this.sessions.announce({ kind: 'users', userIds: [id] });
    return this.get(actor, id);
  }
}
