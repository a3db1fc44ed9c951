import type { EntityManager } from 'typeorm';

/**
 * What the jobs module needs to know about a job's runs: how many it has (the jobs list) and whether they
 * hold any reading (a job goes to review only with readings). Declared here and provided by RunsModule
 * (JobRunsReader), so that jobs can ask without importing runs, which itself depends on jobs (a run opens
 * under a job and moves its status): the dependency points one way, runs → jobs.
 */
export abstract class JobRunStatsSource {
  /** The number of runs of each job given (jobs without runs are left out). */
  abstract runCounts(jobIds: readonly number[]): Promise<Map<number, number>>;
  /** How many readings the job's runs hold together, in the caller's transaction when one is given. */
  abstract readingCount(jobId: number, manager?: EntityManager): Promise<number>;
}
