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
  // Public pages behind e-mailed links: no sign-in (the person has no password yet).
  ...(
    [
      [paths.accountWelcome.path, () => import('@/features/account/pages/SetPasswordPage').then((m) => <m.SetPasswordPage purpose="invitation" />)],
      [paths.resetPassword.path, () => import('@/features/account/pages/SetPasswordPage').then((m) => <m.SetPasswordPage purpose="password_reset" />)],
      [paths.forgotPassword.path, () => import('@/features/account/pages/ForgotPasswordPage').then((m) => <m.ForgotPasswordPage />)],
      [paths.consent.path, () => import('@/features/account/pages/ConsentPage').then((m) => <m.ConsentPage />)],
    ] as const
  ).map(
    ([path, load]): RouteObject => ({
      path,
      errorElement: <RouteError />,
      hydrateFallbackElement: <PageLoading />,
      lazy: async () => ({ element: await load() }),
    }),
  ),
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
      {
        path: paths.classes.path,
        lazy: async () => {
          const { ClassesPage } = await import('@/features/classes/pages/ClassesPage');
          return { element: <RequireAuth roles={paths.classes.roles}><ClassesPage /></RequireAuth> };
        },
      },
      {
        path: paths.classDetail.path,
        lazy: async () => {
          const { ClassDetailPage } = await import('@/features/classes/pages/ClassDetailPage');
          return { element: <RequireAuth roles={paths.classDetail.roles}><ClassDetailPage /></RequireAuth> };
        },
      },
      {
        path: paths.studentFingerings.path,
        lazy: async () => {
          const { StudentFingeringsPage } = await import('@/features/classes/pages/StudentFingeringsPage');
          return { element: <RequireAuth roles={paths.studentFingerings.roles}><StudentFingeringsPage /></RequireAuth> };
        },
      },
      {
        path: paths.outbox.path,
        lazy: async () => {
          const { OutboxPage } = await import('@/features/outbox/pages/OutboxPage');
          return { element: <RequireAuth roles={paths.outbox.roles}><OutboxPage /></RequireAuth> };
        },
      },
      {
        path: paths.bandPolicy.path,
        lazy: async () => {
          const { BandPolicyPage } = await import('@/features/band-policy/pages/BandPolicyPage');
          return { element: <RequireAuth roles={paths.bandPolicy.roles}><BandPolicyPage /></RequireAuth> };
        },
      },
      {
        path: paths.recordingSettings.path,
        lazy: async () => {
          const { RecordingSettingsPage } = await import('@/features/recordings/pages/RecordingSettingsPage');
          return { element: <RequireAuth roles={paths.recordingSettings.roles}><RecordingSettingsPage /></RequireAuth> };
        },
      },
      // Rubrics and requirement lists: each page its own chunk, guarded by the roles in paths.
      ...(
        [
          [
            paths.rubrics,
            () => import('@/features/rubrics/pages/RubricsPage').then((m) => <m.RubricsPage />),
          ],
          [
            paths.rubricNew,
            () =>
              import('@/features/rubrics/pages/RubricEditorPage').then((m) => <m.NewRubricPage />),
          ],
          [
            paths.rubric,
            () => import('@/features/rubrics/pages/RubricPage').then((m) => <m.RubricPage />),
          ],
          [
            paths.rubricEdit,
            () =>
              import('@/features/rubrics/pages/RubricEditorPage').then((m) => <m.EditRubricPage />),
          ],
          [
            paths.requirementLists,
            () =>
              import('@/features/requirement-lists/pages/RequirementListsPage').then((m) => (
                <m.RequirementListsPage />
              )),
          ],
          [
            paths.requirementListNew,
            () =>
              import('@/features/requirement-lists/pages/RequirementListEditorPage').then((m) => (
                <m.NewRequirementListPage />
              )),
          ],
          [
            paths.requirementList,
            () =>
              import('@/features/requirement-lists/pages/RequirementListPage').then((m) => (
                <m.RequirementListPage />
              )),
          ],
          [
            paths.requirementListEdit,
            () =>
              import('@/features/requirement-lists/pages/RequirementListEditorPage').then((m) => (
                <m.EditRequirementListPage />
              )),
          ],
        ] as const
      ).map(([route, load]): RouteObject => ({
        path: route.path,
        lazy: async () => ({
          element: <RequireAuth roles={route.roles}>{await load()}</RequireAuth>,
        }),
      })),
      // The marking desk: its own chunks (no chart library), examiners only.
      ...(
        [
          [
            paths.marking,
            () => import('@/features/marking/pages/MarkingPage').then((m) => <m.MarkingPage />),
          ],
          [
            paths.markingDesk,
            () => import('@/features/marking/pages/DeskPage').then((m) => <m.DeskPage />),
          ],
        ] as const
      ).map(([route, load]): RouteObject => ({
        path: route.path,
        lazy: async () => ({
          element: <RequireAuth roles={route.roles}>{await load()}</RequireAuth>,
        }),
      })),
      // Sittings: each page its own chunk, guarded by the roles in paths.
      ...(
        [
          [
            paths.sittings,
            () => import('@/features/sittings/pages/SittingsPage').then((m) => <m.SittingsPage />),
          ],
          [
            paths.sitting,
            () => import('@/features/sittings/pages/SittingPage').then((m) => <m.SittingPage />),
          ],
          [
            paths.daySchedule,
            () =>
              import('@/features/sittings/pages/DaySchedulePage').then((m) => (
                <m.DaySchedulePage />
              )),
          ],
        ] as const
      ).map(([route, load]): RouteObject => ({
        path: route.path,
        lazy: async () => ({
          element: <RequireAuth roles={route.roles}>{await load()}</RequireAuth>,
        }),
      })),
      // Moderation and release (issue 7): each page its own chunk, guarded by the roles in paths.
      ...(
        [
          [
            paths.moderation,
            () => import('@/features/moderation/pages/ModerationPage').then((m) => <m.ModerationPage />),
          ],
          [
            paths.release,
            () => import('@/features/release/pages/ReleasePage').then((m) => <m.ReleasePage />),
          ],
          [
            paths.myResults,
            () => import('@/features/release/pages/MyResultsPage').then((m) => <m.MyResultsPage />),
          ],
          [
            paths.result,
            () => import('@/features/release/pages/ResultPage').then((m) => <m.ResultPage />),
          ],
        ] as const
      ).map(([route, load]): RouteObject => ({
        path: route.path,
        lazy: async () => ({
          element: <RequireAuth roles={route.roles}>{await load()}</RequireAuth>,
        }),
      })),
      // Agreement and standardisation (issue 7): the chart library loads with these pages only.
      ...(
        [
          [paths.agreement, () => import('@/features/agreement/pages/AgreementPage').then((m) => <m.AgreementPage />)],
          [paths.sittingAgreement, () => import('@/features/agreement/pages/AgreementPage').then((m) => <m.SittingAgreementPage />)],
          [paths.standardisation, () => import('@/features/standardisation/pages/ExercisesPage').then((m) => <m.ExercisesPage />)],
          [paths.standardisationNew, () => import('@/features/standardisation/pages/NewExercisePage').then((m) => <m.NewExercisePage />)],
          [paths.standardisationExercise, () => import('@/features/standardisation/pages/ExercisePage').then((m) => <m.ExercisePage />)],
          [paths.standardisationDeviations, () => import('@/features/standardisation/pages/DeviationsPage').then((m) => <m.DeviationsPage />)],
        ] as const
      ).map(([route, load]): RouteObject => ({
        path: route.path,
        lazy: async () => ({
          element: <RequireAuth roles={route.roles}>{await load()}</RequireAuth>,
        }),
      })),
      // Results: each page its own chunk (the chart library loads only here).
      ...(
        [
          [paths.results, () => import('@/features/results/pages/ResultsPage').then((m) => <m.ResultsPage />)],
          [paths.sittingResults, () => import('@/features/results/pages/SittingResultsPage').then((m) => <m.SittingResultsPage />)],
          [paths.classResults, () => import('@/features/results/pages/ClassResultsPage').then((m) => <m.ClassResultsPage />)],
        ] as const
      ).map(([route, load]): RouteObject => ({
        path: route.path,
        lazy: async () => ({
          element: <RequireAuth roles={route.roles}>{await load()}</RequireAuth>,
        }),
      })),
      // Progress and the attention list: own chunks (the chart library loads only here).
      ...(
        [
          [
            paths.myProgress,
            () => import('@/features/progress/pages/ProgressPage').then((m) => <m.MyProgressPage />),
          ],
          [
            paths.studentProgress,
            () => import('@/features/progress/pages/ProgressPage').then((m) => <m.StudentProgressPage />),
          ],
          [
            paths.attention,
            () => import('@/features/progress/pages/AttentionPage').then((m) => <m.AttentionPage />),
          ],
        ] as const
      ).map(([route, load]): RouteObject => ({
        path: route.path,
        lazy: async () => ({
          element: <RequireAuth roles={route.roles}>{await load()}</RequireAuth>,
        }),
      })),
      { path: '*', element: <NotFoundPage /> },
    ],
  },
];

export function AppRouter() {
  const [router] = useState(() => createBrowserRouter(routes));
  return <RouterProvider router={router} />;
}
