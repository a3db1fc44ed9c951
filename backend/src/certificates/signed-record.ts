import type { EntityManager } from 'typeorm';
import { withOutcomes } from '@kilocycle/common/math';
import type { CertificateStatus, JobResults, JobStatus, SignedRecord } from '@kilocycle/common/types';
import { LOCKED_JOB_STATUSES } from '@kilocycle/common/rules';
import { jsonColumn } from '../shared/json-column.js';

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
 * The record a signed job was signed with (its newest issued, superseded or withdrawn revision), or null
 * while the job is open (never signed, or reopened by an amendment). Every view of a signed job reads
 * this instead of the live rows, so later edits of procedures, standards, instruments or customers
 * change nothing it shows.
 */
export async function loadSignedRecord(manager: EntityManager, jobId: number): Promise<SignedRecordRow | null> {
  const [row]: Array<Record<string, unknown>> = await manager.query(
    `SELECT c.id, c.number, c.revision, c.status, c.results, c.record, j.status AS job_status
       FROM certificates c JOIN jobs j ON j.id = c.job_id
      WHERE c.job_id = ? AND j.status IN (?) AND c.status <> 'draft' AND c.results IS NOT NULL
      ORDER BY c.revision DESC LIMIT 1`,
    [jobId, LOCKED_JOB_STATUSES],
  );
  if (!row) return null;
  const record = row.record === null ? null : jsonColumn<SignedRecord>(row.record);
  const jobStatus = row.job_status as JobStatus;
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
