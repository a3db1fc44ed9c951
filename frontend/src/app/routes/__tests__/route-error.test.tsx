import { render, screen } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { describe, expect, it, vi } from 'vitest';
import { AppProvider } from '@/app/provider';
import { RouteError } from '../route-error';

function Broken(): never {
  throw new Error('range table is empty');
}

describe('<RouteError>', () => {
  it('replaces a page that fails to render with a message and a way back', () => {
    vi.spyOn(console, 'error').mockImplementation(() => undefined);
    const router = createMemoryRouter([{ path: '/jobs', element: <Broken />, errorElement: <RouteError /> }], {
      initialEntries: ['/jobs'],
    });
    render(
      <AppProvider>
        <RouterProvider router={router} />
      </AppProvider>,
    );

    expect(screen.getByRole('heading', { name: 'Something went wrong' })).toBeTruthy();
    expect(screen.getByText('range table is empty')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Back to the overview' }).getAttribute('href')).toBe('/');
    expect(screen.getByRole('button', { name: 'Try again' })).toBeTruthy();
  });

  it('shows the not-found page for a 404 thrown by a route', async () => {
    const router = createMemoryRouter(
      [
        {
          path: '/instruments/:id',
          loader: () => {
            throw new Response('', { status: 404, statusText: 'Not Found' });
          },
          element: <p>instrument</p>,
          HydrateFallback: () => null,
          errorElement: <RouteError />,
        },
      ],
      { initialEntries: ['/instruments/999'] },
    );
    render(
      <AppProvider>
        <RouterProvider router={router} />
      </AppProvider>,
    );

    expect(await screen.findByRole('heading', { name: 'Page not found' })).toBeTruthy();
    expect(screen.queryByText('instrument')).toBeNull();
  });
});
