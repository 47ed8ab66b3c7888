import { useState } from 'react';
import { createBrowserRouter, RouterProvider, type RouteObject } from 'react-router-dom';
import { paths } from '@/config/paths';
import { PageLoading } from '@/components/PageLoading';
import { AppLayout } from './layout/AppLayout';
import { RequireAuth } from './routes/RequireAuth';
import { NotFoundPage } from './routes/NotFoundPage';
import { RouteError } from './routes/RouteError';

// Each page is its own chunk (React Router lazy routes), so a page loads only what it uses.
export const routes: RouteObject[] = [
  {
    path: paths.signIn.path,
    errorElement: <RouteError />,
    // Shown on first load while the page's chunk arrives.
    hydrateFallbackElement: <PageLoading />,
    lazy: async () => ({
      Component: (await import('@/features/auth/pages/SignInPage')).SignInPage,
    }),
  },
  {
    element: (
      <RequireAuth>
        <AppLayout />
      </RequireAuth>
    ),
    errorElement: <RouteError />,
    hydrateFallbackElement: <PageLoading />,
    children: [
      {
        index: true,
        // Every role has a Today page, so no role check beyond being signed in.
        lazy: async () => ({
          Component: (await import('@/features/today/pages/TodayPage')).TodayPage,
        }),
      },
      {
        path: paths.people.path,
        lazy: async () => {
          const { PeoplePage } = await import('@/features/people/pages/PeoplePage');
          return {
            element: (
              <RequireAuth roles={paths.people.roles}>
                <PeoplePage />
              </RequireAuth>
            ),
          };
        },
      },
      { path: '*', element: <NotFoundPage /> },
    ],
  },
];

export function AppRouter() {
  const [router] = useState(() => createBrowserRouter(routes));
  return <RouterProvider router={router} />;
}
