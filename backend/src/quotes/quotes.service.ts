import { BadRequestException, ConflictException, Inject, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { documentTotals, dueDate, formatMoney, lineAmounts } from '@kilocycle/common/money';
import { quoteTransitionRefusal } from '@kilocycle/common/rules';
import type { AcceptanceChannel, BillingLine, BillingLineInput, CustomerTerms, ListResponse, Quote as QuoteView, QuoteStatus } from '@kilocycle/common/types';
import { In, type DataSource, type EntityManager, type Repository } from 'typeorm';
import { AuditService } from '../audit/audit.service.js';
import { CertificateSettingsReader } from '../certificates/certificate-settings.reader.js';
import { APP_CONFIG, type AppConfig } from '../config/config.module.js';
import { JobScopeReader } from '../jobs/job-scope.reader.js';
import { JobsService } from '../jobs/jobs.service.js';
import { MailService } from '../mail/mail.service.js';
import { OrganizationsReader } from '../organizations/organizations.reader.js';
import { CustomerTermsReader } from '../prices/customer-terms.reader.js';
import { PricesService } from '../prices/prices.service.js';
import { ProposedLinesReader } from '../prices/proposed-lines.reader.js';
import { organizationScope, type AuthUser } from '../shared/auth-user.js';
import { dateOnly } from '../shared/dto-helpers.js';
import { paginateFlat } from '../shared/page-query.js';
import { likePattern } from '../shared/paginate.js';
import { FileStore } from '../storage/file-store.service.js';
import type { AcceptQuoteDto, DeclineQuoteDto, ListQuotesQueryDto, UpdateQuoteDto } from './dto/quote.dto.js';
import { renderQuotePdf, type QuotePdfData } from './quote-pdf.js';
import { QuoteLine } from './quote-line.entity.js';
import { effectiveStatus, utcDay } from './quote-status.js';
import { Quote } from './quote.entity.js';

/** Days a new quote stays open once sent, until the lead changes it. */
export const DEFAULT_VALIDITY_DAYS = 30;

/** Q-000123: the quote's id, so numbers never repeat (they may skip: a quote whose creation rolled back used its id). */
export function quoteNumber(id: number): string {
  return `Q-${String(id).padStart(6, '0')}`;
}

/** The customer's tax treatment as lines are priced: exempt customers are charged 0 bp. */
export function taxTreatment(terms: CustomerTerms): { exempt: boolean; rateBasisPoints: number; registration: string | null } {
  const exempt = terms.taxRateId === null;
  return { exempt, rateBasisPoints: exempt ? 0 : (terms.taxRateBasisPoints ?? 0), registration: exempt ? terms.taxRegistration : null };
}

/** Lines priced per line at one rate (common/src/money), positions 1, 2, … in order. */
export function priceLines(lines: readonly BillingLineInput[], rateBasisPoints: number): BillingLine[] {
  return lines.map((line, index) => ({
    priceItemId: line.priceItemId ?? null,
    code: line.code ?? null,
    description: line.description,
    unit: line.unit,
    quantityMilli: line.quantityMilli,
    unitPriceMinor: line.unitPriceMinor,
    position: index + 1,
    taxRateBasisPoints: rateBasisPoints,
    ...lineAmounts(line.quantityMilli, line.unitPriceMinor, rateBasisPoints),
  }));
}

export function totalsOf(lines: readonly BillingLine[]) {
  return documentTotals(lines.map((l) => ({ netMinor: l.netMinor, taxMinor: l.taxMinor, rateBasisPoints: l.taxRateBasisPoints })));
}

const toLine = (l: QuoteLine): BillingLine => ({
  priceItemId: l.priceItemId,
  code: l.code,
  description: l.description,
  unit: l.unit,
  quantityMilli: l.quantityMilli,
  unitPriceMinor: l.unitPriceMinor,
  position: l.position,
  taxRateBasisPoints: l.taxRateBasisPoints,
  netMinor: l.netMinor,
  taxMinor: l.taxMinor,
  grossMinor: l.grossMinor,
});

const SORTABLE = {
  id: 'q.id',
  number: 'q.id',
  status: 'q.status',
  createdAt: 'q.createdAt',
  updatedAt: 'q.updatedAt',
  sentAt: 'q.sentAt',
  validUntil: 'q.validUntil',
  grossMinor: 'q.grossMinor',
  jobNumber: 'j.number',
  organizationName: 'o.name',
};

const CHANNEL_WORDS = 'phone, email or in_person';

/** Quotes of jobs: made from the proposed lines, edited while draft, sent as a PDF by mail, accepted or declined. */
@Injectable()
export class QuotesService {
  constructor(
    @InjectRepository(Quote) private readonly quotes: Repository<Quote>,
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly audit: AuditService,
    private readonly jobScopes: JobScopeReader,
    private readonly jobs: JobsService,
    private readonly terms: CustomerTermsReader,
    private readonly proposed: ProposedLinesReader,
    private readonly prices: PricesService,
    private readonly organizations: OrganizationsReader,
    private readonly settings: CertificateSettingsReader,
    private readonly files: FileStore,
    private readonly mail: MailService,
  ) {}

  // ---- reads ----

  async list(actor: AuthUser, query: ListQuotesQueryDto): Promise<ListResponse<QuoteView>> {
    const qb = this.baseQuery();
    const scope = organizationScope(actor);
    if (scope !== null) qb.andWhere('q.organizationId = :scope AND q.status <> :draft', { scope, draft: 'draft' });
    if (query.jobId !== undefined) qb.andWhere('q.jobId = :jobId', { jobId: query.jobId });
    if (query.organizationId !== undefined) qb.andWhere('q.organizationId = :org', { org: query.organizationId });
    const today = utcDay(new Date());
    // A sent quote past its last valid day reads as expired, so the filters follow what the list shows.
    if (query.status === 'expired') qb.andWhere("(q.status = 'expired' OR (q.status = 'sent' AND q.validUntil < :today))", { today });
    else if (query.status === 'sent') qb.andWhere("q.status = 'sent' AND (q.validUntil IS NULL OR q.validUntil >= :today)", { today });
    else if (query.status) qb.andWhere('q.status = :status', { status: query.status });
    if (query.q) qb.andWhere('(q.number LIKE :q OR j.number LIKE :q OR o.name LIKE :q)', { q: likePattern(query.q) });
    return paginateFlat(qb, query, SORTABLE, '-createdAt', 'q.id', (found) => this.toViews(found));
  }

  async get(actor: AuthUser, id: number): Promise<QuoteView> {
    const found = await this.baseQuery().where('q.id = :id', { id }).getOne();
    if (!found || !this.maysee(actor, found)) throw new NotFoundException(`Quote ${id} not found`);
    const [view] = await this.toViews([found]);
    return view!;
  }

  /** The PDF: as sent (from the file store), or drawn now for a draft (staff only see drafts). */
  async pdf(actor: AuthUser, id: number): Promise<{ name: string; data: Buffer }> {
    const quote = await this.get(actor, id);
    const row = await this.quotes.findOneByOrFail({ id });
    const name = `${quote.number}.pdf`;
    if (row.pdfFileId !== null) {
      const data = await this.files.get(row.pdfFileId, 'quote-pdf');
      if (!data) throw new NotFoundException(`The PDF of quote ${quote.number} is missing from the file store`);
      return { name, data };
    }
    const terms = await this.terms.termsFor(quote.organizationId);
    return { name, data: await renderQuotePdf(await this.pdfData(actor, quote, terms, new Date(), null)) };
  }

  // ---- changes ----

  /** A new draft with the job's proposed lines, priced with the customer's tax treatment; 409 while the job has a draft or sent quote. */
  async create(actor: AuthUser, jobId: number): Promise<QuoteView> {
    const now = new Date();
    const id = await this.dataSource.transaction(async (manager) => {
      const job = await this.jobScopes.scope(jobId, manager, true);
      if (!job) throw new NotFoundException(`Job ${jobId} not found`);
      const open = await manager.find(Quote, { where: { jobId, status: In(['draft', 'sent']) }, lock: { mode: 'pessimistic_write' } });
      for (const quote of open) {
        if (effectiveStatus(quote, now) === 'expired') await this.storeExpired(manager, quote);
        else
          throw new ConflictException(
            `job ${job.number} already has quote ${quote.number} (${quote.status}); change or finish that one instead of making another`,
          );
      }
      const tax = taxTreatment(await this.terms.termsFor(job.organizationId, manager));
      const lines = priceLines(await this.proposed.proposedLines(jobId, manager), tax.rateBasisPoints);
      const totals = totalsOf(lines);
      const result = await manager.insert(Quote, {
        number: null,
        jobId,
        organizationId: job.organizationId,
        status: 'draft',
        currency: this.config.billing.currency,
        taxExempt: tax.exempt,
        taxRegistration: tax.registration,
        taxRateBasisPoints: tax.rateBasisPoints,
        netMinor: totals.netMinor,
        taxMinor: totals.taxMinor,
        grossMinor: totals.grossMinor,
        validityDays: DEFAULT_VALIDITY_DAYS,
        notes: null,
        createdById: actor.id,
      });
      const newId = result.identifiers[0].id as number;
      const number = quoteNumber(newId);
      await manager.update(Quote, { id: newId }, { number });
      await this.writeLines(manager, newId, lines);
      await this.audit.record(
        {
          actorId: actor.id,
          entity: 'quote',
          entityId: newId,
          action: 'create',
          changes: { number, jobId, lines: lines.length, grossMinor: totals.grossMinor },
        },
        manager,
      );
      return newId;
    });
    return this.get(actor, id);
  }

  /** Changes a draft: its lines (the whole set, repriced with the customer's current tax treatment), validity or notes. */
  async update(actor: AuthUser, id: number, body: UpdateQuoteDto): Promise<QuoteView> {
    await this.dataSource.transaction(async (manager) => {
      const quote = await this.lockVisible(actor, id, manager);
      if (quote.status !== 'draft')
        throw new ConflictException(`quote ${quote.number} is ${effectiveStatus(quote, new Date())}: only a draft can change; make a new quote instead`);
      const changes: Record<string, unknown> = {};
      if (body.validityDays !== undefined && body.validityDays !== quote.validityDays)
        changes.validityDays = { from: quote.validityDays, to: body.validityDays };
      if (body.notes !== undefined && (body.notes || null) !== quote.notes) changes.notes = { from: quote.notes, to: body.notes || null };
      const current = await manager.find(QuoteLine, { where: { quoteId: id }, order: { position: 'ASC' } });
      let inputs: BillingLineInput[] = current.map(toLine);
      if (body.lines !== undefined) {
        const unknown = await this.prices.unknownItemIds(
          body.lines.flatMap((l) => (l.priceItemId == null ? [] : [l.priceItemId])),
          manager,
        );
        if (unknown.length > 0) throw new BadRequestException(`lines: no price item has the id ${unknown.join(', ')}`);
        inputs = body.lines;
      }
      const priced = await this.reprice(manager, quote, inputs);
      if (body.lines !== undefined)
        changes.lines = { from: current.length, to: priced.lines.length, grossMinor: { from: quote.grossMinor, to: priced.totals.grossMinor } };
      await manager.update(
        Quote,
        { id },
        { ...priced.head, validityDays: body.validityDays ?? quote.validityDays, notes: body.notes === undefined ? quote.notes : body.notes || null },
      );
      if (Object.keys(changes).length > 0) await this.audit.record({ actorId: actor.id, entity: 'quote', entityId: id, action: 'update', changes }, manager);
    });
    return this.get(actor, id);
  }

  /** Draft → sent: repriced, the PDF drawn and stored in the same transaction, then mailed to the customer's contact address. */
  async send(actor: AuthUser, id: number): Promise<QuoteView> {
    const now = new Date();
    const outgoing = await this.dataSource.transaction(async (manager) => {
      const quote = await this.lockVisible(actor, id, manager);
      const refusal = quoteTransitionRefusal(effectiveStatus(quote, now), 'sent');
      if (refusal) throw new ConflictException(`quote ${quote.number}: ${refusal}`);
      const lines = await manager.find(QuoteLine, { where: { quoteId: id }, order: { position: 'ASC' } });
      if (lines.length === 0) throw new ConflictException(`quote ${quote.number} has no lines: add at least one before sending it`);
      const customer = await this.organizations.byId(quote.organizationId, manager);
      if (!customer?.contactEmail)
        throw new ConflictException(`${customer?.name ?? 'the customer'} has no contact e-mail: add one to the organisation before sending the quote`);
      const priced = await this.reprice(manager, quote, lines.map(toLine));
      const validUntil = dueDate(utcDay(now), quote.validityDays);
      const terms = await this.terms.termsFor(quote.organizationId, manager);
      const view = (await this.toViews([{ ...quote, ...priced.head, status: 'sent', sentAt: now, validUntil } as Quote], manager))[0]!;
      const pdf = await renderQuotePdf(await this.pdfData(actor, view, terms, now, manager));
      const file = await this.files.put('quote-pdf', pdf, manager);
      await manager.update(Quote, { id }, { ...priced.head, status: 'sent', sentAt: now, validUntil, pdfFileId: file.id });
      await this.audit.record(
        {
          actorId: actor.id,
          entity: 'quote',
          entityId: id,
          action: 'send',
          changes: { to: customer.contactEmail, validUntil, grossMinor: priced.totals.grossMinor, pdfSha256: file.sha256 },
        },
        manager,
      );
      const lab = await this.organizations.lab(manager);
      return { view, pdf, to: customer.contactEmail, labName: lab?.name ?? 'The laboratory' };
    });
    // After the commit: a mail server that is down never undoes the send (MailService.sendSafely logs and audits it).
    await this.mail.sendQuoteSent(
      {
        to: [outgoing.to],
        labName: outgoing.labName,
        number: outgoing.view.number,
        jobNumber: outgoing.view.jobNumber,
        instrument: (await this.jobs.get(actor, outgoing.view.jobId)).instrumentLabel,
        customer: outgoing.view.organizationName,
        total: formatMoney(outgoing.view.totals.grossMinor, outgoing.view.currency),
        validUntil: outgoing.view.validUntil ?? '',
        portalUrl: `${this.config.publicUrl}/portal/quotes`,
        pdf: outgoing.pdf,
        fileName: `${outgoing.view.number}.pdf`,
      },
      { entity: 'quote', entityId: id },
    );
    return this.get(actor, id);
  }

  /** A client accepts in the portal; the lab records an acceptance given by phone, e-mail or in person, with a note. */
  async accept(actor: AuthUser, id: number, body: AcceptQuoteDto): Promise<QuoteView> {
    const note = body.note || null;
    await this.get(actor, id); // a quote the actor may not see is not found, whatever the body says
    let channel: AcceptanceChannel;
    if (actor.role === 'client') {
      if (body.channel !== undefined && body.channel !== 'portal') throw new BadRequestException('channel: a client accepts in the portal; leave channel out');
      channel = 'portal';
    } else {
      if (body.channel === undefined || body.channel === 'portal')
        throw new BadRequestException(`channel: say how the customer accepted (${CHANNEL_WORDS}); only the client accepts in the portal`);
      if (!note || note.length < 3) throw new BadRequestException('note: say who accepted and how (e.g. "N. Quist by phone, 14:20")');
      channel = body.channel;
    }
    return this.decide(actor, id, 'accepted', channel, note);
  }

  async decline(actor: AuthUser, id: number, body: DeclineQuoteDto): Promise<QuoteView> {
    return this.decide(actor, id, 'declined', null, body.note || null);
  }

  private async decide(actor: AuthUser, id: number, to: 'accepted' | 'declined', channel: AcceptanceChannel | null, note: string | null): Promise<QuoteView> {
    const now = new Date();
    const expired = await this.dataSource.transaction(async (manager) => {
      const quote = await this.lockVisible(actor, id, manager);
      if (quote.status === 'sent' && effectiveStatus(quote, now) === 'expired') {
        // Stored as expired now, committed, and refused below: an expired quote is never accepted or declined.
        await this.storeExpired(manager, quote);
        return quote;
      }
      const refusal = quoteTransitionRefusal(quote.status, to);
      if (refusal) throw new ConflictException(`quote ${quote.number}: ${refusal}`);
      await manager.update(Quote, { id }, { status: to, decidedAt: now, decidedById: actor.id, acceptanceChannel: channel, decisionNote: note });
      await this.audit.record(
        { actorId: actor.id, entity: 'quote', entityId: id, action: to === 'accepted' ? 'accept' : 'decline', changes: { channel, note } },
        manager,
      );
      return null;
    });
    if (expired)
      throw new ConflictException(
        `quote ${expired.number} expired after ${dateOnly(expired.validUntil)}: it can no longer be ${to}; ask the lab for a new quote`,
      );
    return this.get(actor, id);
  }

  // ---- helpers ----

  private baseQuery() {
    return this.quotes.createQueryBuilder('q').innerJoinAndSelect('q.job', 'j').innerJoinAndSelect('q.organization', 'o').leftJoinAndSelect('q.decidedBy', 'd');
  }

  /** Clients see their own organisation's quotes once sent; the lab sees all. */
  private maysee(actor: AuthUser, quote: Pick<Quote, 'organizationId' | 'status'>): boolean {
    const scope = organizationScope(actor);
    return scope === null || (quote.organizationId === scope && quote.status !== 'draft');
  }

  /** The quote's row locked for this transaction, or 404 when the actor may not see it. */
  private async lockVisible(actor: AuthUser, id: number, manager: EntityManager): Promise<Quote> {
    const quote = await manager.findOne(Quote, { where: { id }, lock: { mode: 'pessimistic_write' } });
    if (!quote || !this.maysee(actor, quote)) throw new NotFoundException(`Quote ${id} not found`);
    return quote;
  }

  /** A sent quote past its validity, stored as expired (no one did it: the calendar did). */
  private async storeExpired(manager: EntityManager, quote: Quote): Promise<void> {
    await manager.update(Quote, { id: quote.id }, { status: 'expired' });
    await this.audit.record(
      { actorId: null, entity: 'quote', entityId: quote.id, action: 'expire', changes: { validUntil: dateOnly(quote.validUntil) } },
      manager,
    );
    quote.status = 'expired';
  }

  /** Prices the lines with the customer's current tax treatment and writes them; answers the quote's new head figures. */
  private async reprice(manager: EntityManager, quote: Quote, inputs: readonly BillingLineInput[]) {
    const tax = taxTreatment(await this.terms.termsFor(quote.organizationId, manager));
    const lines = priceLines(inputs, tax.rateBasisPoints);
    const totals = totalsOf(lines);
    await manager.delete(QuoteLine, { quoteId: quote.id });
    await this.writeLines(manager, quote.id, lines);
    const head = {
      taxExempt: tax.exempt,
      taxRegistration: tax.registration,
      taxRateBasisPoints: tax.rateBasisPoints,
      netMinor: totals.netMinor,
      taxMinor: totals.taxMinor,
      grossMinor: totals.grossMinor,
    };
    return { lines, totals, head };
  }

  private async writeLines(manager: EntityManager, quoteId: number, lines: readonly BillingLine[]): Promise<void> {
    if (lines.length === 0) return;
    await manager.insert(
      QuoteLine,
      lines.map((l) => ({ ...l, quoteId })),
    );
  }

  private async toViews(found: Quote[], manager?: EntityManager): Promise<QuoteView[]> {
    if (found.length === 0) return [];
    const m = manager ?? this.dataSource.manager;
    const lines = await m.find(QuoteLine, { where: { quoteId: In(found.map((q) => q.id)) }, order: { quoteId: 'ASC', position: 'ASC' } });
    const byQuote = new Map<number, BillingLine[]>();
    for (const line of lines) byQuote.set(line.quoteId, [...(byQuote.get(line.quoteId) ?? []), toLine(line)]);
    const missing = found.filter((q) => !q.job || !q.organization);
    const heads = new Map<number, { jobNumber: string; organizationName: string }>();
    for (const q of missing) {
      const job = await this.jobScopes.scope(q.jobId, m);
      const organization = await this.organizations.byId(q.organizationId, m);
      heads.set(q.id, { jobNumber: job?.number ?? '', organizationName: organization?.name ?? '' });
    }
    const now = new Date();
    return found.map((q) => {
      const quoteLines = byQuote.get(q.id) ?? [];
      return {
        id: q.id,
        number: q.number ?? quoteNumber(q.id),
        jobId: q.jobId,
        jobNumber: q.job?.number ?? heads.get(q.id)?.jobNumber ?? '',
        organizationId: q.organizationId,
        organizationName: q.organization?.name ?? heads.get(q.id)?.organizationName ?? '',
        status: effectiveStatus(q, now) as QuoteStatus,
        currency: q.currency,
        taxExempt: q.taxExempt,
        taxRegistration: q.taxRegistration,
        lines: quoteLines,
        totals: totalsOf(quoteLines),
        validityDays: q.validityDays,
        notes: q.notes,
        sentAt: q.sentAt ? q.sentAt.toISOString() : null,
        validUntil: dateOnly(q.validUntil),
        decidedAt: q.decidedAt ? q.decidedAt.toISOString() : null,
        decidedByName: q.decidedBy?.name ?? null,
        acceptanceChannel: q.acceptanceChannel,
        decisionNote: q.decisionNote,
        createdAt: q.createdAt ? q.createdAt.toISOString() : now.toISOString(),
        updatedAt: q.updatedAt ? q.updatedAt.toISOString() : now.toISOString(),
      };
    });
  }

  /** What the PDF prints, from the quote as viewed, the customer's terms and the lab's settings. */
  private async pdfData(actor: AuthUser, quote: QuoteView, terms: CustomerTerms, date: Date, manager: EntityManager | null): Promise<QuotePdfData> {
    const m = manager ?? undefined;
    const [job, lab, customer, settings] = await Promise.all([
      this.jobs.get(actor, quote.jobId),
      this.organizations.lab(m),
      this.organizations.byId(quote.organizationId, m),
      this.settings.read(m),
    ]);
    return {
      number: quote.number,
      draft: quote.status === 'draft',
      lab: { name: lab?.name ?? 'The laboratory', address: settings.labAddress, contactEmail: lab?.contactEmail ?? null },
      customer: { name: quote.organizationName, contactEmail: customer?.contactEmail ?? null },
      job: { number: quote.jobNumber, receivedDate: job.receivedDate, instrument: job.instrumentLabel },
      currency: quote.currency,
      taxExempt: quote.taxExempt,
      taxRegistration: quote.taxRegistration,
      lines: quote.lines,
      totals: quote.totals,
      validityDays: quote.validityDays,
      validUntil: quote.validUntil,
      date,
      paymentTerms: terms.paymentTerms,
      netDays: terms.netDays,
      notes: quote.notes,
    };
  }
}
