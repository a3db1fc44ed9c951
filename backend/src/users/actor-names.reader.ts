import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { In, Like, type Repository } from 'typeorm';
import { ActorDirectory } from '../shared/actor-directory.js';
import { User } from './user.entity.js';

/** Users' names for the audit log (see ActorDirectory). */
@Injectable()
export class ActorNamesReader extends ActorDirectory {
  constructor(@InjectRepository(User) private readonly users: Repository<User>) {
    super();
  }

  async namesOf(ids: readonly number[]): Promise<Map<number, string>> {
    const unique = [...new Set(ids)];
    if (unique.length === 0) return new Map();
    const rows = await this.users.find({ select: { id: true, name: true }, where: { id: In(unique) } });
    return new Map(rows.map((u) => [u.id, u.name]));
  }

  async idsNamedLike(pattern: string): Promise<number[]> {
    const rows = await this.users.find({ select: { id: true }, where: { name: Like(pattern) } });
    return rows.map((u) => u.id);
  }
}
