import { lazy, Suspense, useEffect, useMemo, type ComponentType, type LazyExoticComponent } from 'react';
import { createBrowserRouter, RouterProvider, type RouteObject } from 'react-router-dom';
import { FullPageSpinner } from '@/components/ui/full-page-spinner';
import { rolesFor } from '@/config/navigation';
import { paths } from '@/config/paths';
import { RequireRole } from '@/lib/auth';
import { LAB_ROLES } from '@kilocycle/common/rules';
import { setNavigator } from '@/lib/navigator';
import { AppRoot } from './routes/app-root';
import { RouteError } from './routes/route-error';

const SignInRoute = lazy(() => import('./routes/sign-in'));
const OverviewRoute = lazy(() => import('./routes/overview'));
const UsersRoute = lazy(() => import('./routes/admin/users'));
const OrganisationsRoute = lazy(() => import('./routes/admin/organisations'));
const NotFoundRoute = lazy(() => import('./routes/not-found'));
const JobsRoute = lazy(() => import('./routes/jobs/jobs'));
const JobRoute = lazy(() => import('./routes/jobs/job'));
const InstrumentsRoute = lazy(() => import('./routes/instruments/instruments'));
const InstrumentRoute = lazy(() => import('./routes/instruments/instrument'));
const BandPlanRoute = lazy(() => import('./routes/instruments/band-plan'));
const RunRoute = lazy(() => import('./routes/runs/run'));
const StandardsRoute = lazy(() => import('./routes/standards'));
const BenchesRoute = lazy(() => import('./routes/benches'));
const ReviewQueueRoute = lazy(() => import('./routes/reviews/queue'));
const ReviewRoute = lazy(() => import('./routes/reviews/review'));
const ProceduresRoute = lazy(() => import('./routes/procedures'));
const CertificatesRoute = lazy(() => import('./routes/certificates'));
const OutboxRoute = lazy(() => import('./routes/admin/outbox'));
const OutboxMessageRoute = lazy(() => import('./routes/admin/outbox-message'));
const VerifyLookupRoute = lazy(() => import('./routes/verify/lookup'));
const VerifyCertificateRoute = lazy(() => import('./routes/verify/certificate'));
const ComparisonsRoute = lazy(() => import('./routes/comparisons/list'));
const ComparisonRoute = lazy(() => import('./routes/comparisons/comparison'));
const PricesRoute = lazy(() => import('./routes/prices'));
const InvoicesRoute = lazy(() => import('./routes/invoices/list'));
const InvoiceRoute = lazy(() => import('./routes/invoices/invoice'));
const StatementRoute = lazy(() => import('./routes/invoices/statement'));
const PortalQuotesRoute = lazy(() => import('./routes/portal/quotes'));
const PortalInvoicesRoute = lazy(() => import('./routes/portal/invoices'));
const PortalInvoiceRoute = lazy(() => import('./routes/portal/invoice'));

/** A page reached from the navigation, open only to the roles its navigation entry lists. */
function guarded(path: string, Page: LazyExoticComponent<ComponentType>) {
  return (
    <RequireRole roles={rolesFor(path)}>
      <Page />
    </RequireRole>
  );
}

/** A page lab staff reach from a link rather than the navigation (a job's review, say). */
function labOnly(Page: LazyExoticComponent<ComponentType>) {
  return (
    <RequireRole roles={LAB_ROLES}>
      <Page />
    </RequireRole>
  );
}

function standalone(Page: LazyExoticComponent<ComponentType>) {
  return (
    <Suspense fallback={<FullPageSpinner />}>
      <Page />
    </Suspense>
  );
}

const routes: RouteObject[] = [
  { path: paths.signIn, element: standalone(SignInRoute), errorElement: <RouteError /> },
  // Public: anyone holding a certificate may check it, signed in or not.
  { path: paths.verify, element: standalone(VerifyLookupRoute), errorElement: <RouteError /> },
  { path: paths.verifyCertificate, element: standalone(VerifyCertificateRoute), errorElement: <RouteError /> },
  {
    path: paths.home,
    element: <AppRoot />,
    errorElement: <RouteError />,
    children: [
      {
        errorElement: <RouteError />,
        children: [
          { index: true, element: <OverviewRoute /> },
          { path: paths.jobs, element: guarded(paths.jobs, JobsRoute) },
          { path: paths.job, element: guarded(paths.jobs, JobRoute) },
          { path: paths.run, element: guarded(paths.jobs, RunRoute) },
          { path: paths.instruments, element: guarded(paths.instruments, InstrumentsRoute) },
          { path: paths.instrument, element: guarded(paths.instruments, InstrumentRoute) },
          { path: paths.bandPlan, element: guarded(paths.instruments, BandPlanRoute) },
          { path: paths.standards, element: guarded(paths.standards, StandardsRoute) },
          { path: paths.benches, element: guarded(paths.benches, BenchesRoute) },
          { path: paths.adminUsers, element: guarded(paths.adminUsers, UsersRoute) },
          { path: paths.adminOrganisations, element: guarded(paths.adminOrganisations, OrganisationsRoute) },
          { path: paths.reviews, element: guarded(paths.reviews, ReviewQueueRoute) },
          { path: paths.review, element: labOnly(ReviewRoute) },
          { path: paths.procedures, element: guarded(paths.procedures, ProceduresRoute) },
          { path: paths.certificates, element: guarded(paths.certificates, CertificatesRoute) },
          { path: paths.adminOutbox, element: guarded(paths.adminOutbox, OutboxRoute) },
          { path: paths.adminOutboxMessage, element: guarded(paths.adminOutbox, OutboxMessageRoute) },
          { path: paths.comparisons, element: guarded(paths.comparisons, ComparisonsRoute) },
          { path: paths.comparison, element: guarded(paths.comparisons, ComparisonRoute) },
          { path: paths.prices, element: guarded(paths.prices, PricesRoute) },
          { path: paths.invoices, element: guarded(paths.invoices, InvoicesRoute) },
          { path: paths.invoice, element: guarded(paths.invoices, InvoiceRoute) },
          { path: paths.statement, element: guarded(paths.invoices, StatementRoute) },
          { path: paths.portalQuotes, element: guarded(paths.portalQuotes, PortalQuotesRoute) },
          { path: paths.portalInvoices, element: guarded(paths.portalInvoices, PortalInvoicesRoute) },
          // Where the payment service sends the client back (?payment=done|cancelled).
          { path: paths.portalInvoice, element: guarded(paths.portalInvoices, PortalInvoiceRoute) },
        ],
      },
    ],
  },
  { path: '*', element: standalone(NotFoundRoute) },
];

export function AppRouter() {
  const router = useMemo(() => createBrowserRouter(routes), []);

  // The API client sends an expired session back to sign-in through the router, without a page reload.
  useEffect(() => {
    setNavigator((to, options) => void router.navigate(to, options));
    return () => setNavigator(null);
  }, [router]);

  return <RouterProvider router={router} />;
}
