import { Body, Controller, Get, Patch, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { ListResponse, ReferenceStandard } from '@kilocycle/common/types';
import { LAB_ROLES, MANAGER_ROLES } from '@kilocycle/common/rules';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser, Roles } from '../shared/decorators.js';
import { CreateStandardDto, ListStandardsQueryDto, UpdateStandardDto } from './dto/standard.dto.js';
import { StandardsService } from './standards.service.js';
import { IdParam } from '../shared/id-param.decorator.js';

// Standards are the lab's own equipment: customers do not see them here (their certificates name them).
@ApiTags('standards')
@ApiBearerAuth()
@Controller('standards')
export class StandardsController {
  constructor(private readonly standards: StandardsService) {}

  @Roles(...LAB_ROLES)
  @Get()
  list(@Query() query: ListStandardsQueryDto): Promise<ListResponse<ReferenceStandard>> {
    return this.standards.list(query);
  }

  @Roles(...LAB_ROLES)
  @Get(':id')
  get(@IdParam('id') id: number): Promise<ReferenceStandard> {
    return this.standards.get(id);
  }

  @Roles(...MANAGER_ROLES)
  @Post()
  create(@CurrentUser() user: AuthUser, @Body() body: CreateStandardDto): Promise<ReferenceStandard> {
    return this.standards.create(user, body);
  }

  @Roles(...MANAGER_ROLES)
  @Patch(':id')
  update(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: UpdateStandardDto): Promise<ReferenceStandard> {
    return this.standards.update(user, id, body);
  }
}
