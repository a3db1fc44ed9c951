import { Column, Entity, JoinColumn, ManyToOne, PrimaryColumn, UpdateDateColumn, type Relation } from 'typeorm';
import type { PaymentTerms } from '@kilocycle/common/types';
import { Organization } from '../organizations/organization.entity.js';
import { TaxRate } from './tax-rate.entity.js';

/**
 * A customer organisation's commercial terms: the tax it is charged (a rate, or exempt with its registration
 * number), how it pays (before the certificate is released, or on account with net days) and whether work
 * waits for an accepted quote. An organisation without a row has the defaults of CustomerTermsReader.
 */
@Entity('customer_terms')
export class CustomerTermsRow {
  @PrimaryColumn({ name: 'organization_id', type: 'int' })
  organizationId: number;

  @ManyToOne(() => Organization, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'organization_id', foreignKeyConstraintName: 'FK_customer_terms_organization' })
  organization: Relation<Organization>;

  /** NULL: exempt (then tax_registration is set). */
  @Column({ name: 'tax_rate_id', type: 'int', nullable: true })
  taxRateId: number | null;

  @ManyToOne(() => TaxRate, { onDelete: 'RESTRICT', nullable: true })
  @JoinColumn({ name: 'tax_rate_id', foreignKeyConstraintName: 'FK_customer_terms_tax_rate' })
  taxRate: Relation<TaxRate> | null;

  @Column({ name: 'tax_registration', type: 'varchar', length: 64, nullable: true })
  taxRegistration: string | null;

  @Column({ name: 'payment_terms', type: 'varchar', length: 24 })
  paymentTerms: PaymentTerms;

  @Column({ name: 'net_days', type: 'int', default: 0 })
  netDays: number;

  @Column({ name: 'requires_quote', type: 'boolean', default: false })
  requiresQuote: boolean;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)', onUpdate: 'CURRENT_TIMESTAMP(3)' })
  updatedAt: Date;
}
