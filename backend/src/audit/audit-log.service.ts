import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import type { EntityManager, Repository } from 'typeorm';
import type { AuditEventView, ListResponse } from '@kilocycle/common/types';
import { ActorDirectory } from '../shared/actor-directory.js';
import { sortColumn } from '../shared/page-query.js';
import { likePattern } from '../shared/paginate.js';
import { AuditEvent } from './audit-event.entity.js';
import type { ListAuditQueryDto } from './dto/list-audit-query.dto.js';

const SORTABLE = { at: 'e.id', id: 'e.id', entity: 'e.entity', action: 'e.action' };

/** Reads the audit log page by page (AuditService writes it). */
@Injectable()
export class AuditLogService {
  constructor(
    @InjectRepository(AuditEvent) private readonly events: Repository<AuditEvent>,
    private readonly actors: ActorDirectory,
  ) {}

  /** One page of the log; actors' names come from the users module (ActorDirectory), not a join. */
  async list(query: ListAuditQueryDto): Promise<ListResponse<AuditEventView>> {
    const { clause, params } = await this.filter(query);
    const { column, direction } = sortColumn(query.sort ?? '-at', SORTABLE);
    const page = query.page ?? 1;
    const pageSize = query.pageSize ?? 50;
    const [[{ total }], rows]: [Array<{ total: string | number }>, Array<Record<string, unknown>>] = await Promise.all([
      this.events.query(`SELECT COUNT(*) AS total FROM audit_events e ${clause}`, params),
      this.events.query(
        `SELECT e.id, e.actor_id, e.at, e.entity, e.entity_id, e.action, e.changes FROM audit_events e ${clause}
          ORDER BY ${column} ${direction}, e.id ${direction} LIMIT ? OFFSET ?`,
        [...params, pageSize, (page - 1) * pageSize],
      ),
    ]);
    const actorIds = rows.flatMap((row) => (row.actor_id === null ? [] : [Number(row.actor_id)]));
    const names = await this.actors.namesOf(actorIds);
    return {
      total: Number(total),
      items: rows.map((row) => {
        const actorId = row.actor_id === null ? null : Number(row.actor_id);
        return {
          id: Number(row.id),
          actorId,
          actorName: actorId === null ? null : (names.get(actorId) ?? null),
          at: new Date(row.at as string).toISOString(),
          entity: String(row.entity),
          entityId: String(row.entity_id),
          action: String(row.action),
          changes:
            typeof row.changes === 'string' ? (JSON.parse(row.changes) as Record<string, unknown>) : ((row.changes as Record<string, unknown> | null) ?? null),
        };
      }),
    };
  }

  /** What one actor did to these entities: the events of these actions, oldest first, with their changes parsed. */
  async actorEvents(
    entity: string,
    entityIds: readonly string[],
    actorId: number,
    actions: readonly string[],
    manager?: EntityManager,
  ): Promise<Array<{ entityId: string; action: string; changes: Record<string, unknown> | null }>> {
    if (entityIds.length === 0 || actions.length === 0) return [];
    const rows: Array<{ entity_id: string; action: string; changes: unknown }> = await (manager ?? this.events.manager).query(
      'SELECT entity_id, action, changes FROM audit_events WHERE entity = ? AND actor_id = ? AND action IN (?) AND entity_id IN (?) ORDER BY id',
      [entity, actorId, [...actions], [...entityIds]],
    );
    return rows.map((row) => ({
      entityId: String(row.entity_id),
      action: String(row.action),
      changes: (typeof row.changes === 'string' ? JSON.parse(row.changes) : row.changes) as Record<string, unknown> | null,
    }));
  }

  private async filter(query: ListAuditQueryDto): Promise<{ clause: string; params: unknown[] }> {
    const where: string[] = [];
    const params: unknown[] = [];
    if (query.entity) {
      where.push('e.entity = ?');
      params.push(query.entity);
    }
    if (query.entityId) {
      where.push('e.entity_id = ?');
      params.push(query.entityId);
    }
    if (query.action) {
      where.push('e.action = ?');
      params.push(query.action);
    }
    if (query.jobId !== undefined) {
      // A job's history takes in its runs and the readings excluded in them. These two id subqueries read
      // runs and reading_exclusions (not audit's tables); left until the runs and readings modules export
      // a reader of a job's record ids that this module can use without importing them back.
      const job = String(query.jobId);
      where.push(
        `((e.entity = 'job' AND e.entity_id = ?)
          OR (e.entity = 'run' AND e.entity_id IN (SELECT CAST(id AS CHAR) FROM runs WHERE job_id = ?))
          OR (e.entity = 'reading' AND e.entity_id IN (SELECT CAST(x.reading_id AS CHAR) FROM reading_exclusions x JOIN runs r ON r.id = x.run_id WHERE r.job_id = ?)))`,
      );
      params.push(job, query.jobId, query.jobId);
    }
    if (query.q) {
      const actorIds = await this.actors.idsNamedLike(likePattern(query.q));
      where.push(actorIds.length > 0 ? '(e.action LIKE ? OR e.actor_id IN (?))' : 'e.action LIKE ?');
      params.push(likePattern(query.q), ...(actorIds.length > 0 ? [actorIds] : []));
    }
    return { clause: where.length > 0 ? `WHERE ${where.join(' AND ')}` : '', params };
  }
}
