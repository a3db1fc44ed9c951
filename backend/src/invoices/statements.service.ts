import { Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { Between, Not, type DataSource } from 'typeorm';
import type { Statement, StatementLine } from '@kilocycle/common/types';
import { currencyDigits } from '@kilocycle/common/money';
import { JobScopeReader } from '../jobs/job-scope.reader.js';
import { OrganizationsReader } from '../organizations/organizations.reader.js';
import { organizationScope, type AuthUser } from '../shared/auth-user.js';
import { csvLine } from '../shared/csv.js';
import { todayIso } from '../shared/dto-helpers.js';
import { CreditNote } from './credit-note.entity.js';
import { InvoiceViews } from './invoice-views.js';
import { Invoice } from './invoice.entity.js';
import { LedgerEntry } from './ledger-entry.entity.js';

const KIND_ORDER: Record<StatementLine['kind'], number> = { invoice: 0, payment: 1, refund: 2, credit_note: 3 };

type Dated = Omit<StatementLine, 'balanceMinor' | 'date'> & { at: Date; id: number };

/** Minor units as a plain decimal for a spreadsheet ("1234.50"), written from the digits. */
export function decimalText(minor: number, currency: string): string {
  const digits = currencyDigits(currency);
  if (digits === 0) return String(minor);
  const text = String(Math.abs(minor)).padStart(digits + 1, '0');
  return `${minor < 0 ? '-' : ''}${text.slice(0, -digits)}.${text.slice(-digits)}`;
}

export const EXPORT_COLUMNS = ['date', 'type', 'document', 'invoice', 'job', 'customer', 'currency', 'net', 'tax', 'gross', 'payment_id', 'reason'];

/**
 * A customer's statement, and the bookkeeper's export. Statement figures, from the issued invoices' own columns
 * (common invoiceBalance for each):
 *   open    = what is owed on issued and part-paid invoices (their positive balances),
 *   overdue = the part of it past due,
 *   paid    = payments kept (paid − refunded),
 *   credit  = credited by credit notes (refunds included, each having raised one);
 * and the dated lines (invoice +gross, payment −amount, refund +amount, credit note −gross) with the running
 * balance, which ends at the sum of the invoices' balances.
 */
@Injectable()
export class StatementsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly organizations: OrganizationsReader,
    private readonly jobs: JobScopeReader,
    private readonly views: InvoiceViews,
  ) {}

  async statement(user: AuthUser, organizationId: number, currency: string, now = new Date()): Promise<Statement> {
    const scope = organizationScope(user);
    const organization = await this.organizations.byId(organizationId);
    if (!organization || (scope !== null && scope !== organizationId)) throw new NotFoundException(`Organization ${organizationId} not found`);
    const m = this.dataSource.manager;
    const rows = await m.find(Invoice, { where: { organizationId, status: Not('draft') }, order: { issuedAt: 'ASC', id: 'ASC' } });
    const [invoices, notes, entries] = await Promise.all([
      this.views.many(rows, undefined, now),
      m.find(CreditNote, { where: { organizationId }, order: { id: 'ASC' } }),
      m.find(LedgerEntry, { where: { organizationId }, order: { id: 'ASC' } }),
    ]);
    const numberOf = new Map(rows.map((r) => [r.id, r.number]));
    const dated: Dated[] = [
      ...rows.map((r) => ({
        id: r.id,
        at: r.issuedAt!,
        kind: 'invoice' as const,
        reference: r.number ?? '',
        invoiceNumber: r.number,
        amountMinor: r.grossMinor,
      })),
      ...entries.map((e) => ({
        id: e.id,
        at: e.at,
        kind: e.kind,
        reference: e.paymentId !== null ? `by card #${e.paymentId}` : `#${e.id}`,
        invoiceNumber: numberOf.get(e.invoiceId) ?? null,
        amountMinor: e.kind === 'payment' ? -e.amountMinor : e.amountMinor,
      })),
      ...notes.map((n) => ({
        id: n.id,
        at: n.issuedAt,
        kind: 'credit_note' as const,
        reference: n.number,
        invoiceNumber: numberOf.get(n.invoiceId) ?? null,
        amountMinor: -n.grossMinor,
      })),
    ].sort((a, b) => a.at.getTime() - b.at.getTime() || KIND_ORDER[a.kind] - KIND_ORDER[b.kind] || a.id - b.id);
    let balance = 0;
    const lines: StatementLine[] = dated.map(({ at, kind, reference, invoiceNumber, amountMinor }) => {
      balance += amountMinor;
      return { date: todayIso(at), kind, reference, invoiceNumber, amountMinor, balanceMinor: balance };
    });
    const sum = (values: number[]) => values.reduce((a, b) => a + b, 0);
    return {
      organizationId,
      organizationName: organization.name,
      currency,
      asOf: todayIso(now),
      openMinor: sum(invoices.filter((i) => i.balanceMinor > 0).map((i) => i.balanceMinor)),
      overdueMinor: sum(invoices.filter((i) => i.overdue).map((i) => i.balanceMinor)),
      paidMinor: sum(invoices.map((i) => i.paidMinor - i.refundedMinor)),
      creditMinor: sum(invoices.map((i) => i.creditedMinor)),
      invoices,
      lines,
    };
  }

  /**
   * The bookkeeper's CSV: every invoice issued, payment, refund and credit note dated from `from` to `to`
   * (inclusive, UTC days; all time when left out), oldest first. Amounts are positive decimals in the currency's
   * own digits; `type` says which way each goes.
   */
  async exportCsv(range: { from?: string; to?: string }): Promise<string> {
    const from = new Date(`${range.from ?? '1970-01-01'}T00:00:00.000Z`);
    const to = new Date(`${range.to ?? '9999-12-31'}T23:59:59.999Z`);
    const m = this.dataSource.manager;
    const [invoices, notes, entries] = await Promise.all([
      m.find(Invoice, { where: { issuedAt: Between(from, to), status: Not('draft') } }),
      m.find(CreditNote, { where: { issuedAt: Between(from, to) } }),
      m.find(LedgerEntry, { where: { at: Between(from, to) } }),
    ]);
    // The invoices the notes and entries name, for their numbers, jobs, customers and currency.
    const ids = [...new Set([...invoices.map((i) => i.id), ...notes.map((n) => n.invoiceId), ...entries.map((e) => e.invoiceId)])];
    const named = ids.length ? await m.createQueryBuilder(Invoice, 'i').where('i.id IN (:...ids)', { ids }).getMany() : [];
    const byId = new Map(named.map((i) => [i.id, i]));
    const [jobNumbers, organizations] = await Promise.all([
      this.jobs.numbers(named.map((i) => i.jobId)),
      this.organizations.byIds(named.map((i) => i.organizationId)),
    ]);
    type Row = { at: Date; order: number; id: number; cells: unknown[] };
    const rows: Row[] = [];
    const about = (invoiceId: number) => {
      const inv = byId.get(invoiceId)!;
      return { inv, job: jobNumbers.get(inv.jobId) ?? '', customer: organizations.get(inv.organizationId)?.name ?? '' };
    };
    const money = (minor: number | null, currency: string) => (minor === null ? '' : decimalText(minor, currency));
    for (const i of invoices) {
      const { job, customer } = about(i.id);
      const c = i.currency;
      rows.push({
        at: i.issuedAt!,
        order: 0,
        id: i.id,
        cells: [
          todayIso(i.issuedAt!),
          'invoice',
          i.number,
          i.number,
          job,
          customer,
          c,
          money(i.netMinor, c),
          money(i.taxMinor, c),
          money(i.grossMinor, c),
          '',
          '',
        ],
      });
    }
    for (const e of entries) {
      const { inv, job, customer } = about(e.invoiceId);
      const c = inv.currency;
      rows.push({
        at: e.at,
        order: e.kind === 'payment' ? 1 : 2,
        id: e.id,
        cells: [
          todayIso(e.at),
          e.kind,
          e.paymentId !== null ? `payment ${e.paymentId}` : `${e.kind} ${e.id}`,
          inv.number,
          job,
          customer,
          c,
          '',
          '',
          money(e.amountMinor, c),
          e.paymentId ?? '',
          '',
        ],
      });
    }
    for (const n of notes) {
      const { inv, job, customer } = about(n.invoiceId);
      const c = inv.currency;
      rows.push({
        at: n.issuedAt,
        order: 3,
        id: n.id,
        cells: [
          todayIso(n.issuedAt),
          'credit_note',
          n.number,
          inv.number,
          job,
          customer,
          c,
          money(n.netMinor, c),
          money(n.taxMinor, c),
          money(n.grossMinor, c),
          n.paymentId ?? '',
          n.reason,
        ],
      });
    }
    rows.sort((a, b) => a.at.getTime() - b.at.getTime() || a.order - b.order || a.id - b.id);
    return csvLine(EXPORT_COLUMNS) + rows.map((r) => csvLine(r.cells)).join('');
  }
}
