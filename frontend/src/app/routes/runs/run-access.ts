import type { Role, RunAnalysis, RunKind } from '@kilocycle/common/types';

const STUDY_KINDS: readonly RunKind[] = ['warmup', 'stability', 'supply_sensitivity', 'keying'];

/** Who may record into a run of this kind (the API says the same: engineers run studies, clients only read). */
export function mayWriteRun(role: Role, kind: RunKind): boolean {
  if (role === 'admin' || role === 'lead' || role === 'technician') return true;
  return role === 'engineer' && STUDY_KINDS.includes(kind);
}

/** Charts animate for people; a browser driven by a test (and a screenshot) gets them drawn at once. */
export const skipChartAnimation = typeof navigator !== 'undefined' && navigator.webdriver === true;

/** A 422 from the analysis means the readings cannot support it yet: its message says why. */
export function analysisProblem(error: unknown): string | null {
  if (!error) return null;
  if (error instanceof Error) return error.message;
  return 'The analysis could not be loaded.';
}

/**
 * What the page says in place of the analysis when the run has no included reading (the API's state "empty").
 * A newer refusal wins: the last good answer stays in the query's data while an error is shown.
 */
export function noReadingsNotice(data: RunAnalysis | undefined, error: unknown): string | null {
  if (error || !data || data.state !== 'empty') return null;
  if (data.readingCount === 0) return 'No readings yet.';
  return `No readings to analyse: ${data.readingCount === 1 ? 'the one reading is' : `all ${data.readingCount} readings are`} excluded.`;
}
