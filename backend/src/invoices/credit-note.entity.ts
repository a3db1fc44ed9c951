import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Organization } from '../organizations/organization.entity.js';
import { MINOR_UNITS } from '../shared/money-column.js';
import { User } from '../users/user.entity.js';
import { Invoice } from './invoice.entity.js';

/**
 * A correction of an issued invoice (CN-000012, from its own gap-free sequence): gross split into net and tax in
 * the invoice's proportion (common/src/money/credit-split.ts). A card refund makes one too, naming the payment.
 */
@Entity('credit_notes')
@Index('IDX_credit_notes_organization', ['organizationId', 'issuedAt'])
export class CreditNote {
  @PrimaryGeneratedColumn()
  id: number;

  @Index('UQ_credit_notes_number', { unique: true })
  @Column({ type: 'varchar', length: 16 })
  number: string;

  @Column({ name: 'invoice_id', type: 'int' })
  invoiceId: number;

  @ManyToOne(() => Invoice, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'invoice_id', foreignKeyConstraintName: 'FK_credit_notes_invoice' })
  invoice: Relation<Invoice>;

  @Column({ name: 'organization_id', type: 'int' })
  organizationId: number;

  @ManyToOne(() => Organization, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'organization_id', foreignKeyConstraintName: 'FK_credit_notes_organization' })
  organization: Relation<Organization>;

  @Column({ type: 'varchar', length: 500 })
  reason: string;

  @Column({ name: 'net_minor', type: 'bigint', transformer: MINOR_UNITS })
  netMinor: number;

  @Column({ name: 'tax_minor', type: 'bigint', transformer: MINOR_UNITS })
  taxMinor: number;

  @Column({ name: 'gross_minor', type: 'bigint', transformer: MINOR_UNITS })
  grossMinor: number;

  /** The card payment whose refund this records (payments owns that table). */
  @Index('IDX_credit_notes_payment')
  @Column({ name: 'payment_id', type: 'int', nullable: true })
  paymentId: number | null;

  @Column({ name: 'issued_at', type: 'datetime', precision: 3 })
  issuedAt: Date;

  @Column({ name: 'issued_by', type: 'int', nullable: true })
  issuedById: number | null;

  @ManyToOne(() => User, { onDelete: 'RESTRICT', nullable: true })
  @JoinColumn({ name: 'issued_by', foreignKeyConstraintName: 'FK_credit_notes_issued_by' })
  issuedBy: Relation<User> | null;

  @Column({ name: 'pdf_file_id', type: 'int', nullable: true })
  pdfFileId: number | null;
}
