import { Controller, Get, Query } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import { IsInt, IsOptional, IsString, Matches, MaxLength, Min } from 'class-validator';
import type { DataSource } from 'typeorm';
import type { AuditEventView, ListAuditQuery, ListResponse } from '@kilocycle/common/types';
import { LAB_ROLES } from '@kilocycle/common/rules';
import { Roles } from '../auth/decorators.js';
import { ListQueryDto } from '../shared/list-query.dto.js';
import { sortColumn } from '../shared/page-query.js';
import { likePattern } from '../shared/paginate.js';

export class ListAuditQueryDto extends ListQueryDto implements ListAuditQuery {
  @IsOptional() @IsString() @Matches(/^[a-z_]+$/, { message: 'entity must be a record kind such as job, run, reading' }) @MaxLength(40)
  entity?: string;

  @IsOptional() @IsString() @MaxLength(40)
  entityId?: string;

  @IsOptional() @Type(() => Number) @IsInt({ message: 'jobId must be a whole number' }) @Min(1)
  jobId?: number;

  @IsOptional() @IsString() @Matches(/^[a-z_]+$/, { message: 'action must be an action such as create, update, exclude' }) @MaxLength(40)
  action?: string;
}

const SORTABLE = { at: 'e.id', id: 'e.id', entity: 'e.entity', action: 'e.action' };

/** The audit log, for lab staff: one record's history, or a job's with its runs and exclusions. */
@ApiTags('audit')
@ApiBearerAuth()
@Controller('audit')
export class AuditController {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  @Roles(...LAB_ROLES)
  @Get()
  async list(@Query() query: ListAuditQueryDto): Promise<ListResponse<AuditEventView>> {
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
      const job = String(query.jobId);
      where.push(
        `((e.entity = 'job' AND e.entity_id = ?)
          OR (e.entity = 'run' AND e.entity_id IN (SELECT CAST(id AS CHAR) FROM runs WHERE job_id = ?))
          OR (e.entity = 'reading' AND e.entity_id IN (SELECT CAST(x.reading_id AS CHAR) FROM reading_exclusions x JOIN runs r ON r.id = x.run_id WHERE r.job_id = ?)))`,
      );
      params.push(job, query.jobId, query.jobId);
    }
    if (query.q) {
      where.push('(e.action LIKE ? OR u.name LIKE ?)');
      params.push(likePattern(query.q), likePattern(query.q));
    }
    const clause = where.length > 0 ? `WHERE ${where.join(' AND ')}` : '';
    const { column, direction } = sortColumn(query.sort ?? '-at', SORTABLE);
    const page = query.page ?? 1;
    const pageSize = query.pageSize ?? 50;
    const [[{ total }], rows] = await Promise.all([
      this.dataSource.query(`SELECT COUNT(*) AS total FROM audit_events e LEFT JOIN users u ON u.id = e.actor_id ${clause}`, params),
      this.dataSource.query(
        `SELECT e.id, e.actor_id, u.name AS actor_name, e.at, e.entity, e.entity_id, e.action, e.changes
           FROM audit_events e LEFT JOIN users u ON u.id = e.actor_id ${clause}
          ORDER BY ${column} ${direction}, e.id ${direction} LIMIT ? OFFSET ?`,
        [...params, pageSize, (page - 1) * pageSize],
      ),
    ]);
    return {
      total: Number(total),
      items: (rows as Array<Record<string, unknown>>).map((row) => ({
        id: Number(row.id),
        actorId: row.actor_id === null ? null : Number(row.actor_id),
        actorName: (row.actor_name as string | null) ?? null,
        at: new Date(row.at as string).toISOString(),
        entity: String(row.entity),
        entityId: String(row.entity_id),
        action: String(row.action),
        changes: typeof row.changes === 'string' ? (JSON.parse(row.changes) as Record<string, unknown>) : ((row.changes as Record<string, unknown> | null) ?? null),
      })),
    };
  }
}
