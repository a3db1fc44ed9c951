import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, OneToMany, PrimaryGeneratedColumn, UpdateDateColumn, type Relation } from 'typeorm';
import type { InvoiceStatus, PaymentTerms } from '@kilocycle/common/types';
import { Job } from '../jobs/job.entity.js';
import { Organization } from '../organizations/organization.entity.js';
import { MINOR_UNITS } from '../shared/money-column.js';
import { User } from '../users/user.entity.js';
import { InvoiceLine } from './invoice-line.entity.js';

/**
 * What the lab bills for one job. A draft is made when the job's certificate is signed; issuing gives it its
 * number (INV-000123, from document_sequences), its date and due date, and snapshots the customer's tax
 * treatment and terms onto it; from then on it never changes, except the money columns, which only the ledger
 * (invoice-ledger.writer.ts) moves: paid, refunded and credited, from which the balance and status follow
 * (common/src/money/invoice-balance.ts).
 */
@Entity('invoices')
@Index('IDX_invoices_organization_status', ['organizationId', 'status'])
@Index('IDX_invoices_status_due', ['status', 'dueDate'])
export class Invoice {
  @PrimaryGeneratedColumn()
  id: number;

  /** NULL while draft. */
  @Index('UQ_invoices_number', { unique: true })
  @Column({ type: 'varchar', length: 16, nullable: true })
  number: string | null;

  /** One invoice per job. */
  @Index('UQ_invoices_job', { unique: true })
  @Column({ name: 'job_id', type: 'int' })
  jobId: number;

  @ManyToOne(() => Job, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'job_id', foreignKeyConstraintName: 'FK_invoices_job' })
  job: Relation<Job>;

  @Column({ name: 'organization_id', type: 'int' })
  organizationId: number;

  @ManyToOne(() => Organization, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'organization_id', foreignKeyConstraintName: 'FK_invoices_organization' })
  organization: Relation<Organization>;

  /** The accepted quote the lines came from, if any (quotes owns that table: no foreign key across owners' rewrites). */
  @Index('IDX_invoices_quote')
  @Column({ name: 'quote_id', type: 'int', nullable: true })
  quoteId: number | null;

  @Column({ type: 'varchar', length: 16 })
  status: InvoiceStatus;

  @Column({ type: 'char', length: 3 })
  currency: string;

  @Column({ name: 'tax_exempt', type: 'boolean', default: false })
  taxExempt: boolean;

  @Column({ name: 'tax_registration', type: 'varchar', length: 64, nullable: true })
  taxRegistration: string | null;

  /** The rate charged on every line (0 when exempt). */
  @Column({ name: 'tax_rate_basis_points', type: 'int', default: 0 })
  taxRateBasisPoints: number;

  @Column({ name: 'payment_terms', type: 'varchar', length: 24 })
  paymentTerms: PaymentTerms;

  @Column({ name: 'net_days', type: 'int', default: 0 })
  netDays: number;

  @Column({ name: 'net_minor', type: 'bigint', default: 0, transformer: MINOR_UNITS })
  netMinor: number;

  @Column({ name: 'tax_minor', type: 'bigint', default: 0, transformer: MINOR_UNITS })
  taxMinor: number;

  @Column({ name: 'gross_minor', type: 'bigint', default: 0, transformer: MINOR_UNITS })
  grossMinor: number;

  /** Moved only by the ledger. */
  @Column({ name: 'paid_minor', type: 'bigint', default: 0, transformer: MINOR_UNITS })
  paidMinor: number;

  @Column({ name: 'refunded_minor', type: 'bigint', default: 0, transformer: MINOR_UNITS })
  refundedMinor: number;

  @Column({ name: 'credited_minor', type: 'bigint', default: 0, transformer: MINOR_UNITS })
  creditedMinor: number;

  @Column({ name: 'issued_at', type: 'datetime', precision: 3, nullable: true })
  issuedAt: Date | null;

  @Column({ name: 'issued_by', type: 'int', nullable: true })
  issuedById: number | null;

  @ManyToOne(() => User, { onDelete: 'RESTRICT', nullable: true })
  @JoinColumn({ name: 'issued_by', foreignKeyConstraintName: 'FK_invoices_issued_by' })
  issuedBy: Relation<User> | null;

  /** Issue date + net days (YYYY-MM-DD). */
  @Column({ name: 'due_date', type: 'date', nullable: true })
  dueDate: string | null;

  /** The PDF issued, in the file store (storage module). */
  @Column({ name: 'pdf_file_id', type: 'int', nullable: true })
  pdfFileId: number | null;

  /** When the last overdue reminder went (at most one a week). */
  @Column({ name: 'reminded_at', type: 'datetime', precision: 3, nullable: true })
  remindedAt: Date | null;

  @OneToMany(() => InvoiceLine, (line) => line.invoice)
  lines: Relation<InvoiceLine[]>;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt: Date;

  @UpdateDateColumn({
    name: 'updated_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
    onUpdate: 'CURRENT_TIMESTAMP(3)',
  })
  updatedAt: Date;
}
