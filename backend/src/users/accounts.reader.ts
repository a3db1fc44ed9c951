import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import type { EntityManager, Repository } from 'typeorm';
import type { SessionUser } from '@kilocycle/common/types';
import { User } from './user.entity.js';

/** An account as sign-in and the session check read it. */
export type Account = SessionUser & { tokenVersion: number; active: boolean; organizationActive: boolean };

function toAccount(user: User): Account {
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    organizationId: user.organizationId,
    tokenVersion: user.tokenVersion,
    active: user.active,
    organizationActive: user.organization.active,
  };
}

/** Accounts for the auth module: one primary-key or e-mail read of the user, joined to its organisation. */
@Injectable()
export class AccountsReader {
  constructor(@InjectRepository(User) private readonly users: Repository<User>) {}

  async byId(id: number, manager?: EntityManager): Promise<Account | null> {
    const user = await (manager?.getRepository(User) ?? this.users).findOne({ where: { id }, relations: { organization: true } });
    return user ? toAccount(user) : null;
  }

  async byEmail(email: string): Promise<Account | null> {
    const user = await this.users.findOne({ where: { email: email.toLowerCase() }, relations: { organization: true } });
    return user ? toAccount(user) : null;
  }

  /** The active account of an active organisation with this e-mail, with its password hash, or null. */
  async signInCandidate(email: string): Promise<(Account & { passwordHash: string }) | null> {
    const user = await this.users
      .createQueryBuilder('u')
      .addSelect('u.passwordHash')
      .innerJoinAndSelect('u.organization', 'o')
      .where('u.email = :email', { email: email.toLowerCase() })
      .andWhere('u.active = 1 AND o.active = 1')
      .getOne();
    return user ? { ...toAccount(user), passwordHash: user.passwordHash } : null;
  }

  /** The password hash of this account (active or not), or null: for the password asked again at signing. */
  async passwordHash(id: number): Promise<string | null> {
    const user = await this.users.createQueryBuilder('u').addSelect('u.passwordHash').where('u.id = :id', { id }).getOne();
    return user?.passwordHash ?? null;
  }
}
