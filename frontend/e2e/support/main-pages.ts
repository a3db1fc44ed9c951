import type { Page } from 'playwright-core';
import type { Certificate, ListResponse } from '@kilocycle/common/types';
import { DEMO_PASSWORD } from './browser';
import { apiGet, apiLogin } from './lab';

export type DemoRole = 'admin' | 'lead' | 'technician' | 'engineer' | 'client';

export const DEMO_ACCOUNTS: Record<DemoRole, string> = {
  admin: 'admin@kilocycle.test',
  lead: 'lead@kilocycle.test',
  technician: 'tech@kilocycle.test',
  engineer: 'engineer@kilocycle.test',
  client: 'client@northgate.test',
};

/** The demo records the main pages show, found through the API (never by their demo names, which may change). */
export type DemoRecords = {
  /**
   * A job whose review page has data, fits and budget: the one in review, or, once the review-and-sign test has
   * signed it (the browser files share one database and their order is not fixed), a signed one.
   */
  reviewJobId: number;
  /** A calibration run with readings that is still open for capture. */
  captureRunId: number;
  /** An open calibration run with readings, whichever job holds it (falls back to any calibration run with readings). */
  calibrationRunId: number;
  /** A warm-up or stability study with readings. */
  studyRunId: number;
  instrumentId: number;
  comparisonId: number;
  certificateNumber: string;
};

type RunRow = { id: number; jobId: number; jobStatus: string; kind: string; status: string; readingCount: number };
type Row = { id: number };

function pick<T>(rows: readonly T[], test: (row: T) => boolean, what: string): T {
  const row = rows.find(test);
  if (!row) throw new Error(`the demo data holds no ${what}`);
  return row;
}

export async function findDemoRecords(): Promise<DemoRecords> {
  const lead = await apiLogin(DEMO_ACCOUNTS.lead, DEMO_PASSWORD);
  const runs = (await apiGet<ListResponse<RunRow>>(lead, '/runs?pageSize=200')).items;
  const calibration = (run: RunRow) => run.kind === 'as_found' || run.kind === 'as_left';
  const review =
    runs.find((run) => run.jobStatus === 'in_review' && run.readingCount > 0) ??
    pick(runs, (run) => (run.jobStatus === 'approved' || run.jobStatus === 'issued') && calibration(run) && run.readingCount > 0, 'job in review or signed');
  const open = runs.find((run) => calibration(run) && run.status === 'open');
  const withReadings = pick(runs, (run) => calibration(run) && run.readingCount > 0, 'calibration run with readings');
  const study = pick(runs, (run) => (run.kind === 'warmup' || run.kind === 'stability') && run.readingCount > 0, 'study run with readings');
  const instruments = (await apiGet<ListResponse<Row>>(lead, '/instruments?pageSize=20')).items;
  const comparisons = (await apiGet<ListResponse<Row>>(lead, '/comparisons')).items;
  const certificates = (await apiGet<ListResponse<Certificate>>(lead, '/certificates?status=issued')).items;
  return {
    reviewJobId: review.jobId,
    captureRunId: (open ?? withReadings).id,
    calibrationRunId: withReadings.id,
    studyRunId: study.id,
    instrumentId: pick(instruments, () => true, 'instrument').id,
    comparisonId: pick(comparisons, () => true, 'saved comparison').id,
    certificateNumber: pick(certificates, () => true, 'issued certificate').number,
  };
}

export type MainPage = { role: DemoRole | 'public'; name: string; path: (records: DemoRecords) => string };

/** The main pages of every role, as each role reaches them. */
export const MAIN_PAGES: readonly MainPage[] = [
  { role: 'public', name: 'sign-in', path: () => '/sign-in' },
  { role: 'public', name: 'verification lookup', path: () => '/verify' },
  { role: 'public', name: 'verification page', path: (r) => `/verify/${encodeURIComponent(r.certificateNumber)}` },
  { role: 'admin', name: 'admin overview', path: () => '/' },
  { role: 'admin', name: 'users', path: () => '/admin/users' },
  { role: 'admin', name: 'organisations', path: () => '/admin/organisations' },
  { role: 'admin', name: 'benches', path: () => '/benches' },
  { role: 'admin', name: 'outbox', path: () => '/admin/outbox' },
  { role: 'lead', name: 'lead overview', path: () => '/' },
  { role: 'lead', name: 'lead jobs', path: () => '/jobs' },
  { role: 'lead', name: 'a job', path: (r) => `/jobs/${r.reviewJobId}` },
  { role: 'lead', name: 'review queue', path: () => '/reviews' },
  { role: 'lead', name: 'review page', path: (r) => `/reviews/${r.reviewJobId}` },
  { role: 'lead', name: 'certificates', path: () => '/certificates' },
  { role: 'lead', name: 'procedures', path: () => '/procedures' },
  { role: 'lead', name: 'standards', path: () => '/standards' },
  { role: 'lead', name: 'prices', path: () => '/prices' },
  { role: 'lead', name: 'customer terms', path: () => '/prices?tab=customers' },
  { role: 'lead', name: 'invoices', path: () => '/invoices' },
  { role: 'technician', name: 'technician overview', path: () => '/' },
  { role: 'technician', name: 'technician jobs', path: () => '/jobs' },
  { role: 'technician', name: 'calibration run page', path: (r) => `/runs/${r.calibrationRunId}` },
  { role: 'technician', name: 'instruments', path: () => '/instruments' },
  { role: 'technician', name: 'an instrument', path: (r) => `/instruments/${r.instrumentId}` },
  { role: 'technician', name: 'prices (read-only)', path: () => '/prices' },
  { role: 'engineer', name: 'study run page', path: (r) => `/runs/${r.studyRunId}` },
  { role: 'engineer', name: 'comparisons', path: () => '/comparisons' },
  { role: 'engineer', name: 'a comparison', path: (r) => `/comparisons/${r.comparisonId}` },
  { role: 'client', name: 'client overview (portal)', path: () => '/' },
  { role: 'client', name: 'client jobs', path: () => '/jobs' },
  { role: 'client', name: 'client instruments', path: () => '/instruments' },
  { role: 'client', name: 'client certificates', path: () => '/certificates' },
  { role: 'client', name: 'client quotes', path: () => '/portal/quotes' },
  { role: 'client', name: 'client invoices', path: () => '/portal/invoices' },
];

/**
 * Waits until a page has fetched what it shows: the network quiet (live sockets do not count), the page's
 * heading drawn and no loading spinner left in the main area.
 */
export async function waitForPageSettled(page: Page): Promise<void> {
  await page.waitForLoadState('networkidle');
  await page.locator('h1').first().waitFor();
  await page
    .locator('main .MuiCircularProgress-root, main .MuiSkeleton-root, main .MuiDataGrid-overlay .MuiCircularProgress-root')
    .first()
    .waitFor({ state: 'detached', timeout: 20_000 })
    .catch(() => undefined);
  await page.waitForLoadState('networkidle');
}
