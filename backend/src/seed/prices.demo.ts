import type { EntityManager } from 'typeorm';
import { AuditService } from '../audit/audit.service.js';
import { Organization } from '../organizations/organization.entity.js';
import { CustomerTermsRow } from '../prices/customer-terms.entity.js';
import { PriceItem } from '../prices/price-item.entity.js';
import { TaxRate } from '../prices/tax-rate.entity.js';
import type { DemoContext } from './demo-seed.js';

/** A third customer, a charity exempt from tax: it has terms but no accounts and no jobs yet. */
export const DEMO_EXEMPT_CUSTOMER = {
  name: 'Fellside Schools Radio Trust',
  contactEmail: 'office@fellside-trust.test',
  taxRegistration: 'FSRT-40715',
} as const;

/** The demo price list (the lab's own codes), prices in minor units of the lab's currency. */
export const DEMO_PRICE_ITEMS = [
  { code: 'CAL-RNG', description: 'Calibration, per range', unit: 'per_range', unitPriceMinor: 8_500, proposeOnQuotes: true, active: true },
  { code: 'JOB-ADM', description: 'Job handling and certificate', unit: 'per_job', unitPriceMinor: 3_500, proposeOnQuotes: true, active: true },
  { code: 'STAB-HR', description: 'Stability study, per hour', unit: 'per_hour', unitPriceMinor: 4_200, proposeOnQuotes: false, active: true },
  { code: 'WARM-HR', description: 'Warm-up drift study, per hour', unit: 'per_hour', unitPriceMinor: 3_800, proposeOnQuotes: false, active: true },
  { code: 'ADJ-RNG', description: 'Adjustment of the dial, per range', unit: 'per_range', unitPriceMinor: 6_000, proposeOnQuotes: false, active: true },
  {
    code: 'CAL-XTAL',
    description: 'Crystal reference check (retired: now a stability study)',
    unit: 'per_job',
    unitPriceMinor: 12_000,
    proposeOnQuotes: false,
    active: false,
  },
] as const;

/**
 * The price list, a standard (20 %) and a reduced (5 %) tax rate, and terms for each customer: Northgate Radio Club
 * pays before release and needs an accepted quote before work starts; Saltmarsh Restoration Works is on account,
 * net 30; the Fellside Schools Radio Trust (added here) is exempt with its registration number, on account net 14.
 */
export async function seedDemoPrices({ manager, customerIds, userIds }: DemoContext): Promise<void> {
  const audit = AuditService.within(manager);
  const admin = userIds['admin@kilocycle.test'] ?? null;
  const standard = await insertRate(manager, audit, admin, 'Standard rate', 2000);
  await insertRate(manager, audit, admin, 'Reduced rate', 500);
  for (const item of DEMO_PRICE_ITEMS) {
    const id = (await manager.insert(PriceItem, { ...item })).identifiers[0].id as number;
    await audit.record({ actorId: admin, entity: 'price_item', entityId: id, action: 'create', changes: { ...item } }, manager);
  }
  const fellside = (await manager.insert(Organization, { name: DEMO_EXEMPT_CUSTOMER.name, kind: 'customer', contactEmail: DEMO_EXEMPT_CUSTOMER.contactEmail }))
    .identifiers[0].id as number;
  const terms: Array<Omit<CustomerTermsRow, 'organization' | 'taxRate' | 'updatedAt'>> = [
    { organizationId: customerIds.northgate, taxRateId: standard, taxRegistration: null, paymentTerms: 'pay_before_release', netDays: 0, requiresQuote: true },
    { organizationId: customerIds.saltmarsh, taxRateId: standard, taxRegistration: null, paymentTerms: 'on_account', netDays: 30, requiresQuote: false },
    {
      organizationId: fellside,
      taxRateId: null,
      taxRegistration: DEMO_EXEMPT_CUSTOMER.taxRegistration,
      paymentTerms: 'on_account',
      netDays: 14,
      requiresQuote: false,
    },
  ];
  for (const row of terms) {
    await manager.insert(CustomerTermsRow, row);
    await audit.record({ actorId: admin, entity: 'customer_terms', entityId: row.organizationId, action: 'update', changes: { from: null, to: row } }, manager);
  }
}

async function insertRate(manager: EntityManager, audit: AuditService, actorId: number | null, name: string, rateBasisPoints: number): Promise<number> {
  const id = (await manager.insert(TaxRate, { name, rateBasisPoints })).identifiers[0].id as number;
  await audit.record({ actorId, entity: 'tax_rate', entityId: id, action: 'create', changes: { name, rateBasisPoints } }, manager);
  return id;
}
