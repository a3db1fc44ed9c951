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

  /**
   * Records one event; pass the transaction's manager so the event commits or rolls back with the change.
   * One plain INSERT: a repository insert would read the row back for its time stamp, a second round
   * trip on every write (the ingest path writes one event per batch).
   */
  async record(entry: AuditEntry, manager?: EntityManager): Promise<void> {
    await (manager ?? this.events.manager).query('INSERT INTO audit_events (actor_id, entity, entity_id, action, changes) VALUES (?, ?, ?, ?, ?)', [
      entry.actorId,
      entry.entity,
      String(entry.entityId),
      entry.action,
      entry.changes === null || entry.changes === undefined ? null : JSON.stringify(entry.changes),
    ]);
  }

  async forEntity(entity: string, entityId: string | number): Promise<AuditEvent[]> {
    return this.events.find({ where: { entity, entityId: String(entityId) }, order: { id: 'ASC' } });
  }
}
