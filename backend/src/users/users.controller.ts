import { Body, Controller, Get, Patch, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { ListResponse, User as UserView } from '@kilocycle/common/types';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser, Roles } from '../shared/decorators.js';
import { CreateUserDto, ListUsersQueryDto, UpdateUserDto } from './dto/user.dto.js';
import { UsersService } from './users.service.js';
import { IdParam } from '../shared/id-param.decorator.js';

@ApiTags('users')
@ApiBearerAuth()
@Controller('users')
export class UsersController {
  constructor(private readonly users: UsersService) {}

  @Get()
  list(@CurrentUser() user: AuthUser, @Query() query: ListUsersQueryDto): Promise<ListResponse<UserView>> {
    return this.users.list(user, query);
  }

  @Get(':id')
  get(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<UserView> {
    return this.users.get(user, id);
  }

  @Roles('admin')
  @Post()
  create(@CurrentUser() user: AuthUser, @Body() body: CreateUserDto): Promise<UserView> {
    return this.users.create(user, body);
  }

  @Roles('admin')
  @Patch(':id')
  update(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: UpdateUserDto): Promise<UserView> {
    return this.users.update(user, id, body);
  }
}
