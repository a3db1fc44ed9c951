import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, OneToMany, PrimaryGeneratedColumn, UpdateDateColumn, type Relation } from 'typeorm';
import type { AcceptanceChannel, QuoteStatus } from '@kilocycle/common/types';
import { Job } from '../jobs/job.entity.js';
import { Organization } from '../organizations/organization.entity.js';
import { MoneyColumn } from '../shared/money-column.js';
import { User } from '../users/user.entity.js';
import { QuoteLine } from './quote-line.entity.js';

/**
 * A price offered for one job, which the customer accepts or declines. The number (Q-000123) is made from the id
 * in the creating transaction. Totals are the sums of the lines' rounded amounts (common/src/money), kept here so
 * lists need not read the lines.
 */
@Entity('quotes')
@Index('IDX_quotes_job_status', ['jobId', 'status'])
@Index('IDX_quotes_organization_status', ['organizationId', 'status'])
export class Quote {
  @PrimaryGeneratedColumn()
  id: number;

  /** NULL only between the insert and the update of the same transaction. */
  @Index('UQ_quotes_number', { unique: true })
  @Column({ type: 'varchar', length: 16, nullable: true })
  number: string | null;

  @Column({ name: 'job_id', type: 'int' })
  jobId: number;

  @ManyToOne(() => Job, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'job_id', foreignKeyConstraintName: 'FK_quotes_job' })
  job: Relation<Job>;

  @Column({ name: 'organization_id', type: 'int' })
  organizationId: number;

  @ManyToOne(() => Organization, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'organization_id', foreignKeyConstraintName: 'FK_quotes_organization' })
  organization: Relation<Organization>;

  @Column({ type: 'varchar', length: 16 })
  status: QuoteStatus;

  @Column({ type: 'char', length: 3 })
  currency: string;

  /** The customer's tax treatment when the lines were last priced. */
  @Column({ name: 'tax_exempt', type: 'boolean', default: false })
  taxExempt: boolean;

  @Column({ name: 'tax_registration', type: 'varchar', length: 64, nullable: true })
  taxRegistration: string | null;

  /** The rate charged on every line (0 when exempt). */
  @Column({ name: 'tax_rate_basis_points', type: 'int', default: 0 })
  taxRateBasisPoints: number;

  @MoneyColumn('net_minor', { default: 0 })
  netMinor: number;

  @MoneyColumn('tax_minor', { default: 0 })
  taxMinor: number;

  @MoneyColumn('gross_minor', { default: 0 })
  grossMinor: number;

  @Column({ name: 'validity_days', type: 'int' })
  validityDays: number;

  @Column({ type: 'text', nullable: true })
  notes: string | null;

  /** The PDF sent, in the file store (storage module); set when the quote is sent. */
  @Column({ name: 'pdf_file_id', type: 'int', nullable: true })
  pdfFileId: number | null;

  @Column({ name: 'sent_at', type: 'datetime', precision: 3, nullable: true })
  sentAt: Date | null;

  /** Last day the customer may accept (YYYY-MM-DD, UTC). */
  @Column({ name: 'valid_until', type: 'date', nullable: true })
  validUntil: string | null;

  @Column({ name: 'decided_at', type: 'datetime', precision: 3, nullable: true })
  decidedAt: Date | null;

  @Column({ name: 'decided_by', type: 'int', nullable: true })
  decidedById: number | null;

  @ManyToOne(() => User, { onDelete: 'RESTRICT', nullable: true })
  @JoinColumn({ name: 'decided_by', foreignKeyConstraintName: 'FK_quotes_decided_by' })
  decidedBy: Relation<User> | null;

  @Column({ name: 'acceptance_channel', type: 'varchar', length: 16, nullable: true })
  acceptanceChannel: AcceptanceChannel | null;

  @Column({ name: 'decision_note', type: 'text', nullable: true })
  decisionNote: string | null;

  @Column({ name: 'created_by', type: 'int' })
  createdById: number;

  @ManyToOne(() => User, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'created_by', foreignKeyConstraintName: 'FK_quotes_created_by' })
  createdBy: Relation<User>;

  @OneToMany(() => QuoteLine, (line) => line.quote)
  lines: Relation<QuoteLine[]>;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)', onUpdate: 'CURRENT_TIMESTAMP(3)' })
  updatedAt: Date;
}
