import { Body, Controller, Get, HttpCode, NotFoundException, Patch, Post, Query, Res, StreamableFile } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import type { CreditNote, Invoice, ListResponse, Statement } from '@kilocycle/common/types';
import { BILLING_ROLES } from '@kilocycle/common/rules';
import type { AuthUser } from '../shared/auth-user.js';
import { attachmentDisposition } from '../shared/csv.js';
import { CurrentUser, Roles } from '../shared/decorators.js';
import { IdParam } from '../shared/id-param.decorator.js';
import { CreateCreditNoteDto, InvoiceExportQueryDto, ListInvoicesQueryDto, UpdateInvoiceDto } from './dto/invoice.dto.js';
import { InvoicesService } from './invoices.service.js';
import { OverdueRemindersService, type OverdueReminderResult } from './overdue-reminders.service.js';
import { StatementsService } from './statements.service.js';

function pdfResponse(res: Response, file: { data: Buffer; name: string }): StreamableFile {
  res.set({ 'Content-Type': 'application/pdf', 'Content-Disposition': attachmentDisposition(file.name), 'Cache-Control': 'private, no-store' });
  return new StreamableFile(file.data);
}

@ApiTags('invoices')
@ApiBearerAuth()
@Controller('invoices')
export class InvoicesController {
  constructor(
    private readonly invoices: InvoicesService,
    private readonly statements: StatementsService,
    private readonly reminders: OverdueRemindersService,
  ) {}

  /** Scoped: a client sees its own organisation's issued invoices (never drafts). */
  @Get()
  list(@CurrentUser() user: AuthUser, @Query() query: ListInvoicesQueryDto): Promise<ListResponse<Invoice>> {
    return this.invoices.list(user, query);
  }

  /** The bookkeeper's CSV of invoices, payments, refunds and credit notes dated from `from` to `to`. */
  @Roles(...BILLING_ROLES)
  @Get('export.csv')
  async export(@Query() query: InvoiceExportQueryDto, @Res({ passthrough: true }) res: Response): Promise<string> {
    const csv = await this.statements.exportCsv(query);
    res.set({
      'Content-Type': 'text/csv; charset=utf-8',
      'Content-Disposition': attachmentDisposition(`invoices-${query.from ?? 'start'}-to-${query.to ?? 'today'}.csv`),
      'Cache-Control': 'private, no-store',
    });
    return csv;
  }

  /** Sends the overdue reminders now (what the daily schedule does). */
  @Roles(...BILLING_ROLES)
  @Post('overdue-reminders/run')
  @HttpCode(200)
  remind(@CurrentUser() user: AuthUser): Promise<OverdueReminderResult> {
    return this.reminders.run(user.id);
  }

  @Get(':id')
  get(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<Invoice> {
    return this.invoices.get(user, id);
  }

  @Get(':id/pdf')
  async pdf(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    return pdfResponse(res, await this.invoices.pdf(user, id));
  }

  /** A draft's lines; an issued invoice answers 409. */
  @Roles(...BILLING_ROLES)
  @Patch(':id')
  update(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: UpdateInvoiceDto): Promise<Invoice> {
    return this.invoices.update(user, id, body);
  }

  @Roles(...BILLING_ROLES)
  @Post(':id/issue')
  @HttpCode(200)
  issue(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<Invoice> {
    return this.invoices.issue(user, id);
  }

  @Roles(...BILLING_ROLES)
  @Post(':id/credit-notes')
  creditNote(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Body() body: CreateCreditNoteDto): Promise<CreditNote> {
    return this.invoices.createCreditNote(user, id, body);
  }
}

@ApiTags('invoices')
@ApiBearerAuth()
@Controller('credit-notes')
export class CreditNotesController {
  constructor(private readonly invoices: InvoicesService) {}

  @Get(':id/pdf')
  async pdf(@CurrentUser() user: AuthUser, @IdParam('id') id: number, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    return pdfResponse(res, await this.invoices.creditNotePdf(user, id));
  }
}

@ApiTags('invoices')
@ApiBearerAuth()
@Controller('jobs')
export class JobInvoiceController {
  constructor(private readonly invoices: InvoicesService) {}

  /** A draft invoice for an issued job that has none (the signing makes one; this is for a job signed before billing). */
  @Roles(...BILLING_ROLES)
  @Post(':id/invoice')
  create(@CurrentUser() user: AuthUser, @IdParam('id') id: number): Promise<Invoice> {
    return this.invoices.createForJob(user, id);
  }
}

@ApiTags('invoices')
@ApiBearerAuth()
@Controller('organizations')
export class StatementController {
  constructor(
    private readonly statements: StatementsService,
    private readonly invoices: InvoicesService,
  ) {}

  /** The customer's statement (a client: its own organisation only). */
  @Get(':id/statement')
  statement(@CurrentUser() user: AuthUser, @IdParam('id', { refuse: () => new NotFoundException('Organization not found') }) id: number): Promise<Statement> {
    return this.statements.statement(user, id, this.invoices.currency);
  }
}
