import type { EntityManager } from 'typeorm';
import type { JobResults } from '@kilocycle/common/types';

/**
 * The results a signed job was signed with, for budgets (its results route shows them instead of computing
 * anew). Declared here and provided by CertificatesModule (SignedRecordReader), which owns the signed
 * records, so that budgets can ask without importing certificates, which itself depends on budgets for a
 * job's results: the dependency points one way, certificates → budgets.
 */
export abstract class SignedResultsSource {
  /** The signed results, or null while the job is open (never signed, or reopened by an amendment). */
  abstract signedResults(jobId: number, manager?: EntityManager): Promise<JobResults | null>;
}
