import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Organization } from '../organizations/organization.entity.js';
import { MINOR_UNITS } from '../shared/money-column.js';
import { Invoice } from './invoice.entity.js';

export type LedgerEntryKind = 'payment' | 'refund';

/**
 * Money received or given back on an invoice, as the ledger (invoice-ledger.writer.ts) records it with the
 * invoice's paid and refunded columns: the dated lines of the customer's statement and the bookkeeper's export.
 * The payment itself (card, service ids) is the payments module's.
 */
@Entity('invoice_ledger_entries')
@Index('IDX_invoice_ledger_entries_organization', ['organizationId', 'at'])
export class LedgerEntry {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'invoice_id', type: 'int' })
  invoiceId: number;

  @ManyToOne(() => Invoice, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'invoice_id', foreignKeyConstraintName: 'FK_invoice_ledger_entries_invoice' })
  invoice: Relation<Invoice>;

  @Column({ name: 'organization_id', type: 'int' })
  organizationId: number;

  @ManyToOne(() => Organization, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'organization_id', foreignKeyConstraintName: 'FK_invoice_ledger_entries_organization' })
  organization: Relation<Organization>;

  @Column({ type: 'varchar', length: 8 })
  kind: LedgerEntryKind;

  @Column({ name: 'amount_minor', type: 'bigint', transformer: MINOR_UNITS })
  amountMinor: number;

  /** The payments module's payment, when it came from one. */
  @Index('IDX_invoice_ledger_entries_payment')
  @Column({ name: 'payment_id', type: 'int', nullable: true })
  paymentId: number | null;

  @Column({ type: 'datetime', precision: 3 })
  at: Date;
}
