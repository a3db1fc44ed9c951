import { lazy, Suspense, useEffect, useMemo, type ComponentType, type LazyExoticComponent } from 'react';
import { createBrowserRouter, RouterProvider, type RouteObject } from 'react-router-dom';
import { FullPageSpinner } from '@/components/ui/full-page-spinner';
import { rolesFor } from '@/config/navigation';
import { paths } from '@/config/paths';
import { RequireRole } from '@/lib/auth';
import { setNavigator } from '@/lib/navigator';
import { AppRoot } from './routes/app-root';
import { RouteError } from './routes/route-error';

const SignInRoute = lazy(() => import('./routes/sign-in'));
const OverviewRoute = lazy(() => import('./routes/overview'));
const UsersRoute = lazy(() => import('./routes/admin/users'));
const OrganisationsRoute = lazy(() => import('./routes/admin/organisations'));
const NotFoundRoute = lazy(() => import('./routes/not-found'));

/** A page reached from the navigation, open only to the roles its navigation entry lists. */
function guarded(path: string, Page: LazyExoticComponent<ComponentType>) {
  return (
    <RequireRole roles={rolesFor(path)}>
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
  {
    path: paths.home,
    element: <AppRoot />,
    errorElement: <RouteError />,
    children: [
      {
        errorElement: <RouteError />,
        children: [
          { index: true, element: <OverviewRoute /> },
          { path: paths.adminUsers, element: guarded(paths.adminUsers, UsersRoute) },
          { path: paths.adminOrganisations, element: guarded(paths.adminOrganisations, OrganisationsRoute) },
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
