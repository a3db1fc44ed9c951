/**
 * The roots of the query keys that more than one feature touches. Features never import each other, so a
 * feature whose action changes another feature's data invalidates through these roots; the owning feature
 * builds its own keys (in its `api/get-*.ts` query options) on the same roots, so the two cannot drift apart.
 * Keys a single feature alone uses stay in that feature's query options.
 */
export const sharedQueryKeys = {
  /** Job lists, a job, its history (jobs feature). */
  jobs: ['jobs'],
  /** A job's review, results, run budgets and the review queue (reviews feature). */
  reviews: ['reviews'],
  /** Certificate lists and a job's certificates. */
  certificates: ['certificates'],
  /** Run lists, a run, its analysis, corrections, imports and capture state. */
  runs: ['runs'],
  /** A run's readings (the table and the latest ones). */
  readings: ['readings'],
  /** The price list: price items (read by the prices page and by the quote and invoice line dialogs). */
  prices: ['prices'],
  /** Quote lists and quotes (quotes feature). */
  quotes: ['quotes'],
  /** Invoice lists, an invoice, its payments and statements (invoices feature). */
  invoices: ['invoices'],
  /** A client's overview lists (portal feature): a payment may release a job's certificate shown there. */
  portal: ['portal'],
} as const;

/** One run (runs feature's `getRunQueryOptions`); the live feed refreshes it after a reconnection or an exclusion. */
export const runDetailQueryKey = (runId: number) => [...sharedQueryKeys.runs, 'detail', runId] as const;

/** A run's analysis, whatever its options (runs feature's `getRunAnalysisQueryOptions`); the live feed refreshes it. */
export const runAnalysisQueryKey = (runId: number) => [...sharedQueryKeys.runs, 'analysis', runId] as const;
