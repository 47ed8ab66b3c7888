import { ROLES, type Role } from '@stavemark/shared';

/**
 * The typed route table: links and routes use these, never hand-typed strings. `roles` says who
 * may open the page; the router's guard and the navigation both read it.
 */
export const paths = {
  today: { path: '/', href: () => '/', roles: ROLES },
  signIn: { path: '/sign-in', href: () => '/sign-in', roles: ROLES },
  people: { path: '/people', href: () => '/people', roles: ['admin'] },
} as const satisfies Record<
  string,
  { path: string; href: (...args: never[]) => string; roles: readonly Role[] }
>;
