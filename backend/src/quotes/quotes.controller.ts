import { Body, Controller, Get, HttpCode, Patch, Post, Query, Res, StreamableFile } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import type { ListResponse, Quote } from '@kilocycle/common/types';
import { BILLING_ROLES } from '@kilocycle/common/rules';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser, Roles } from '../shared/decorators.js';
import { IdParam } from '../shared/id-param.decorator.js';
import { AcceptQuoteDto, DeclineQuoteDto, ListQuotesQueryDto, UpdateQuoteDto } from './dto/quote.dto.js';
import { QuotesService } from './quotes.service.js';

/** Quotes: the lab reads all, a client its own organisation's once sent; admin and lead make and send them. */
@ApiTags('quotes')
@ApiBearerAuth()
@Controller('quotes')
export class QuotesController {
  constructor(private readonly quotes: QuotesService) {}

  @Get()
  list(@CurrentUser() user: AuthUser, @Query() query: ListQuotesQueryDto): Promise<ListResponse<Quote>> {
    return this.quotes.list(user, query);
  }

  @Get(':id')
  get(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<Quote> {
    return this.quotes.get(user, id);
  }

  @Get(':id/pdf')
  async pdf(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    const file = await this.quotes.pdf(user, id);
    res.set({ 'Content-Type': 'application/pdf', 'Content-Disposition': `attachment; filename="${file.name}"`, 'Cache-Control': 'private, no-store' });
    return new StreamableFile(file.data);
  }

  @Roles(...BILLING_ROLES)
  @Patch(':id')
  update(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: UpdateQuoteDto): Promise<Quote> {
    return this.quotes.update(user, id, body);
  }

  @Roles(...BILLING_ROLES)
  @Post(':id/send')
  @HttpCode(200)
  send(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<Quote> {
    return this.quotes.send(user, id);
  }

  /** The client of the quote's organisation (in the portal), or admin and lead recording an acceptance given another way. */
  @Roles(...BILLING_ROLES, 'client')
  @Post(':id/accept')
  @HttpCode(200)
  accept(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: AcceptQuoteDto): Promise<Quote> {
    return this.quotes.accept(user, id, body);
  }

  @Roles(...BILLING_ROLES, 'client')
  @Post(':id/decline')
  @HttpCode(200)
  decline(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: DeclineQuoteDto): Promise<Quote> {
    return this.quotes.decline(user, id, body);
  }
}

/** A job's new quote: POST /jobs/:id/quote. */
@ApiTags('quotes')
@ApiBearerAuth()
@Controller('jobs')
export class JobQuotesController {
  constructor(private readonly quotes: QuotesService) {}

  @Roles(...BILLING_ROLES)
  @Post(':id/quote')
  create(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<Quote> {
    return this.quotes.create(user, id);
  }
}
