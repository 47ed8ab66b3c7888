import { ROLES, type Role } from '@stavemark/shared';

/**
 * The typed route table: links and routes use these, never hand-typed strings. `roles` says who
 * may open the page; the router's guard and the navigation both read it.
 */
export const paths = {
  today: { path: '/', href: () => '/', roles: ROLES },
  signIn: { path: '/sign-in', href: () => '/sign-in', roles: ROLES },
  people: { path: '/people', href: () => '/people', roles: ['admin'] },
  // Classes (issue 4): a teacher's own, all for an admin; the Outbox outside production.
  classes: { path: '/classes', href: () => '/classes', roles: ['admin', 'teacher'] },
  classDetail: {
    path: '/classes/:classId',
    href: (classId: string) => `/classes/${encodeURIComponent(classId)}`,
    roles: ['admin', 'teacher'],
  },
  // A student's approved fingerings, reached from a class's members (design.md §5).
  studentFingerings: {
    path: '/classes/:classId/students/:studentId/fingerings',
    href: (classId: string, studentId: string) =>
      `/classes/${encodeURIComponent(classId)}/students/${encodeURIComponent(studentId)}/fingerings`,
    roles: ['admin', 'teacher'],
  },
  outbox: { path: '/outbox', href: () => '/outbox', roles: ['admin'] },
  // Progress (issue 8): the student's own year, a student's year for their teachers and admins,
  // and the teacher's attention list.
  myProgress: { path: '/progress', href: () => '/progress', roles: ['student'] },
  studentProgress: {
    path: '/students/:studentId/progress',
    href: (studentId: string, sittingId?: string) =>
      `/students/${encodeURIComponent(studentId)}/progress${sittingId ? `#sitting-${sittingId}` : ''}`,
    roles: ['admin', 'teacher', 'student'],
  },
  attention: { path: '/attention', href: () => '/attention', roles: ['admin', 'teacher'] },
  // Public pages behind e-mailed links (the API's invitations/link-tokens.ts names the same paths).
  accountWelcome: { path: '/account/welcome', href: () => '/account/welcome', roles: ROLES },
  resetPassword: { path: '/account/reset-password', href: () => '/account/reset-password', roles: ROLES },
  forgotPassword: { path: '/account/forgot-password', href: () => '/account/forgot-password', roles: ROLES },
  consent: { path: '/account/consent', href: () => '/account/consent', roles: ROLES },
  // Rubrics and requirement lists: teachers and admins edit, examiners and students read.
  rubrics: { path: '/rubrics', href: () => '/rubrics', roles: ROLES },
  rubricNew: { path: '/rubrics/new', href: () => '/rubrics/new', roles: ['admin', 'teacher'] },
  rubric: {
    path: '/rubrics/:rubricId',
    href: (rubricId: string, version?: number) =>
      `/rubrics/${encodeURIComponent(rubricId)}${version ? `?version=${version}` : ''}`,
    roles: ROLES,
  },
  rubricEdit: {
    path: '/rubrics/:rubricId/edit',
    href: (rubricId: string) => `/rubrics/${encodeURIComponent(rubricId)}/edit`,
    roles: ['admin', 'teacher'],
  },
  requirementLists: { path: '/requirement-lists', href: () => '/requirement-lists', roles: ROLES },
  requirementListNew: {
    path: '/requirement-lists/new',
    href: () => '/requirement-lists/new',
    roles: ['admin', 'teacher'],
  },
  requirementList: {
    path: '/requirement-lists/:listId',
    href: (listId: string, version?: number) =>
      `/requirement-lists/${encodeURIComponent(listId)}${version ? `?version=${version}` : ''}`,
    roles: ROLES,
  },
  requirementListEdit: {
    path: '/requirement-lists/:listId/edit',
    href: (listId: string) => `/requirement-lists/${encodeURIComponent(listId)}/edit`,
    roles: ['admin', 'teacher'],
  },
  // The marking desk (issue 6): examiners only, their own slots.
  marking: { path: '/marking', href: () => '/marking', roles: ['examiner'] },
  markingDesk: {
    path: '/marking/slots/:slotId',
    href: (slotId: string) => `/marking/slots/${encodeURIComponent(slotId)}`,
    roles: ['examiner'],
  },
  // Sittings (issue 5): everyone sees theirs (a student their own slot); the day schedule is for staff and examiners.
  sittings: { path: '/sittings', href: () => '/sittings', roles: ROLES },
  sitting: {
    path: '/sittings/:sittingId',
    href: (sittingId: string) => `/sittings/${encodeURIComponent(sittingId)}`,
    roles: ROLES,
  },
  daySchedule: {
    path: '/schedule',
    href: (date?: string) => `/schedule${date ? `?date=${encodeURIComponent(date)}` : ''}`,
    roles: ['admin', 'teacher', 'examiner'],
  },
  // Moderation and release (issue 7): teachers and admins; a student reads their own results.
  moderation: {
    path: '/sittings/:sittingId/moderation',
    href: (sittingId: string) => `/sittings/${encodeURIComponent(sittingId)}/moderation`,
    roles: ['admin', 'teacher'],
  },
  release: {
    path: '/sittings/:sittingId/release',
    href: (sittingId: string) => `/sittings/${encodeURIComponent(sittingId)}/release`,
    roles: ['admin', 'teacher'],
  },
  myResults: { path: '/results', href: () => '/results', roles: ['student'] },
  result: {
    path: '/results/:resultId',
    href: (resultId: string) => `/results/${encodeURIComponent(resultId)}`,
    roles: ['admin', 'teacher', 'student'],
  },
  // Agreement between examiners and standardisation (issue 7): staff and examiners.
  agreement: {
    path: '/agreement',
    href: (scope?: { sitting?: string; term?: string }) =>
      scope?.term ? `/agreement?term=${encodeURIComponent(scope.term)}` : scope?.sitting ? `/agreement?sitting=${encodeURIComponent(scope.sitting)}` : '/agreement',
    roles: ['admin', 'teacher', 'examiner'],
  },
  sittingAgreement: {
    path: '/sittings/:sittingId/agreement',
    href: (sittingId: string) => `/sittings/${encodeURIComponent(sittingId)}/agreement`,
    roles: ['admin', 'teacher', 'examiner'],
  },
  standardisation: { path: '/standardisation', href: () => '/standardisation', roles: ['admin', 'teacher', 'examiner'] },
  standardisationNew: { path: '/standardisation/new', href: () => '/standardisation/new', roles: ['admin', 'teacher'] },
  standardisationExercise: {
    path: '/standardisation/exercises/:exerciseId',
    href: (exerciseId: string) => `/standardisation/exercises/${encodeURIComponent(exerciseId)}`,
    roles: ['admin', 'teacher', 'examiner'],
  },
  standardisationDeviations: { path: '/standardisation/my-deviations', href: () => '/standardisation/my-deviations', roles: ['examiner'] },
  // Recordings (issue 6): the admin's retention period.
  // The band policy (issue 7): teachers read it, an admin saves a new version.
  bandPolicy: { path: '/band-policy', href: () => '/band-policy', roles: ['admin', 'teacher'] },
  recordingSettings: { path: '/recordings/settings', href: () => '/recordings/settings', roles: ['admin'] },
  // Results (issue 8): classes compared, a sitting's and a class's results, exports and PDFs.
  results: { path: '/results', href: () => '/results', roles: ['admin', 'teacher'] },
  sittingResults: {
    path: '/sittings/:sittingId/results',
    href: (sittingId: string) => `/sittings/${encodeURIComponent(sittingId)}/results`,
    roles: ['admin', 'teacher', 'examiner'],
  },
  classResults: {
    path: '/classes/:classId/results',
    href: (classId: string) => `/classes/${encodeURIComponent(classId)}/results`,
    roles: ['admin', 'teacher'],
  },
} as const satisfies Record<
  string,
  { path: string; href: (...args: never[]) => string; roles: readonly Role[] }
>;
