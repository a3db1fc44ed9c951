export const paths = {
  home: '/',
  signIn: '/sign-in',
  adminUsers: '/admin/users',
  adminOrganisations: '/admin/organisations',
  jobs: '/jobs',
  job: '/jobs/:jobId',
  instruments: '/instruments',
  instrument: '/instruments/:instrumentId',
  bandPlan: '/instruments/:instrumentId/band-plan',
  run: '/runs/:runId',
  standards: '/standards',
  benches: '/benches',
  adminOutbox: '/admin/outbox',
  adminOutboxMessage: '/admin/outbox/:messageId',
  reviews: '/reviews',
  review: '/reviews/:jobId',
  procedures: '/procedures',
  certificates: '/certificates',
  verify: '/verify',
  verifyCertificate: '/verify/:number',
  comparisons: '/comparisons',
  comparison: '/comparisons/:comparisonId',
  prices: '/prices',
  invoices: '/invoices',
  invoice: '/invoices/:invoiceId',
  statement: '/statements/:organizationId',
  portalQuotes: '/portal/quotes',
  portalInvoices: '/portal/invoices',
  portalInvoice: '/portal/invoices/:invoiceId',
} as const;

export const jobPath = (id: number) => `/jobs/${id}`;
export const instrumentPath = (id: number) => `/instruments/${id}`;
export const bandPlanPath = (instrumentId: number) => `/instruments/${instrumentId}/band-plan`;
export const runPath = (id: number) => `/runs/${id}`;
export const reviewPath = (jobId: number) => `/reviews/${jobId}`;
export const verifyPath = (number: string) => `/verify/${encodeURIComponent(number)}`;
export const outboxMessagePath = (id: number) => `/admin/outbox/${id}`;
/** A saved comparison by id, or `new` for one being put together. */
export const comparisonPath = (id: number | 'new') => `/comparisons/${id}`;

export const invoicePath = (id: number) => `/invoices/${id}`;
export const statementPath = (organizationId: number) => `/statements/${organizationId}`;
/** A client's invoice; the payment service sends the client back here with `?payment=done` or `?payment=cancelled`. */
export const portalInvoicePath = (id: number) => `/portal/invoices/${id}`;

export function signInPath(next?: string) {
  return next && next !== paths.home ? `${paths.signIn}?next=${encodeURIComponent(next)}` : paths.signIn;
}

/** Only same-site paths are followed after sign-in, so `next` cannot send anyone elsewhere. */
export function safeNextPath(next: string | null | undefined) {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return paths.home;
  if (next === paths.signIn || next.startsWith(`${paths.signIn}?`)) return paths.home;
  return next;
}
