import { Controller, Get, HttpCode, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { ListResponse, RecallNotice, RecallRunResult } from '@kilocycle/common/types';
import { MANAGER_ROLES } from '@kilocycle/common/rules';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser, Roles } from '../shared/decorators.js';
import { ListQueryDto } from '../shared/list-query.dto.js';
import { RecallService } from './recall.service.js';

@ApiTags('recall')
@ApiBearerAuth()
@Controller('recall')
export class RecallController {
  constructor(private readonly recall: RecallService) {}

  /** Reminders sent so far, newest first. */
  @Roles(...MANAGER_ROLES)
  @Get('notices')
  list(@Query() query: ListQueryDto): Promise<ListResponse<RecallNotice>> {
    return this.recall.list(query.page, query.pageSize);
  }

  /** Runs the reminder now (what the daily schedule and `bin/kilocycle remind` do). */
  @Roles('admin')
  @Post('run')
  @HttpCode(200)
  run(@CurrentUser() user: AuthUser): Promise<RecallRunResult> {
    return this.recall.run(user.id);
  }
}
