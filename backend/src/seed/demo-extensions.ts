import { seedDemoCertificates } from '../certificates/certificates.demo.js';
import { JobReviewEventsWriter } from '../reviews/job-review-events.writer.js';
import { seedDemoStandards } from '../standards/standards.demo.js';
import type { DemoExtension } from './demo-seed.js';
import { seedDemoLabRecords } from './lab-records.demo.js';
import { seedDemoBenches } from './live-run.demo.js';

/**
 * Each module that brings demo records adds its `<module>.demo.ts` function here, in dependency order.
 * They run inside the seed's one transaction, after the organisations and accounts.
 */
export const DEMO_EXTENSIONS: DemoExtension[] = [
  seedDemoStandards,
  seedDemoLabRecords,
  // The certificate demo writes the job's review events through the reviews module's writer (certificates does not import reviews).
  (context) => seedDemoCertificates(context, new JobReviewEventsWriter(context.manager.connection)),
  seedDemoBenches,
];
