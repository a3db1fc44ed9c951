import { Body, Controller, Delete, Get, HttpCode, Patch, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { Bench as BenchView, BenchTokenResponse, ListResponse } from '@kilocycle/common/types';
import { LAB_ROLES } from '@kilocycle/common/rules';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser, Roles } from '../shared/decorators.js';
import { BenchesService } from './benches.service.js';
import { CreateBenchDto, ListBenchesQueryDto, UpdateBenchDto } from './dto/bench.dto.js';
import { IdParam } from '../shared/id-param.decorator.js';

@ApiTags('benches')
@ApiBearerAuth()
@Controller('benches')
export class BenchesController {
  constructor(private readonly benches: BenchesService) {}

  @Roles(...LAB_ROLES)
  @Get()
  list(@Query() query: ListBenchesQueryDto): Promise<ListResponse<BenchView>> {
    return this.benches.list(query);
  }

  @Roles(...LAB_ROLES)
  @Get(':id')
  get(@IdParam('id') id: number): Promise<BenchView> {
    return this.benches.get(id);
  }

  @Roles('admin')
  @Post()
  create(@CurrentUser() user: AuthUser, @Body() body: CreateBenchDto): Promise<BenchView> {
    return this.benches.create(user, body);
  }

  @Roles('admin')
  @Patch(':id')
  update(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: UpdateBenchDto): Promise<BenchView> {
    return this.benches.update(user, id, body);
  }

  /** Issues a fresh bridge token; the answer is the only time it is shown. */
  @Roles('admin')
  @Post(':id/token')
  issueToken(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<BenchTokenResponse> {
    return this.benches.issueToken(user, id);
  }

  @Roles('admin')
  @Delete(':id/token')
  @HttpCode(200)
  revokeToken(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<BenchView> {
    return this.benches.revokeToken(user, id);
  }
}
