import { Suspense } from 'react';
import { Outlet } from 'react-router-dom';
import { AppLayout } from '@/components/layouts/app-layout';
import { DismissNoticesOnNavigation } from '@/components/notifications';
import { FullPageSpinner } from '@/components/ui/full-page-spinner';
import { RequireAuth } from '@/lib/auth';

/** Every signed-in page: the session check, then the shell around the page. */
export function AppRoot() {
  return (
    <RequireAuth>
      <DismissNoticesOnNavigation />
      <AppLayout>
        <Suspense fallback={<FullPageSpinner />}>
          <Outlet />
        </Suspense>
      </AppLayout>
    </RequireAuth>
  );
}
