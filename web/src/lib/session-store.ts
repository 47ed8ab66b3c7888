import type { AuthSession, CurrentUser } from '@stavemark/shared';

/**
 * The signed-in session. The access token lives only in this module's memory (never in
 * localStorage), so a script injected into the page cannot read it from storage; a reload
 * restores the session through the httpOnly refresh cookie instead.
 */
export type SessionState =
  | { status: 'restoring' }
  | { status: 'signed-in'; user: CurrentUser }
  | { status: 'signed-out'; notice?: string };

let accessToken: string | null = null;
let state: SessionState = { status: 'restoring' };
const listeners = new Set<() => void>();
const endListeners = new Set<() => void>();

function emit(): void {
  for (const listener of listeners) listener();
}

export const sessionStore = {
  getState: (): SessionState => state,
  getAccessToken: (): string | null => accessToken,

  subscribe(listener: () => void): () => void {
    listeners.add(listener);
    return () => listeners.delete(listener);
  },

  /** Called when a session ends (sign-out or failed refresh), e.g. to drop cached server data. */
  onEnd(listener: () => void): () => void {
    endListeners.add(listener);
    return () => endListeners.delete(listener);
  },

  start(session: AuthSession): void {
    accessToken = session.accessToken;
    state = { status: 'signed-in', user: session.user };
    emit();
  },

  updateUser(user: CurrentUser): void {
    if (state.status !== 'signed-in') return;
    state = { status: 'signed-in', user };
    emit();
  },

  end(notice?: string): void {
    const wasSignedIn = state.status === 'signed-in';
    accessToken = null;
    state = notice ? { status: 'signed-out', notice } : { status: 'signed-out' };
    if (wasSignedIn) for (const listener of endListeners) listener();
    emit();
  },

  clearNotice(): void {
    if (state.status === 'signed-out' && state.notice) {
      state = { status: 'signed-out' };
      emit();
    }
  },

  /** Tests only: back to the state of a fresh page load. */
  reset(): void {
    accessToken = null;
    state = { status: 'restoring' };
    listeners.clear();
    endListeners.clear();
  },
};
