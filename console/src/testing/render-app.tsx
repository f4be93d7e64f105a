import { render } from '@testing-library/react';
import { QueryClient } from '@tanstack/react-query';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { AppProvider } from '../app/provider';
import { routes } from '../app/router';
import { FakeLiveSocket } from './fake-live-socket';

/** A fresh client per test, without retries, so a failure shows at once. */
export function createTestQueryClient(): QueryClient {
  return new QueryClient({ defaultOptions: { queries: { retry: false, gcTime: Infinity } } });
}

/** Renders the real routes at `path` with a test query client and a fake live socket. */
export function renderApp(path: string) {
  const queryClient = createTestQueryClient();
  const socket = new FakeLiveSocket();
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  const view = render(
    <AppProvider queryClient={queryClient} socket={socket}>
      <RouterProvider router={router} />
    </AppProvider>,
  );
  return { ...view, queryClient, socket, router };
}
