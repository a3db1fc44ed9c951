import type { EntityManager } from 'typeorm';
import { JobResultsService } from '../budgets/job-results.service.js';
import { loadConfig } from '../config/config.module.js';
import type { JobReviewEvents } from '../shared/job-review-events.js';
import { FileStore } from '../storage/file-store.service.js';
import { writeSettings } from './certificate-settings.js';
import { issueCertificate, issueReadersOver } from './issue-certificate.js';

/** The demo laboratory's address and place of calibration, as the certificates print them. Part of the seed's one transaction. */
export async function writeDemoCertificateSettings(manager: EntityManager): Promise<void> {
  await writeSettings(
    manager,
    { labAddress: 'Unit 4, Quarry Lane Workshops, Millbrook MB3 7QL', calibrationPlace: "At the laboratory's permanent premises (bench 1)" },
    null,
  );
}

/**
 * Signs a demo job in review through the same code path as the API, so the stored PDF verifies; the
 * "sign" event it hands back is recorded in the job's review history. Part of the seed's one transaction.
 */
export async function issueDemoCertificate(
  manager: EntityManager,
  reviewEvents: JobReviewEvents,
  input: { jobId: number; signerId: number; now: Date },
): Promise<void> {
  const issued = await issueCertificate(
    manager,
    {
      config: loadConfig(),
      results: JobResultsService.over(manager.connection),
      readers: issueReadersOver(manager.connection),
      files: new FileStore(manager.connection),
    },
    input,
  );
  // The job's review history is the reviews module's: issuing hands its "sign" event back to record.
  await reviewEvents.record(issued.reviewEvent, manager);
}
