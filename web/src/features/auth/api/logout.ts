import { useMutation } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api-client';
import { sessionStore } from '@/lib/session-store';

export async function logout(): Promise<void> {
  await apiRequest<void>('/auth/logout', { method: 'POST', renewOn401: false });
}

export function useLogout() {
  return useMutation({
    mutationFn: logout,
    // Sign out locally even when the server could not be told: the person asked to leave.
    // Ending the session also empties the query cache (see app/provider.tsx).
    onSettled: () => sessionStore.end('You have signed out.'),
  });
}
