import type { EntityManager } from 'typeorm';
import type { ReviewAction } from '@kilocycle/common/types';

/** One event of a job's review history. */
export type JobReviewEvent = { jobId: number; action: ReviewAction; actorId: number | null; comment: string | null; at?: Date };

/**
 * A job's review history, for the certificates module (signing, amending and withdrawing a certificate
 * are events of it). Declared here and provided by ReviewsModule (JobReviewEventsWriter), which owns the
 * job_reviews table, so that certificates can write them without importing reviews, which itself
 * calls certificates to sign: the dependency points one way, reviews → certificates.
 */
export abstract class JobReviewEvents {
  /** Records the event; pass the transaction's manager so it commits or rolls back with the change. */
  abstract record(event: JobReviewEvent, manager?: EntityManager): Promise<void>;
}
