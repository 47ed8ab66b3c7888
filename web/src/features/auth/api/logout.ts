import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api-client';
import { sessionStore } from '@/lib/session-store';

export async function logout(): Promise<void> {
  await apiRequest<void>('/auth/logout', { method: 'POST', renewOn401: false });
}

export function useLogout() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: logout,
    // Sign out locally even when the server could not be told: the person asked to leave.
    onSettled: () => {
      sessionStore.end('You have signed out.');
      queryClient.clear();
    },
  });
}
