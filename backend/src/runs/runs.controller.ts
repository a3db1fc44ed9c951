import { Body, Controller, Get, Patch, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { ListResponse, Run as RunView } from '@kilocycle/common/types';
import { LAB_ROLES } from '@kilocycle/common/rules';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser, Roles } from '../shared/decorators.js';
import { CreateRunDto, ListRunsQueryDto, UpdateRunDto } from './dto/run.dto.js';
import { RunsService } from './runs.service.js';
import { IdParam } from '../shared/id-param.decorator.js';

@ApiTags('runs')
@ApiBearerAuth()
@Controller('runs')
export class RunsController {
  constructor(private readonly runs: RunsService) {}

  @Get()
  list(@CurrentUser() user: AuthUser, @Query() query: ListRunsQueryDto): Promise<ListResponse<RunView>> {
    return this.runs.list(user, query);
  }

  @Get(':id')
  get(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<RunView> {
    return this.runs.get(user, id);
  }

  @Roles(...LAB_ROLES)
  @Patch(':id')
  update(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: UpdateRunDto): Promise<RunView> {
    return this.runs.update(user, id, body);
  }
}

/** Runs are opened on a job: POST /api/jobs/:jobId/runs. */
@ApiTags('runs')
@ApiBearerAuth()
@Controller('jobs/:jobId/runs')
export class JobRunsController {
  constructor(private readonly runs: RunsService) {}

  @Get()
  list(@CurrentUser() user: AuthUser, @IdParam('jobId') jobId: number, @Query() query: ListRunsQueryDto): Promise<ListResponse<RunView>> {
    return this.runs.listForJob(user, jobId, query);
  }

  @Roles(...LAB_ROLES)
  @Post()
  open(@CurrentUser() user: AuthUser, @IdParam('jobId') jobId: number, @Body() body: CreateRunDto): Promise<RunView> {
    return this.runs.open(user, jobId, body);
  }
}
