import type { CaptureSettings } from '@kilocycle/common/types';

/**
 * The counter-assisted capture settings (settle count, tolerance, timeout, dial marks) of the procedure a job
 * uses, for ingest's counter capture. Declared here and provided by BudgetsModule (ProcedureCaptureReader),
 * which owns the procedures, so that ingest can ask without importing budgets, which itself depends on ingest
 * for a job's results (the captures' samples): the dependency points one way, budgets → ingest.
 */
export abstract class CaptureSettingsSource {
  /** The settings of the job's chosen procedure, else the default one, else the first active one; CAPTURE_DEFAULTS when there is none. */
  abstract forJob(jobId: number): Promise<CaptureSettings>;
}
