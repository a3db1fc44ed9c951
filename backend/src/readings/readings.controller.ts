import { Body, Controller, Get, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { AppendReadingsResponse, ListResponse, Reading as ReadingView } from '@kilocycle/common/types';
import { LAB_ROLES } from '@kilocycle/common/rules';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser, Roles } from '../shared/decorators.js';
import { AppendReadingsDto, ExcludeReadingDto, ListReadingsQueryDto } from './dto/readings.dto.js';
import { ReadingsService } from './readings.service.js';
import { IdParam } from '../shared/id-param.decorator.js';

// Readings are a record: there is deliberately no route to change or delete one; a wrong one is excluded.
@ApiTags('readings')
@ApiBearerAuth()
@Controller('runs/:runId/readings')
export class ReadingsController {
  constructor(private readonly readings: ReadingsService) {}

  @Get()
  list(@CurrentUser() user: AuthUser, @IdParam('runId') runId: number, @Query() query: ListReadingsQueryDto): Promise<ListResponse<ReadingView>> {
    return this.readings.list(user, runId, query);
  }

  @Roles(...LAB_ROLES)
  @Post()
  append(@CurrentUser() user: AuthUser, @IdParam('runId') runId: number, @Body() body: AppendReadingsDto): Promise<AppendReadingsResponse> {
    return this.readings.append(user, runId, body.readings);
  }

  @Roles(...LAB_ROLES)
  @Post(':readingId/exclusion')
  exclude(
    @CurrentUser() user: AuthUser,
    @IdParam('runId') runId: number,
    @IdParam('readingId') readingId: number,
    @Body() body: ExcludeReadingDto,
  ): Promise<ReadingView> {
    return this.readings.exclude(user, runId, readingId, body.reason);
  }
}
