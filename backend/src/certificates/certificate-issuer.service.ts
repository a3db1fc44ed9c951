import { Inject, Injectable, Optional } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource } from 'typeorm';
import { AuditService } from '../audit/audit.service.js';
import { JobResultsService } from '../budgets/job-results.service.js';
import { APP_CONFIG, type AppConfig } from '../config/config.module.js';
import { CertificateInstrumentWriter } from '../instruments/certificate-instrument.writer.js';
import { RangeResultsReader } from '../instruments/range-results.reader.js';
import { JobStatusWriter } from '../jobs/job-status.writer.js';
import { ReviewJobsReader } from '../jobs/review-jobs.reader.js';
import { OrganizationsReader } from '../organizations/organizations.reader.js';
import { ReadingResultsReader } from '../readings/reading-results.reader.js';
import { RunResultsReader } from '../runs/run-results.reader.js';
import { RunStandardVersionWriter } from '../runs/run-standard-version.writer.js';
import { CERTIFICATE_BILLING, type CertificateBilling } from '../shared/certificate-billing.js';
import { JobReviewEvents } from '../shared/job-review-events.js';
import { StandardResultsReader } from '../standards/standard-results.reader.js';
import { CertificateRecipientsReader } from '../users/certificate-recipients.reader.js';
import { FileStore } from '../storage/file-store.service.js';
import { issueCertificate, type IssueDeps, type IssueInput, type IssueOutcome } from './issue-certificate.js';

/**
 * Signing a job for the reviews module, which checks the signer first: issueCertificate over the owners'
 * injected readers and writers, in one transaction with the job's "sign" review event, the stored PDF and the job's
 * draft invoice when billing is on (nothing of it stays if the transaction fails).
 */
@Injectable()
export class CertificateIssuer {
  private readonly deps: IssueDeps;

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(APP_CONFIG) config: AppConfig,
    results: JobResultsService,
    private readonly reviewEvents: JobReviewEvents,
    jobs: ReviewJobsReader,
    jobStatus: JobStatusWriter,
    instruments: CertificateInstrumentWriter,
    ranges: RangeResultsReader,
    organizations: OrganizationsReader,
    runs: RunResultsReader,
    runStandards: RunStandardVersionWriter,
    standards: StandardResultsReader,
    readings: ReadingResultsReader,
    recipients: CertificateRecipientsReader,
    audit: AuditService,
    files: FileStore,
    // Provided by invoices when billing is on: the job's draft invoice is made in the signing transaction.
    @Optional() @Inject(CERTIFICATE_BILLING) private readonly billing: CertificateBilling | null = null,
  ) {
    this.deps = {
      config,
      results,
      files,
      readers: { jobs, jobStatus, instruments, ranges, organizations, runs, runStandards, standards, readings, recipients, audit },
    };
  }

  issue(input: IssueInput): Promise<IssueOutcome> {
    return this.dataSource.transaction(async (manager) => {
      const outcome = await issueCertificate(manager, this.deps, input);
      await this.reviewEvents.record(outcome.reviewEvent, manager);
      await this.billing?.certificateIssued(input.jobId, manager);
      return outcome;
    });
  }
}
