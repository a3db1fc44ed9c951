import { ConflictException, Injectable } from '@nestjs/common';
import type { EntityManager } from 'typeorm';
import type { InvoiceStatus } from '@kilocycle/common/types';
import { formatMoney, invoiceBalance } from '@kilocycle/common/money';
import type { AuthUser } from '../shared/auth-user.js';
import { InvoicesService } from './invoices.service.js';

export type PayableInvoice = { id: number; number: string; organizationId: number; currency: string; balanceMinor: number; status: InvoiceStatus };

/** What the payments module needs to take a payment on an invoice, with the refusals. */
@Injectable()
export class PayableInvoiceReader {
  constructor(private readonly invoices: InvoicesService) {}

  /**
   * The invoice and what is owed on it, if this user may pay it: 404 for another organisation's invoice (or a
   * draft, to a client); 409 for a draft (to the lab) or when nothing is owed. With `manager` the row is locked
   * in the caller's transaction.
   */
  async payable(invoiceId: number, user: Pick<AuthUser, 'role' | 'organizationId'>, manager?: EntityManager): Promise<PayableInvoice> {
    const row = await this.invoices.find(user, invoiceId, manager, manager !== undefined);
    if (row.status === 'draft' || row.number === null) throw new ConflictException(`invoice ${invoiceId} is a draft: it can be paid once it is issued`);
    const balanceMinor = invoiceBalance(row);
    if (balanceMinor <= 0) {
      throw new ConflictException(
        `nothing is owed on invoice ${row.number}${balanceMinor < 0 ? ` (the customer is ${formatMoney(-balanceMinor, row.currency)} in credit)` : ''}`,
      );
    }
    return { id: row.id, number: row.number, organizationId: row.organizationId, currency: row.currency, balanceMinor, status: row.status };
  }
}
