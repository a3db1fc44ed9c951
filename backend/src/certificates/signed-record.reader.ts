import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';
import { withOutcomes } from '@kilocycle/common/math';
import type { CertificateStatus, JobResults, JobStatus, SignedRecord } from '@kilocycle/common/types';
import { LOCKED_JOB_STATUSES } from '@kilocycle/common/rules';
import { JobScopeReader } from '../jobs/job-scope.reader.js';
import { jsonColumn } from '../shared/json-column.js';
import { SignedResultsSource } from '../shared/signed-results.js';

export type SignedRecordRow = {
  certificateId: number;
  number: string;
  revision: number;
  status: CertificateStatus;
  jobStatus: JobStatus;
  /** Null only for revisions signed before records were kept: then `results` is all that was stored. */
  record: SignedRecord | null;
  results: JobResults;
};

/**
 * Signed records for the modules that show a signed job (reviews, exports), and a signed job's results for
 * budgets (provided as SignedResultsSource). Also built by hand (`new SignedRecordReader(dataSource, ...)`).
 */
@Injectable()
export class SignedRecordReader extends SignedResultsSource {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly jobs: JobScopeReader,
  ) {
    super();
  }

  /**
   * The record a signed job was signed with (its newest issued, superseded or withdrawn revision), or null
   * while the job is open (never signed, or reopened by an amendment). Every view of a signed job reads
   * this instead of the live rows, so later edits of procedures, standards, instruments or customers
   * change nothing it shows.
   */
  async signedRecord(jobId: number, manager?: EntityManager): Promise<SignedRecordRow | null> {
    const runner = manager ?? this.dataSource.manager;
    const job = await this.jobs.scope(jobId, runner);
    if (!job || !(LOCKED_JOB_STATUSES as readonly string[]).includes(job.status)) return null;
    const [row]: Array<Record<string, unknown>> = await runner.query(
      `SELECT id, number, revision, status, results, record FROM certificates
        WHERE job_id = ? AND status <> 'draft' AND results IS NOT NULL ORDER BY revision DESC LIMIT 1`,
      [jobId],
    );
    if (!row) return null;
    const record = row.record === null ? null : jsonColumn<SignedRecord>(row.record);
    const jobStatus = job.status;
    // The results as signed; only the job's status is today's. Results signed before the two outcomes were
    // kept get them derived from their own points.
    const results = withOutcomes({ ...(record?.results ?? jsonColumn<JobResults>(row.results)), jobStatus });
    return {
      certificateId: Number(row.id),
      number: String(row.number),
      revision: Number(row.revision),
      status: row.status as CertificateStatus,
      jobStatus,
      record: record ? { ...record, results } : null,
      results,
    };
  }

  async signedResults(jobId: number, manager?: EntityManager): Promise<JobResults | null> {
    return (await this.signedRecord(jobId, manager))?.results ?? null;
  }
}
