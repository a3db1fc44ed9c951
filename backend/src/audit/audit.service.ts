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
  /** When it happened, for records written after the fact (the demo's history); default: now. */
  at?: Date;
};

@Injectable()
export class AuditService {
  constructor(@InjectRepository(AuditEvent) private readonly events: Repository<AuditEvent>) {}

  /** The service over a transaction's manager, for code run outside Nest's injector (the CLI, the demo seed). */
  static within(manager: EntityManager): AuditService {
    return new AuditService(manager.getRepository(AuditEvent));
  }

  /**
   * Records one event; pass the transaction's manager so the event commits or rolls back with the change.
   * One plain INSERT: a repository insert would read the row back for its time stamp, a second round
   * trip on every write (the ingest path writes one event per batch).
   */
  async record(entry: AuditEntry, manager?: EntityManager): Promise<void> {
    const values = [
      entry.actorId,
      entry.entity,
      String(entry.entityId),
      entry.action,
      entry.changes === null || entry.changes === undefined ? null : JSON.stringify(entry.changes),
    ];
    const runner = manager ?? this.events.manager;
    if (entry.at)
      await runner.query('INSERT INTO audit_events (actor_id, entity, entity_id, action, changes, at) VALUES (?, ?, ?, ?, ?, ?)', [...values, entry.at]);
    else await runner.query('INSERT INTO audit_events (actor_id, entity, entity_id, action, changes) VALUES (?, ?, ?, ?, ?)', values);
  }

  /** The events of one action on these entities, newest first, with their changes parsed. */
  async latest(entity: string, action: string, entityIds: readonly string[]): Promise<Array<{ entityId: string; changes: Record<string, unknown> | null }>> {
    if (entityIds.length === 0) return [];
    const rows: Array<{ entity_id: string; changes: unknown }> = await this.events.manager.query(
      'SELECT entity_id, changes FROM audit_events WHERE entity = ? AND action = ? AND entity_id IN (?) ORDER BY id DESC',
      [entity, action, [...entityIds]],
    );
    return rows.map((row) => ({
      entityId: String(row.entity_id),
      changes: (typeof row.changes === 'string' ? JSON.parse(row.changes) : row.changes) as Record<string, unknown> | null,
    }));
  }

  async forEntity(entity: string, entityId: string | number): Promise<AuditEvent[]> {
    return this.events.find({ where: { entity, entityId: String(entityId) }, order: { id: 'ASC' } });
  }
}
