import { Body, Controller, Get, Patch, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { Instrument as InstrumentView, ListResponse } from '@kilocycle/common/types';
import { BENCH_ROLES } from '@kilocycle/common/rules';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser, Roles } from '../shared/decorators.js';
import { CreateInstrumentDto, ListInstrumentsQueryDto, UpdateInstrumentDto } from './dto/instrument.dto.js';
import { InstrumentsService } from './instruments.service.js';
import { IdParam } from '../shared/id-param.decorator.js';

@ApiTags('instruments')
@ApiBearerAuth()
@Controller('instruments')
export class InstrumentsController {
  constructor(private readonly instruments: InstrumentsService) {}

  @Get()
  list(@CurrentUser() user: AuthUser, @Query() query: ListInstrumentsQueryDto): Promise<ListResponse<InstrumentView>> {
    return this.instruments.list(user, query);
  }

  @Get(':id')
  get(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<InstrumentView> {
    return this.instruments.get(user, id);
  }

  @Roles(...BENCH_ROLES)
  @Post()
  create(@CurrentUser() user: AuthUser, @Body() body: CreateInstrumentDto): Promise<InstrumentView> {
    return this.instruments.create(user, body);
  }

  @Roles(...BENCH_ROLES)
  @Patch(':id')
  update(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: UpdateInstrumentDto): Promise<InstrumentView> {
    return this.instruments.update(user, id, body);
  }
}
