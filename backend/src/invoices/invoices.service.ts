import { ConflictException, Inject, Injectable, NotFoundException, UnprocessableEntityException } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';
import type { CreditNote as CreditNoteView, Invoice as InvoiceView, ListResponse } from '@kilocycle/common/types';
import { creditSplit, dueDate, formatMoney, issuedInvoiceStatus } from '@kilocycle/common/money';
import { MetrologyError } from '@kilocycle/common/math';
import { AuditService } from '../audit/audit.service.js';
import { CertificateSettingsReader } from '../certificates/certificate-settings.reader.js';
import { APP_CONFIG, type AppConfig } from '../config/config.module.js';
import { JobScopeReader } from '../jobs/job-scope.reader.js';
import { creditNoteMail, invoiceIssuedMail, MailService } from '../mail/mail.service.js';
import { OrganizationsReader } from '../organizations/organizations.reader.js';
import { CustomerTermsReader } from '../prices/customer-terms.reader.js';
import { ProposedLinesReader } from '../prices/proposed-lines.reader.js';
import { AcceptedQuoteReader } from '../quotes/accepted-quote.reader.js';
import { organizationScope, type AuthUser } from '../shared/auth-user.js';
import { todayIso } from '../shared/dto-helpers.js';
import { paginate } from '../shared/paginate.js';
import { FileStore } from '../storage/file-store.service.js';
import { CertificateRecipientsReader } from '../users/certificate-recipients.reader.js';
import { CreditNote } from './credit-note.entity.js';
import { takeDocumentNumber } from './document-numbers.js';
import type { ListInvoicesQueryDto, UpdateInvoiceDto } from './dto/invoice.dto.js';
import { makeDraft, writeLines, type DraftSources } from './invoice-drafts.js';
import { asInput } from './invoice-lines.js';
import { renderCreditNotePdf, renderInvoicePdf, type BillingParties } from './invoice-pdf.js';
import { creditNoteView, InvoiceViews, OVERDUE_SQL } from './invoice-views.js';
import { Invoice } from './invoice.entity.js';
import { labCurrency } from '../shared/currency.js';

const SORTABLE = {
  id: 'i.id',
  number: 'i.number',
  status: 'i.status',
  issuedAt: 'i.issuedAt',
  dueDate: 'i.dueDate',
  grossMinor: 'i.grossMinor',
  createdAt: 'i.createdAt',
};

export const ISSUED_CANNOT_CHANGE = 'an issued invoice cannot change; raise a credit note';

/** Who may see what: a client sees its own organisation's issued invoices (never a draft); the lab sees all. */
function visibleTo(user: Pick<AuthUser, 'role' | 'organizationId'>, row: Pick<Invoice, 'organizationId' | 'status'>): boolean {
  const scope = organizationScope(user);
  return scope === null || (row.organizationId === scope && row.status !== 'draft');
}

/**
 * Invoices and credit notes: drafts made when a certificate is signed (or by hand for an issued job), edited by
 * the lead, issued with a gap-free number, a due date from the customer's terms, a stored PDF and a mail, and
 * corrected only by credit notes. Every change is audited in its transaction.
 */
@Injectable()
export class InvoicesService {
  readonly sources: DraftSources;

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly audit: AuditService,
    private readonly jobs: JobScopeReader,
    private readonly organizations: OrganizationsReader,
    private readonly people: CertificateRecipientsReader,
    private readonly views: InvoiceViews,
    private readonly files: FileStore,
    private readonly mail: MailService,
    private readonly settings: CertificateSettingsReader,
    terms: CustomerTermsReader,
    acceptedQuotes: AcceptedQuoteReader,
    proposed: ProposedLinesReader,
  ) {
    this.sources = { terms, acceptedQuotes, proposed, audit };
  }

  get currency(): string {
    return labCurrency();
  }

  async list(user: AuthUser, query: ListInvoicesQueryDto, now = new Date()): Promise<ListResponse<InvoiceView>> {
    const qb = this.dataSource.getRepository(Invoice).createQueryBuilder('i');
    const scope = organizationScope(user);
    if (scope !== null) qb.andWhere('i.organization_id = :scope', { scope }).andWhere("i.status <> 'draft'");
    if (query.organizationId) qb.andWhere('i.organization_id = :org', { org: query.organizationId });
    if (query.jobId) qb.andWhere('i.job_id = :job', { job: query.jobId });
    if (query.status) qb.andWhere('i.status = :status', { status: query.status });
    if (query.overdue === true) qb.andWhere(OVERDUE_SQL, { today: todayIso(now) });
    if (query.overdue === false) qb.andWhere(`NOT (${OVERDUE_SQL})`, { today: todayIso(now) });
    if (query.q) qb.andWhere('i.number LIKE :q', { q: `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` });
    const page = await paginate(qb, query, SORTABLE, '-id', (row) => row);
    return { total: page.total, items: await this.views.many(page.items, undefined, now) };
  }

  /** The invoice if this user may see it; 404 otherwise (another organisation's, or a draft to a client). */
  async find(user: Pick<AuthUser, 'role' | 'organizationId'>, id: number, manager?: EntityManager, lock = false): Promise<Invoice> {
    const m = manager ?? this.dataSource.manager;
    const row = await m.findOne(Invoice, { where: { id }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}) });
    if (!row || !visibleTo(user, row)) throw new NotFoundException(`Invoice ${id} not found`);
    return row;
  }

  async get(user: AuthUser, id: number): Promise<InvoiceView> {
    return this.views.one(await this.find(user, id));
  }

  /** The stored PDF of an issued invoice; a draft's is drawn on request (marked DRAFT) for the lab. */
  async pdf(user: AuthUser, id: number): Promise<{ data: Buffer; name: string }> {
    const row = await this.find(user, id);
    if (row.status === 'draft') return { data: await this.render(row, this.dataSource.manager), name: `invoice-draft-${row.id}.pdf` };
    const data = row.pdfFileId !== null ? await this.files.get(row.pdfFileId, 'invoice-pdf') : null;
    if (!data) throw new NotFoundException(`The PDF of invoice ${row.number} is missing from the store`);
    return { data, name: `${row.number}.pdf` };
  }

  async creditNotePdf(user: AuthUser, id: number): Promise<{ data: Buffer; name: string }> {
    const note = await this.dataSource.manager.findOne(CreditNote, { where: { id } });
    const scope = organizationScope(user);
    if (!note || (scope !== null && note.organizationId !== scope)) throw new NotFoundException(`Credit note ${id} not found`);
    const data = note.pdfFileId !== null ? await this.files.get(note.pdfFileId, 'credit-note-pdf') : null;
    if (!data) throw new NotFoundException(`The PDF of credit note ${note.number} is missing from the store`);
    return { data, name: `${note.number}.pdf` };
  }

  /** POST /jobs/:id/invoice: a draft for an issued job that has none. */
  async createForJob(user: AuthUser, jobId: number): Promise<InvoiceView> {
    const row = await this.dataSource.transaction(async (manager) => {
      const job = await this.jobs.visible(user, jobId, manager, true);
      if (job.status !== 'issued') throw new ConflictException(`job ${job.number} is ${job.status}: an invoice is raised once its certificate is issued`);
      return makeDraft(manager, this.sources, job, { actorId: user.id, currency: this.currency });
    });
    return this.views.one(row);
  }

  /** PATCH: a draft's lines, priced at the customer's tax treatment. */
  async update(user: AuthUser, id: number, body: UpdateInvoiceDto): Promise<InvoiceView> {
    const row = await this.dataSource.transaction(async (manager) => {
      const before = await this.find(user, id, manager, true);
      if (before.status !== 'draft') throw new ConflictException(ISSUED_CANNOT_CHANGE);
      const terms = await this.sources.terms.termsFor(before.organizationId, manager);
      const after = await writeLines(manager, id, body.lines, terms);
      await this.audit.record(
        {
          actorId: user.id,
          entity: 'invoice',
          entityId: id,
          action: 'update',
          changes: { grossMinor: { from: before.grossMinor, to: after.grossMinor }, lines: body.lines.length },
        },
        manager,
      );
      return after;
    });
    return this.views.one(row);
  }

  /**
   * Issues a draft: the customer's tax treatment and terms as they stand now and the lines priced with them are
   * written onto the invoice for good, then the next number (the sequence row locked until commit), the issue
   * date and due date, the PDF stored, the audit event — one transaction. The customer is mailed after commit.
   */
  async issue(user: AuthUser, id: number, now = new Date()): Promise<InvoiceView> {
    const { row, pdf } = await this.dataSource.transaction((manager) => this.issueWithin(manager, id, user.id, now));
    const view = await this.views.one(row, undefined, now);
    const parties = await this.parties(row.organizationId);
    if (parties.customer.contactEmail) {
      await this.mail.sendSafely(
        invoiceIssuedMail({
          to: [parties.customer.contactEmail],
          labName: parties.lab.name,
          customer: parties.customer.name,
          number: view.number!,
          jobNumber: view.jobNumber,
          amount: formatMoney(view.totals.grossMinor, view.currency),
          dueDate: view.dueDate!,
          payBeforeRelease: view.paymentTerms === 'pay_before_release',
          invoiceUrl: `${this.config.publicUrl}/portal/invoices/${view.id}`,
          pdf,
        }),
        { entity: 'invoice', entityId: id },
      );
    }
    return view;
  }

  /** The issuing itself, in the caller's transaction (the route's, or the demo seed's): see issue(). */
  async issueWithin(manager: EntityManager, id: number, actorId: number | null, now = new Date()): Promise<{ row: Invoice; pdf: Buffer }> {
    const draft = await manager.findOne(Invoice, { where: { id }, lock: { mode: 'pessimistic_write' } });
    if (!draft) throw new NotFoundException(`Invoice ${id} not found`);
    if (draft.status !== 'draft') throw new ConflictException(`invoice ${draft.number} is already issued`);
    const terms = await this.sources.terms.termsFor(draft.organizationId, manager);
    const lines = (await this.views.one(draft, manager)).lines;
    if (lines.length === 0) throw new ConflictException('an invoice without lines cannot be issued: add at least one line');
    const priced = await writeLines(manager, id, lines.map(asInput), terms);
    const number = await takeDocumentNumber(manager, 'invoice');
    const status = issuedInvoiceStatus(priced);
    const due = dueDate(todayIso(now), terms.netDays);
    await manager.update(Invoice, { id }, { number, status, issuedAt: now, issuedById: actorId, dueDate: due });
    const pdf = await this.render(await manager.findOneOrFail(Invoice, { where: { id } }), manager);
    const stored = await this.files.put('invoice-pdf', pdf, manager);
    await manager.update(Invoice, { id }, { pdfFileId: stored.id });
    await this.audit.record(
      {
        actorId,
        entity: 'invoice',
        entityId: id,
        action: 'issue',
        changes: { number, grossMinor: priced.grossMinor, dueDate: due, paymentTerms: terms.paymentTerms, taxRateBasisPoints: priced.taxRateBasisPoints },
        at: now,
      },
      manager,
    );
    return { row: await manager.findOneOrFail(Invoice, { where: { id } }), pdf };
  }

  /** A credit note against an issued invoice (its net and tax split in the invoice's proportion), with its PDF; mailed after commit. */
  async createCreditNote(user: AuthUser, invoiceId: number, body: { amountMinor: number; reason: string }, now = new Date()): Promise<CreditNoteView> {
    const { note, invoice, pdf } = await this.dataSource.transaction(async (manager) => {
      const row = await this.find(user, invoiceId, manager, true);
      if (row.status === 'draft') throw new ConflictException('a draft invoice is changed, not credited: edit its lines');
      return this.credit(manager, row, { ...body, paymentId: null, actorId: user.id, now });
    });
    const parties = await this.parties(invoice.organizationId);
    if (parties.customer.contactEmail) {
      await this.mail.sendSafely(
        creditNoteMail({
          to: [parties.customer.contactEmail],
          labName: parties.lab.name,
          customer: parties.customer.name,
          number: note.number,
          invoiceNumber: invoice.number ?? '',
          amount: formatMoney(note.grossMinor, invoice.currency),
          reason: note.reason,
          pdf,
        }),
        { entity: 'credit_note', entityId: note.id },
      );
    }
    return creditNoteView(note, invoice.number, (await this.people.namesOf([user.id])).get(user.id) ?? null);
  }

  /**
   * Raises a credit note on a locked, issued invoice in the caller's transaction: split, number, row, PDF stored,
   * the invoice's credited amount and status, audit. The ledger's refunds come through here too.
   */
  async credit(
    manager: EntityManager,
    row: Invoice,
    input: { amountMinor: number; reason: string; paymentId: number | null; actorId: number | null; now?: Date },
  ): Promise<{ note: CreditNote; invoice: Invoice; pdf: Buffer }> {
    const now = input.now ?? new Date();
    let split: { netMinor: number; taxMinor: number; grossMinor: number };
    try {
      split = creditSplit({ netMinor: row.netMinor, taxMinor: row.taxMinor, grossMinor: row.grossMinor }, input.amountMinor, row.creditedMinor);
    } catch (error) {
      if (error instanceof MetrologyError) throw new UnprocessableEntityException(`invoice ${row.number}: ${error.message}`);
      throw error;
    }
    const number = await takeDocumentNumber(manager, 'credit_note');
    const id = (
      await manager.insert(CreditNote, {
        number,
        invoiceId: row.id,
        organizationId: row.organizationId,
        reason: input.reason,
        ...split,
        paymentId: input.paymentId,
        issuedAt: now,
        issuedById: input.actorId,
      })
    ).identifiers[0]!.id as number;
    const creditedMinor = row.creditedMinor + split.grossMinor;
    const status = issuedInvoiceStatus({ ...row, creditedMinor });
    await manager.update(Invoice, { id: row.id }, { creditedMinor, status });
    const parties = await this.parties(row.organizationId, manager);
    const names = input.actorId === null ? new Map<number, string>() : await this.people.namesOf([input.actorId], manager);
    const pdf = await renderCreditNotePdf({
      ...parties,
      number,
      invoiceNumber: row.number ?? '',
      jobNumber: (await this.jobs.numbers([row.jobId], manager)).get(row.jobId) ?? '',
      currency: row.currency,
      issuedAt: now,
      reason: input.reason,
      split,
      taxRateBasisPoints: row.taxRateBasisPoints,
      taxExempt: row.taxExempt,
      taxRegistration: row.taxRegistration,
      issuedByName: input.actorId === null ? null : (names.get(input.actorId) ?? null),
      refund: input.paymentId !== null,
    });
    const stored = await this.files.put('credit-note-pdf', pdf, manager);
    await manager.update(CreditNote, { id }, { pdfFileId: stored.id });
    const note = await manager.findOneOrFail(CreditNote, { where: { id } });
    await this.audit.record(
      {
        actorId: input.actorId,
        entity: 'invoice',
        entityId: row.id,
        action: 'credit',
        changes: { creditNote: number, ...split, reason: input.reason, paymentId: input.paymentId, status: { from: row.status, to: status } },
      },
      manager,
    );
    return { note, invoice: await manager.findOneOrFail(Invoice, { where: { id: row.id } }), pdf };
  }

  /** The lab and the customer as printed on a document. */
  async parties(organizationId: number, manager?: EntityManager): Promise<BillingParties> {
    const [lab, customer, settings] = await Promise.all([
      this.organizations.lab(manager),
      this.organizations.byId(organizationId, manager),
      this.settings.read(manager),
    ]);
    return {
      lab: { name: lab?.name ?? 'Calibration laboratory', contactEmail: lab?.contactEmail ?? null, address: settings.labAddress },
      customer: { name: customer?.name ?? '', contactEmail: customer?.contactEmail ?? null },
    };
  }

  /** The invoice's PDF as it stands (a draft is marked as one). */
  async render(row: Invoice, manager: EntityManager): Promise<Buffer> {
    const view = await this.views.one(row, manager);
    return renderInvoicePdf({ ...(await this.parties(row.organizationId, manager)), invoice: view });
  }
}
