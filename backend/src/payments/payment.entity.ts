import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, UpdateDateColumn, type Relation } from 'typeorm';
import type { PaymentStatus } from '@kilocycle/common/types';
import { Invoice } from '../invoices/invoice.entity.js';
import { Organization } from '../organizations/organization.entity.js';
import { MoneyColumn } from '../shared/money-column.js';

/** One attempt to pay an invoice by card through the payment service: made when the client presses Pay. */
@Entity('payments')
@Index('IDX_payments_invoice', ['invoiceId'])
@Index('IDX_payments_provider_payment', ['providerPaymentId'])
export class Payment {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'invoice_id', type: 'int' })
  invoiceId: number;

  @ManyToOne(() => Invoice, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'invoice_id', foreignKeyConstraintName: 'FK_payments_invoice' })
  invoice: Relation<Invoice>;

  /** The customer, copied from the invoice, for scoping. */
  @Column({ name: 'organization_id', type: 'int' })
  organizationId: number;

  @ManyToOne(() => Organization, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'organization_id', foreignKeyConstraintName: 'FK_payments_organization' })
  organization: Relation<Organization>;

  @Column({ type: 'varchar', length: 16 })
  status: PaymentStatus;

  @MoneyColumn('amount_minor')
  amountMinor: number;

  @MoneyColumn('refunded_minor', { default: 0 })
  refundedMinor: number;

  @Column({ type: 'char', length: 3 })
  currency: string;

  /** The payment service's checkout session (cs_…). */
  @Index('UQ_payments_session', { unique: true })
  @Column({ name: 'provider_session_id', type: 'varchar', length: 255 })
  providerSessionId: string;

  /** Its payment intent (pi_…), known once the card is taken. */
  @Column({ name: 'provider_payment_id', type: 'varchar', length: 255, nullable: true })
  providerPaymentId: string | null;

  @Column({ name: 'failure_message', type: 'varchar', length: 500, nullable: true })
  failureMessage: string | null;

  @Column({ name: 'created_by', type: 'int', nullable: true })
  createdBy: number | null;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)', onUpdate: 'CURRENT_TIMESTAMP(3)' })
  updatedAt: Date;
}
