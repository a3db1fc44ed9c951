import { ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import type { EntityManager } from 'typeorm';
import type { CreditNote as CreditNoteView, InvoiceStatus } from '@kilocycle/common/types';
import { invoiceBalance, issuedInvoiceStatus } from '@kilocycle/common/money';
import { AuditService } from '../audit/audit.service.js';
import { creditNoteView } from './invoice-views.js';
import { Invoice } from './invoice.entity.js';
import { InvoicesService } from './invoices.service.js';
import { LedgerEntry } from './ledger-entry.entity.js';

/** What the ledger answers after a change: the invoice's money and state as now stored. */
export type LedgerResult = {
  invoiceId: number;
  number: string | null;
  status: InvoiceStatus;
  paidMinor: number;
  refundedMinor: number;
  creditedMinor: number;
  balanceMinor: number;
};

/**
 * The one way money received or given back reaches an invoice (for the payments module): each call runs in the
 * caller's transaction (pass its manager), locks the invoice's row, moves its paid or refunded amount, records the
 * dated ledger entry (the statement's and the export's lines), recomputes the state with common's
 * issuedInvoiceStatus and writes the audit event.
 */
@Injectable()
export class InvoiceLedger {
  constructor(
    private readonly invoices: InvoicesService,
    private readonly audit: AuditService,
  ) {}

  private async locked(invoiceId: number, manager: EntityManager): Promise<Invoice> {
    if (!manager.queryRunner?.isTransactionActive) throw new Error('the invoice ledger writes inside the caller’s transaction');
    const row = await manager.findOne(Invoice, { where: { id: invoiceId }, lock: { mode: 'pessimistic_write' } });
    if (!row) throw new NotFoundException(`Invoice ${invoiceId} not found`);
    if (row.status === 'draft') throw new ConflictException(`invoice ${invoiceId} is a draft: nothing can be paid or refunded on it`);
    return row;
  }

  private result(row: Invoice): LedgerResult {
    return {
      invoiceId: row.id,
      number: row.number,
      status: row.status,
      paidMinor: row.paidMinor,
      refundedMinor: row.refundedMinor,
      creditedMinor: row.creditedMinor,
      balanceMinor: invoiceBalance(row),
    };
  }

  /**
   * A payment received: paid += amount (in the invoice's currency, else 409), state recomputed. `options.paymentId`
   * names the payments module's record (kept on the ledger entry, shown in the export); `options.at` dates it.
   */
  async recordPayment(
    invoiceId: number,
    amountMinor: number,
    currency: string,
    manager: EntityManager,
    options: { paymentId?: number | null; actorId?: number | null; at?: Date } = {},
  ): Promise<LedgerResult> {
    if (!Number.isSafeInteger(amountMinor) || amountMinor <= 0)
      throw new ConflictException(`a payment must be a whole number of minor units above zero (got ${amountMinor})`);
    const row = await this.locked(invoiceId, manager);
    if (currency.toUpperCase() !== row.currency) throw new ConflictException(`invoice ${row.number} is in ${row.currency}, not ${currency.toUpperCase()}`);
    const at = options.at ?? new Date();
    const paidMinor = row.paidMinor + amountMinor;
    const status = issuedInvoiceStatus({ ...row, paidMinor });
    await manager.update(Invoice, { id: row.id }, { paidMinor, status });
    await manager.insert(LedgerEntry, {
      invoiceId: row.id,
      organizationId: row.organizationId,
      kind: 'payment',
      amountMinor,
      paymentId: options.paymentId ?? null,
      at,
    });
    await this.audit.record(
      {
        actorId: options.actorId ?? null,
        entity: 'invoice',
        entityId: row.id,
        action: 'payment',
        changes: { amountMinor, currency: row.currency, paymentId: options.paymentId ?? null, status: { from: row.status, to: status } },
        at: options.at,
      },
      manager,
    );
    return this.result(await manager.findOneOrFail(Invoice, { where: { id: row.id } }));
  }

  /**
   * Money given back: refunded += amount and a credit note of the same amount (CN-…, naming the payment), so the
   * balance stays where it was (common invoiceBalance); state recomputed. Refuses (409) a refund above what was
   * kept of the payments (paid − refunded). Answers the credit note.
   */
  async recordRefund(
    invoiceId: number,
    amountMinor: number,
    reason: string,
    paymentId: number | null,
    manager: EntityManager,
    options: { actorId?: number | null; at?: Date } = {},
  ): Promise<CreditNoteView> {
    if (!Number.isSafeInteger(amountMinor) || amountMinor <= 0)
      throw new ConflictException(`a refund must be a whole number of minor units above zero (got ${amountMinor})`);
    const row = await this.locked(invoiceId, manager);
    const kept = row.paidMinor - row.refundedMinor;
    if (amountMinor > kept) throw new ConflictException(`invoice ${row.number}: a refund of ${amountMinor} is more than the ${kept} paid and not yet refunded`);
    const at = options.at ?? new Date();
    const refundedMinor = row.refundedMinor + amountMinor;
    await manager.update(Invoice, { id: row.id }, { refundedMinor });
    await manager.insert(LedgerEntry, { invoiceId: row.id, organizationId: row.organizationId, kind: 'refund', amountMinor, paymentId, at });
    await this.audit.record(
      { actorId: options.actorId ?? null, entity: 'invoice', entityId: row.id, action: 'refund', changes: { amountMinor, paymentId, reason }, at: options.at },
      manager,
    );
    // The credit note recomputes the state (credited and refunded both moved) and audits itself.
    const { note, invoice } = await this.invoices.credit(
      manager,
      { ...row, refundedMinor },
      { amountMinor, reason, paymentId, actorId: options.actorId ?? null, now: at },
    );
    return creditNoteView(note, invoice.number, null);
  }
}
