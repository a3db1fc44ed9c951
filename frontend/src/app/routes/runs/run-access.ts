import type { Role, RunKind } from '@kilocycle/common/types';

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
