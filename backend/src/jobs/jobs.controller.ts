import { Body, Controller, Get, Patch, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { Job as JobView, ListResponse } from '@kilocycle/common/types';
import { BENCH_ROLES } from '@kilocycle/common/rules';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser, Roles } from '../shared/decorators.js';
import { CreateJobDto, ListJobsQueryDto, UpdateJobDto } from './dto/job.dto.js';
import { JobsService } from './jobs.service.js';
import { IdParam } from '../shared/id-param.decorator.js';

@ApiTags('jobs')
@ApiBearerAuth()
@Controller('jobs')
export class JobsController {
  constructor(private readonly jobs: JobsService) {}

  @Get()
  list(@CurrentUser() user: AuthUser, @Query() query: ListJobsQueryDto): Promise<ListResponse<JobView>> {
    return this.jobs.list(user, query);
  }

  @Get(':id')
  get(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<JobView> {
    return this.jobs.get(user, id);
  }

  @Roles(...BENCH_ROLES)
  @Post()
  create(@CurrentUser() user: AuthUser, @Body() body: CreateJobDto): Promise<JobView> {
    return this.jobs.create(user, body);
  }

  @Roles(...BENCH_ROLES)
  @Patch(':id')
  update(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: UpdateJobDto): Promise<JobView> {
    return this.jobs.update(user, id, body);
  }
}
