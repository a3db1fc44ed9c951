import { Body, Controller, Get, Patch, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { ListResponse, Organization as OrganizationView } from '@kilocycle/common/types';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser, Roles } from '../shared/decorators.js';
import { CreateOrganizationDto, ListOrganizationsQueryDto, UpdateOrganizationDto } from './dto/organization.dto.js';
import { OrganizationsService } from './organizations.service.js';
import { IdParam } from '../shared/id-param.decorator.js';

@ApiTags('organizations')
@ApiBearerAuth()
@Controller('organizations')
export class OrganizationsController {
  constructor(private readonly organizations: OrganizationsService) {}

  @Get()
  list(@CurrentUser() user: AuthUser, @Query() query: ListOrganizationsQueryDto): Promise<ListResponse<OrganizationView>> {
    return this.organizations.list(user, query);
  }

  @Get(':id')
  get(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<OrganizationView> {
    return this.organizations.get(user, id);
  }

  @Roles('admin')
  @Post()
  create(@CurrentUser() user: AuthUser, @Body() body: CreateOrganizationDto): Promise<OrganizationView> {
    return this.organizations.create(user, body);
  }

  @Roles('admin')
  @Patch(':id')
  update(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: UpdateOrganizationDto): Promise<OrganizationView> {
    return this.organizations.update(user, id, body);
  }
}
