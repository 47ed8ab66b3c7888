import { render } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import type { AuthSession } from '@stavemark/shared';
import { AppProvider } from '@/app/provider';
import { routes } from '@/app/router';
import { createQueryClient } from '@/lib/query-client';
import { sessionStore } from '@/lib/session-store';

/** The whole app at `path`, signed in with `session` (or signed out when null). */
export function renderApp(path: string, session: AuthSession | null) {
  if (session) sessionStore.start(session);
  else sessionStore.end();
  const queryClient = createQueryClient();
  // Tests want the first answer, not a retry after a fault.
  queryClient.setDefaultOptions({
    queries: { ...queryClient.getDefaultOptions().queries, retry: false },
  });
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  const view = render(
    <AppProvider queryClient={queryClient}>
      <RouterProvider router={router} />
    </AppProvider>,
  );
  return { ...view, router, queryClient };
}
