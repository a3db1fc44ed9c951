import type { EntityManager } from 'typeorm';

/**
 * Whether work on a job may start (received → in_progress). Declared here and provided by QuotesModule
 * (quotes/quote-start-gate.ts: a customer who requires a quote must have accepted one), so that jobs can ask
 * without importing quotes, which itself depends on jobs: the dependency points one way, quotes → jobs.
 * Jobs injects it as optional: with no provider registered the gate is open.
 */
export const JOB_START_GATE = 'JOB_START_GATE';

export type JobStartGate = {
  /** Why work on the job may not start yet (a sentence for the 409), or null when it may. */
  startRefusal(jobId: number, manager?: EntityManager): Promise<string | null>;
};
