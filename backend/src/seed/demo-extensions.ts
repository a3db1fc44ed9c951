import { seedDemoStandards } from '../standards/standards.demo.js';
import { seedDemoCertificates } from './certificate.demo.js';
import { seedDemoInvoices } from './invoices.demo.js';
import type { DemoExtension } from './demo-seed.js';
import { seedDemoLabRecords } from './lab-records.demo.js';
import { seedDemoBenches } from './live-run.demo.js';
import { seedDemoPrices } from './prices.demo.js';
import { seedDemoQuotes } from './quotes.demo.js';

/**
 * Each module that brings demo records adds its `<module>.demo.ts` function here, in dependency order.
 * They run inside the seed's one transaction, after the organisations and accounts.
 */
export const DEMO_EXTENSIONS: DemoExtension[] = [
  seedDemoStandards,
  seedDemoLabRecords,
  seedDemoCertificates,
  seedDemoBenches,
  seedDemoPrices,
  seedDemoQuotes,
  seedDemoInvoices,
];
