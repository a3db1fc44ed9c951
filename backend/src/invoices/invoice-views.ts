import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { In, type DataSource, type EntityManager } from 'typeorm';
import type { CreditNote as CreditNoteView, Invoice as InvoiceView } from '@kilocycle/common/types';
import { invoiceBalance } from '@kilocycle/common/money';
import { JobScopeReader } from '../jobs/job-scope.reader.js';
import { OrganizationsReader } from '../organizations/organizations.reader.js';
import { dateOnly, todayIso } from '../shared/dto-helpers.js';
import { CertificateRecipientsReader } from '../users/certificate-recipients.reader.js';
import { CreditNote } from './credit-note.entity.js';
import { InvoiceLine } from './invoice-line.entity.js';
import { lineView, totalsOf } from './invoice-lines.js';
import type { Invoice } from './invoice.entity.js';

/** Overdue: issued or part paid, past the due date, with something still owed. */
export function isOverdue(row: Pick<Invoice, 'status' | 'dueDate' | 'grossMinor' | 'paidMinor' | 'refundedMinor' | 'creditedMinor'>, today: string): boolean {
  const due = dateOnly(row.dueDate);
  return (row.status === 'issued' || row.status === 'part_paid') && due !== null && due < today && invoiceBalance(row) > 0;
}

/** The SQL of the same rule, over the alias `i` (list filters, the reminder). */
export const OVERDUE_SQL =
  "i.status IN ('issued', 'part_paid') AND i.due_date < :today AND (i.gross_minor - i.credited_minor - (i.paid_minor - i.refunded_minor)) > 0";

export function creditNoteView(row: CreditNote, invoiceNumber: string | null, issuedByName: string | null): CreditNoteView {
  return {
    id: row.id,
    number: row.number,
    invoiceId: row.invoiceId,
    invoiceNumber,
    organizationId: row.organizationId,
    reason: row.reason,
    netMinor: row.netMinor,
    taxMinor: row.taxMinor,
    grossMinor: row.grossMinor,
    paymentId: row.paymentId,
    issuedAt: row.issuedAt.toISOString(),
    issuedByName,
  };
}

/** Invoices as the API shows them: with their lines, totals, credit notes, job number, customer and balance. */
@Injectable()
export class InvoiceViews {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly jobs: JobScopeReader,
    private readonly organizations: OrganizationsReader,
    private readonly people: CertificateRecipientsReader,
  ) {}

  async one(row: Invoice, manager?: EntityManager, now = new Date()): Promise<InvoiceView> {
    return (await this.many([row], manager, now))[0]!;
  }

  async many(rows: readonly Invoice[], manager?: EntityManager, now = new Date()): Promise<InvoiceView[]> {
    if (rows.length === 0) return [];
    const m = manager ?? this.dataSource.manager;
    const ids = rows.map((r) => r.id);
    const [lines, notes, jobNumbers, organizations] = await Promise.all([
      m.find(InvoiceLine, { where: { invoiceId: In(ids) }, order: { invoiceId: 'ASC', position: 'ASC' } }),
      m.find(CreditNote, { where: { invoiceId: In(ids) }, order: { id: 'ASC' } }),
      this.jobs.numbers(
        rows.map((r) => r.jobId),
        m,
      ),
      this.organizations.byIds(
        rows.map((r) => r.organizationId),
        m,
      ),
    ]);
    const names = await this.people.namesOf(
      notes.flatMap((n) => (n.issuedById === null ? [] : [n.issuedById])),
      m,
    );
    const today = todayIso(now);
    return rows.map((row) => {
      const own = lines.filter((l) => l.invoiceId === row.id).map(lineView);
      const money = { grossMinor: row.grossMinor, paidMinor: row.paidMinor, refundedMinor: row.refundedMinor, creditedMinor: row.creditedMinor };
      return {
        id: row.id,
        number: row.number,
        jobId: row.jobId,
        jobNumber: jobNumbers.get(row.jobId) ?? '',
        organizationId: row.organizationId,
        organizationName: organizations.get(row.organizationId)?.name ?? '',
        quoteId: row.quoteId,
        status: row.status,
        currency: row.currency,
        taxExempt: row.taxExempt,
        taxRegistration: row.taxRegistration,
        paymentTerms: row.paymentTerms,
        lines: own,
        totals: totalsOf(own),
        issuedAt: row.issuedAt?.toISOString() ?? null,
        dueDate: dateOnly(row.dueDate),
        paidMinor: row.paidMinor,
        refundedMinor: row.refundedMinor,
        creditedMinor: row.creditedMinor,
        balanceMinor: invoiceBalance(money),
        overdue: isOverdue(row, today),
        creditNotes: notes
          .filter((n) => n.invoiceId === row.id)
          .map((n) => creditNoteView(n, row.number, n.issuedById === null ? null : (names.get(n.issuedById) ?? null))),
        createdAt: row.createdAt.toISOString(),
        updatedAt: row.updatedAt.toISOString(),
      };
    });
  }
}
