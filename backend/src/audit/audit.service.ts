import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import type { EntityManager, Repository } from 'typeorm';
import { AuditEvent } from './audit-event.entity.js';

export type AuditEntry = {
  actorId: number | null;
  entity: string;
  entityId: string | number;
  action: string;
  changes?: Record<string, unknown> | null;
};

@Injectable()
export class AuditService {
  constructor(@InjectRepository(AuditEvent) private readonly events: Repository<AuditEvent>) {}

  /** Records one event; pass the transaction's manager so the event commits or rolls back with the change. */
  async record(entry: AuditEntry, manager?: EntityManager): Promise<void> {
    const repo = manager ? manager.getRepository(AuditEvent) : this.events;
    await repo.insert({
      actorId: entry.actorId,
      entity: entry.entity,
      entityId: String(entry.entityId),
      action: entry.action,
      changes: (entry.changes ?? null) as never,
    });
  }

  async forEntity(entity: string, entityId: string | number): Promise<AuditEvent[]> {
    return this.events.find({ where: { entity, entityId: String(entityId) }, order: { id: 'ASC' } });
  }
}
