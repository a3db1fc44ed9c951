import { Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { CustomerTerms } from '@kilocycle/common/types';
import type { DataSource, EntityManager } from 'typeorm';
import { OrganizationsReader } from '../organizations/organizations.reader.js';
import { CustomerTermsRow } from './customer-terms.entity.js';
import { TaxRate } from './tax-rate.entity.js';

/** Terms as read with their rate's name and figure (for one organisation or many). */
export function toCustomerTerms(
  organization: { id: number; name: string },
  row: CustomerTermsRow | null,
  defaultRate: Pick<TaxRate, 'id' | 'name' | 'rateBasisPoints'> | null,
): CustomerTerms {
  if (!row) {
    return {
      organizationId: organization.id,
      organizationName: organization.name,
      taxRateId: defaultRate?.id ?? null,
      taxRateName: defaultRate?.name ?? null,
      taxRateBasisPoints: defaultRate?.rateBasisPoints ?? null,
      taxRegistration: null,
      paymentTerms: 'pay_before_release',
      netDays: 0,
      requiresQuote: false,
      updatedAt: null,
    };
  }
  return {
    organizationId: organization.id,
    organizationName: organization.name,
    taxRateId: row.taxRateId,
    taxRateName: row.taxRate?.name ?? null,
    taxRateBasisPoints: row.taxRate?.rateBasisPoints ?? null,
    taxRegistration: row.taxRegistration,
    paymentTerms: row.paymentTerms,
    netDays: row.netDays,
    requiresQuote: row.requiresQuote,
    updatedAt: row.updatedAt.toISOString(),
  };
}

/**
 * A customer's commercial terms, for quotes, invoices and payments (in the caller's transaction when a manager is
 * given). An organisation the lab has set no terms for gets the DEFAULTS: pay before release, net 0 days, no quote
 * required, and tax at the active rate with the lowest id (the first one the lab set up, normally its standard
 * rate) — or exempt (no rate, no registration number) while the lab has no active rate at all.
 */
@Injectable()
export class CustomerTermsReader {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly organizations: OrganizationsReader,
  ) {}

  /** The organisation's terms, or its defaults; 404 when there is no such organisation. */
  async termsFor(organizationId: number, manager?: EntityManager): Promise<CustomerTerms> {
    const m = manager ?? this.dataSource.manager;
    const organization = await this.organizations.byId(organizationId, m);
    if (!organization) throw new NotFoundException(`Organization ${organizationId} not found`);
    const row = await m.findOne(CustomerTermsRow, { where: { organizationId }, relations: { taxRate: true } });
    return toCustomerTerms(organization, row, row ? null : await this.defaultRate(m));
  }

  /** The rate an organisation without terms is charged: the active rate with the lowest id, or null (exempt). */
  async defaultRate(manager?: EntityManager): Promise<TaxRate | null> {
    return (manager ?? this.dataSource.manager).findOne(TaxRate, { where: { active: true }, order: { id: 'ASC' } });
  }
}
