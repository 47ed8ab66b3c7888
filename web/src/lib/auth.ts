import { useSyncExternalStore } from 'react';
import type { CurrentUser, MembershipView, Role } from '@stavemark/shared';
import { refreshSession } from './api-client';
import { sessionStore, type SessionState } from './session-store';

export function useSession(): SessionState {
  return useSyncExternalStore(sessionStore.subscribe, sessionStore.getState);
}

/** The active membership: the roles that count are those of the active organisation. */
export function activeMembership(user: CurrentUser): MembershipView | undefined {
  return user.memberships.find((m) => m.organisationId === user.activeOrganisationId);
}

export function activeRoles(user: CurrentUser): Role[] {
  return activeMembership(user)?.roles ?? [];
}

export function hasAnyRole(user: CurrentUser, roles: readonly Role[]): boolean {
  const mine = activeRoles(user);
  return roles.some((r) => mine.includes(r));
}

/** For components rendered only inside the signed-in layout. */
export function useCurrentUser(): CurrentUser {
  const session = useSession();
  if (session.status !== 'signed-in') {
    throw new Error('useCurrentUser() used outside a signed-in page');
  }
  return session.user;
}

let bootstrap: Promise<void> | null = null;

/** On page load, restore a session from the refresh cookie (once, however often it is called). */
export function bootstrapSession(): Promise<void> {
  bootstrap ??= refreshSession().then((session) => {
    if (!session) sessionStore.end();
  });
  return bootstrap;
}

export function resetBootstrapForTests(): void {
  bootstrap = null;
}
