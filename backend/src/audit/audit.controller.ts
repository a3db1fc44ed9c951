import { Controller, Get, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { AuditEventView, ListResponse } from '@kilocycle/common/types';
import { LAB_ROLES } from '@kilocycle/common/rules';
import { Roles } from '../shared/decorators.js';
import { AuditLogService } from './audit-log.service.js';
import { ListAuditQueryDto } from './dto/list-audit-query.dto.js';

export { ListAuditQueryDto };

/** The audit log, for lab staff: one record's history, or a job's with its runs and exclusions. */
@ApiTags('audit')
@ApiBearerAuth()
@Controller('audit')
export class AuditController {
  constructor(private readonly log: AuditLogService) {}

  @Roles(...LAB_ROLES)
  @Get()
  list(@Query() query: ListAuditQueryDto): Promise<ListResponse<AuditEventView>> {
    return this.log.list(query);
  }
}
