import { render } from '@testing-library/react';
import type { ReactElement } from 'react';
import { createMemoryRouter, RouterProvider, type RouteObject } from 'react-router-dom';
import type { SessionUser } from '@kilocycle/common/types';
import { AppProvider } from '@/app/provider';
import { createQueryClient } from '@/lib/react-query';
import { setSession } from '@/lib/session';
import { createSessionUser } from './data-generators';

export function signInAs(overrides: Partial<SessionUser> = {}, accessToken = 'test-token') {
  const user = createSessionUser(overrides);
  setSession({ accessToken, user });
  return user;
}

type RenderOptions = { path?: string; initialEntry?: string; routes?: RouteObject[] };

/** Renders `ui` at `path` inside the app's providers and a memory router. */
export function renderWithApp(ui: ReactElement, { path = '/', initialEntry, routes = [] }: RenderOptions = {}) {
  const router = createMemoryRouter([{ path, element: ui }, ...routes], { initialEntries: [initialEntry ?? path] });
  const queryClient = createQueryClient();
  const result = render(
    <AppProvider queryClient={queryClient}>
      <RouterProvider router={router} />
    </AppProvider>,
  );
  return { ...result, router, queryClient };
}
